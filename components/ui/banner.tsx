import type { ReactNode } from "react";

type Tone = "ok" | "caution" | "blocks" | "info";
const tones: Record<Tone, string> = {
  ok: "border-ok/30 bg-ok-bg text-ok",
  caution: "border-caution/30 bg-caution-bg text-caution",
  blocks: "border-blocks/30 bg-blocks-bg text-blocks",
  info: "border-ink-line bg-paper-card text-ink-soft",
};

/** A message box; `tone` uses the severity colours. Not role="alert" (Next renders its own). */
export function Banner({ tone = "info", children, testId }: { tone?: Tone; children: ReactNode; testId?: string }) {
  return (
    <div className={`rounded-md border px-3 py-2 text-sm ${tones[tone]}`} data-testid={testId}>
      {children}
    </div>
  );
}
