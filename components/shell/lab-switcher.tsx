"use client";

import { useRouter } from "next/navigation";

/** Switches between the labs a person belongs to; hidden when there is only one. */
export function LabSwitcher({ current, labs }: { current: string; labs: Array<{ slug: string; name: string }> }) {
  const router = useRouter();
  const name = labs.find((l) => l.slug === current)?.name ?? labs[0]?.name;
  if (labs.length < 2) return <span className="min-w-0 max-w-56 truncate text-sm font-medium text-ink" title={name}>{name}</span>;
  return (
    <label className="flex min-w-0 items-center gap-2 text-sm">
      <span className="sr-only">Lab</span>
      <select
        data-testid="lab-switcher"
        className="w-full max-w-56 truncate rounded-md border border-ink-edge bg-paper-card px-2 py-1 text-sm font-medium"
        title={name}
        value={current}
        onChange={(e) => {
          // Remembered for the next visit to the home page.
          document.cookie = `tareline-lab=${encodeURIComponent(e.target.value)}; path=/; max-age=31536000; samesite=lax`;
          router.push(`/labs/${e.target.value}`);
        }}
      >
        {labs.map((l) => (
          <option key={l.slug} value={l.slug}>
            {l.name}
          </option>
        ))}
      </select>
    </label>
  );
}
