"use client";

import Link from "next/link";
import { signOut } from "next-auth/react";
import { Dropdown } from "@/components/ui/dropdown";

/** "Gareth Lune" → "GL". */
function initials(name: string): string {
  const parts = name.trim().split(/\s+/).filter(Boolean);
  return ((parts[0]?.[0] ?? "") + (parts.length > 1 ? (parts[parts.length - 1]?.[0] ?? "") : "")).toUpperCase() || "?";
}

/** The signed-in person: name and role (initials on narrow screens), their account and sign-out. */
export function UserMenu({ name, roleLabel }: { name: string; roleLabel?: string }) {
  return (
    <Dropdown
      align="right"
      testId="user-menu"
      buttonClassName="inline-flex items-center gap-2 rounded-md px-2 py-1 text-sm text-ink-soft hover:bg-paper-deep hover:text-ink"
      button={
        <>
          <span aria-hidden="true" className="grid h-7 w-7 place-items-center rounded-full bg-accent-light text-xs font-semibold text-accent-dark">
            {initials(name)}
          </span>
          <span className="hidden max-w-56 truncate lg:inline" data-testid="user-name">
            {name}
            {roleLabel && <span className="text-ink-faint"> · {roleLabel}</span>}
          </span>
          <span className="sr-only lg:hidden">
            {name}
            {roleLabel ? `, ${roleLabel}` : ""}
          </span>
        </>
      }
    >
      {(close) => (
        <div className="flex flex-col text-sm">
          <div className="border-b border-ink-line px-3 pb-2 pt-1.5 lg:hidden">
            <p className="font-medium text-ink">{name}</p>
            {roleLabel && <p className="text-xs text-ink-faint">{roleLabel}</p>}
          </div>
          <Link href="/account" onClick={close} className="rounded-md px-3 py-1.5 text-ink no-underline hover:bg-paper-deep hover:no-underline">
            Account
          </Link>
          <button type="button" className="rounded-md px-3 py-1.5 text-left text-ink hover:bg-paper-deep" onClick={() => signOut({ callbackUrl: "/signin" })}>
            Sign out
          </button>
        </div>
      )}
    </Dropdown>
  );
}
