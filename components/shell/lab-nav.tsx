"use client";

import Link from "next/link";
import { usePathname } from "next/navigation";
import { useEffect, useState } from "react";
import { Dropdown } from "@/components/ui/dropdown";

export interface LabNavLink {
  label: string;
  href: string;
}
export interface LabNavMenu {
  label: string;
  items: LabNavLink[];
}
export type LabNavEntry = LabNavLink | LabNavMenu;

const isMenu = (e: LabNavEntry): e is LabNavMenu => "items" in e;

/** Whether `href` is the current page or a section containing it (the overview only matches itself). */
function isActive(href: string, pathname: string): boolean {
  return href === pathname || (href.split("/").length > 3 && pathname.startsWith(`${href}/`));
}

const linkBase = "block whitespace-nowrap rounded-md px-3 py-1.5 text-sm no-underline hover:no-underline";
const tone = (active: boolean) => (active ? "bg-accent-light font-medium text-accent-dark" : "text-ink-soft hover:bg-paper-deep hover:text-ink");

/**
 * The lab's sections (lib/navigation.ts, already filtered by role): links and menus in a
 * row on wide screens; one "Menu" panel listing every section on narrow ones.
 */
export function LabNav({ entries }: { entries: LabNavEntry[] }) {
  const pathname = usePathname();
  const [open, setOpen] = useState(false);
  useEffect(() => setOpen(false), [pathname]);
  return (
    <nav aria-label="Lab sections" className="relative">
      <ul className="hidden items-center gap-1 lg:flex">
        {entries.map((entry) =>
          isMenu(entry) ? (
            <li key={entry.label}>
              <Dropdown button={entry.label} buttonClassName={`${linkBase} inline-flex items-center ${tone(entry.items.some((i) => isActive(i.href, pathname)))}`} testId={`nav-menu-${entry.label}`}>
                {(close) => (
                  <ul>
                    {entry.items.map((item) => (
                      <li key={item.href}>
                        <Link href={item.href} onClick={close} aria-current={isActive(item.href, pathname) ? "page" : undefined} className={`${linkBase} ${tone(isActive(item.href, pathname))}`}>
                          {item.label}
                        </Link>
                      </li>
                    ))}
                  </ul>
                )}
              </Dropdown>
            </li>
          ) : (
            <li key={entry.href}>
              <Link href={entry.href} aria-current={isActive(entry.href, pathname) ? "page" : undefined} className={`${linkBase} ${tone(isActive(entry.href, pathname))}`}>
                {entry.label}
              </Link>
            </li>
          ),
        )}
      </ul>
      <div className="lg:hidden">
        <button type="button" className="rounded-md border border-ink-edge px-2.5 py-1 text-sm text-ink" aria-expanded={open} aria-controls="lab-nav-panel" onClick={() => setOpen((o) => !o)}>
          Menu
        </button>
        <div id="lab-nav-panel" hidden={!open} className="absolute left-0 top-full z-20 mt-2 w-[min(20rem,calc(100vw-2rem))] rounded-md border border-ink-line bg-paper-card p-2 shadow-lg">
          <ul className="flex flex-col gap-0.5">
            {entries.map((entry) =>
              isMenu(entry) ? (
                <li key={entry.label} className="mt-1 border-t border-ink-line pt-1 first:mt-0 first:border-0 first:pt-0">
                  <p className="px-3 pb-0.5 pt-1 text-xs font-medium uppercase tracking-wide text-ink-faint">{entry.label}</p>
                  <ul>
                    {entry.items.map((item) => (
                      <li key={item.href}>
                        <Link href={item.href} aria-current={isActive(item.href, pathname) ? "page" : undefined} className={`${linkBase} ${tone(isActive(item.href, pathname))}`}>
                          {item.label}
                        </Link>
                      </li>
                    ))}
                  </ul>
                </li>
              ) : (
                <li key={entry.href}>
                  <Link href={entry.href} aria-current={isActive(entry.href, pathname) ? "page" : undefined} className={`${linkBase} ${tone(isActive(entry.href, pathname))}`}>
                    {entry.label}
                  </Link>
                </li>
              ),
            )}
          </ul>
        </div>
      </div>
    </nav>
  );
}
