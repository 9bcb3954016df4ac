"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";

/** The lab settings' own section list: a column beside the page on wide screens, a row above it on narrow ones. */
export function SettingsNav({ links }: { links: Array<{ label: string; href: string }> }) {
  const pathname = usePathname();
  return (
    <nav aria-label="Lab settings" className="md:w-48 md:shrink-0">
      <p className="mb-2 hidden text-xs font-medium uppercase tracking-wide text-ink-faint md:block">Lab settings</p>
      <ul className="flex flex-wrap gap-1 md:flex-col">
        {links.map((l) => {
          const active = pathname === l.href || pathname.startsWith(`${l.href}/`);
          return (
            <li key={l.href}>
              <Link
                href={l.href}
                aria-current={active ? "page" : undefined}
                className={`block rounded-md px-3 py-1.5 text-sm no-underline hover:no-underline ${active ? "bg-accent-light font-medium text-accent-dark" : "text-ink-soft hover:bg-paper-deep hover:text-ink"}`}
              >
                {l.label}
              </Link>
            </li>
          );
        })}
      </ul>
    </nav>
  );
}
