import type { ReactNode } from "react";
import { SafetyNotice } from "./safety-notice";
import { Wordmark } from "./wordmark";
import { UserMenu } from "./user-menu";

/** The page frame: header with wordmark, optional lab controls, the content, the safety notice. */
export function AppShell({ user, roleLabel, lab, children }: { user: { name: string }; roleLabel?: string; lab?: ReactNode; children: ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col">
      <header className="border-b border-ink-line bg-paper-card/70">
        <div className="mx-auto flex max-w-6xl flex-wrap items-center gap-x-6 gap-y-2 px-6 py-3">
          <Wordmark />
          <div className="flex flex-1 flex-wrap items-center gap-4">{lab}</div>
          <UserMenu name={user.name} roleLabel={roleLabel} />
        </div>
      </header>
      <main className="mx-auto w-full max-w-6xl flex-1 px-6 py-8">{children}</main>
      <SafetyNotice />
    </div>
  );
}
