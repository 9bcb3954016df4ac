import type { ReactNode } from "react";
import { Wordmark } from "@/components/shell/wordmark";
import { SafetyNotice } from "@/components/shell/safety-notice";

export default function AuthLayout({ children }: { children: ReactNode }) {
  return (
    <div className="flex min-h-screen flex-col">
      <main className="flex flex-1 items-center justify-center px-6 py-12">
        <div className="w-full max-w-sm">
          <div className="mb-8 flex justify-center">
            <Wordmark href="/signin" />
          </div>
          <div className="rounded-lg border border-ink-line bg-paper-card p-6 shadow-sm">{children}</div>
        </div>
      </main>
      <SafetyNotice />
    </div>
  );
}
