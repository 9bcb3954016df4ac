import type { ReactNode } from "react";
import { Banner } from "@/components/ui/banner";

/** Inputs of a read-only section look read-only, not merely unresponsive. */
export const READ_ONLY = "[&:disabled_input]:bg-paper-deep/60 [&:disabled_input]:text-ink-soft [&:disabled_select]:bg-paper-deep/60 [&:disabled_select]:text-ink-soft";

/** One section of the settings page: title, what it is for, who edits it, and its form. */
export function SectionCard({
  id,
  title,
  children,
  description,
  editable,
  editors,
  message,
}: {
  id: string;
  title: string;
  description: ReactNode;
  editable: boolean;
  /** Who may edit the section, in words ("lab admins"). */
  editors: string;
  message: { tone: "ok" | "blocks"; text: string } | null;
  children: ReactNode;
}) {
  return (
    <section id={id} aria-labelledby={`${id}-title`} className="flex flex-col gap-3 rounded-lg border border-ink-line bg-paper-card p-5" data-testid={`settings-${id}`}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id={`${id}-title`}>{title}</h2>
        {!editable && <span className="rounded bg-paper-deep px-1.5 py-0.5 text-xs text-ink-soft">read only · {editors} edit this</span>}
      </div>
      <div className="max-w-3xl text-sm text-ink-soft">{description}</div>
      {message && (
        <Banner tone={message.tone} testId={`settings-${id}-message`}>
          {message.text}
        </Banner>
      )}
      {children}
    </section>
  );
}
