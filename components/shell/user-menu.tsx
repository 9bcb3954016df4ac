"use client";

import Link from "next/link";
import { signOut } from "next-auth/react";

export function UserMenu({ name, roleLabel }: { name: string; roleLabel?: string }) {
  return (
    <div className="flex items-center gap-3 text-sm">
      <span className="hidden text-ink-soft sm:inline" data-testid="user-name">
        {name}
        {roleLabel && <span className="text-ink-faint"> · {roleLabel}</span>}
      </span>
      <Link href="/account" className="text-ink-soft">
        Account
      </Link>
      <button type="button" className="text-ink-soft hover:text-copper-dark" onClick={() => signOut({ callbackUrl: "/signin" })}>
        Sign out
      </button>
    </div>
  );
}
