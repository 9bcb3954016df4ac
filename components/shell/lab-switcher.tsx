"use client";

import { useRouter } from "next/navigation";

/** Switches between the labs a person belongs to; hidden when there is only one. */
export function LabSwitcher({ current, labs }: { current: string; labs: Array<{ slug: string; name: string }> }) {
  const router = useRouter();
  if (labs.length < 2) return <span className="text-sm font-medium text-ink">{labs[0]?.name}</span>;
  return (
    <label className="flex items-center gap-2 text-sm">
      <span className="sr-only">Lab</span>
      <select
        data-testid="lab-switcher"
        className="rounded-md border border-ink-line bg-paper-card px-2 py-1 text-sm font-medium"
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
