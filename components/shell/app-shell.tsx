import type { ReactNode } from "react";
import { SafetyNotice } from "./safety-notice";
import { Wordmark } from "./wordmark";
import { UserMenu } from "./user-menu";

/** The page frame: header with wordmark, optional lab controls, the content, the safety notice. */
export function AppShell({ user, roleLabel, lab, children }: { user: { name: string }; roleLabel?: string; lab?: ReactNode; children: ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col">
      <header className="border-b border-ink-line bg-paper-card/70">
        <div className="mx-auto flex max-w-7xl items-center gap-x-4 px-4 py-2.5 lg:px-6">
          <Wordmark />
          <div className="flex min-w-0 flex-1 items-center gap-3 lg:gap-4">{lab}</div>
          <UserMenu name={user.name} roleLabel={roleLabel} />
        </div>
      </header>
      <main className="mx-auto w-full max-w-6xl flex-1 px-4 py-8 lg:px-6">{children}</main>
      <SafetyNotice />
    </div>
  );
}
