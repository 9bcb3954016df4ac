import type { ReactNode } from "react";
import { PLAN_STATE_LABELS, type PlanState } from "@/lib/plans/states";
import { RESPONSE_GOAL_LABELS, type StudyResponse } from "@/lib/studies/schemas";

const STATE_TONE: Record<PlanState, string> = {
  draft: "bg-paper-deep text-ink-soft",
  in_review: "bg-caution-bg text-caution",
  changes_requested: "bg-caution-bg text-caution",
  approved: "bg-ok-bg text-ok",
  rejected: "bg-blocks-bg text-blocks",
  released: "bg-ok-bg text-ok",
  running: "bg-paper-deep text-ink",
  results_entered: "bg-paper-deep text-ink",
  closed: "bg-paper-deep text-ink-faint",
  cancelled: "bg-paper-deep text-ink-faint line-through",
};

/** A plan's state in words (never colour alone). */
export function PlanStateBadge({ state }: { state: PlanState }) {
  return <span className={`whitespace-nowrap rounded px-1.5 py-0.5 text-xs font-medium ${STATE_TONE[state]}`}>{PLAN_STATE_LABELS[state]}</span>;
}

/** A timestamp as YYYY-MM-DD HH:MM (UTC), the same on the server and in the browser. */
export function When({ iso }: { iso: string }) {
  return (
    <time dateTime={iso} className="num whitespace-nowrap" title={iso}>
      {iso.slice(0, 16).replace("T", " ")}
    </time>
  );
}

/** A response's goal in words, with its bounds and unit. */
export function responseGoalText(r: StudyResponse): string {
  const unit = r.unit ? ` ${r.unit}` : "";
  if (r.goal === "target") return `target ${r.target}${unit} (${r.low}–${r.high}${unit})`;
  const bounds = r.low !== undefined && r.high !== undefined ? ` (${r.low}–${r.high}${unit})` : r.low !== undefined ? ` (at least ${r.low}${unit})` : r.high !== undefined ? ` (at most ${r.high}${unit})` : "";
  return `${RESPONSE_GOAL_LABELS[r.goal].toLowerCase()}${bounds}`;
}

export function SectionHeader({ kicker, title, children, actions }: { kicker: ReactNode; title: ReactNode; children?: ReactNode; actions?: ReactNode }) {
  return (
    <div className="flex flex-wrap items-end justify-between gap-3">
      <div className="min-w-0">
        <p className="text-sm uppercase tracking-wide text-ink-faint">{kicker}</p>
        <h1>{title}</h1>
        {children && <div className="mt-1 max-w-3xl text-sm text-ink-soft">{children}</div>}
      </div>
      {actions && <div className="flex flex-wrap gap-2">{actions}</div>}
    </div>
  );
}
