"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";
import { useState } from "react";

export interface LabNavLink {
  label: string;
  href: string;
}

/** The lab's section links; collapses behind a button on narrow screens. */
export function LabNav({ links }: { links: LabNavLink[] }) {
  const pathname = usePathname();
  const [open, setOpen] = useState(false);
  return (
    <nav aria-label="Lab sections" className="relative">
      <button
        type="button"
        className="rounded-md border border-ink-line px-2 py-1 text-sm md:hidden"
        aria-expanded={open}
        onClick={() => setOpen((o) => !o)}
      >
        Menu
      </button>
      <ul className={`${open ? "flex" : "hidden"} absolute left-0 top-9 z-10 flex-col gap-1 rounded-md border border-ink-line bg-paper-card p-2 shadow md:static md:flex md:flex-row md:border-0 md:bg-transparent md:p-0 md:shadow-none`}>
        {links.map((l) => {
          const active = l.href === pathname || (l.href.split("/").length > 3 && pathname.startsWith(l.href));
          return (
            <li key={l.href}>
              <Link
                href={l.href}
                onClick={() => setOpen(false)}
                aria-current={active ? "page" : undefined}
                className={`block rounded-md px-3 py-1.5 text-sm no-underline hover:no-underline ${active ? "bg-ink text-paper-card" : "text-ink-soft hover:bg-paper-deep"}`}
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
