/**
 * A plan's timeline (issue 11): every state change, signature, edit and reservation from
 * the audit log, oldest first — who, when, what happened, and what changed
 * (lib/plans/timeline.ts builds the items; changes read as the audit log's do).
 */
import type { TimelineItem, TimelineKind } from "@/lib/plans/timeline";
import { FieldChanges } from "@/components/audit/field-changes";
import { When } from "@/components/studies/bits";

const MARK: Record<TimelineKind, string> = {
  created: "bg-paper-deep text-ink-soft",
  edited: "bg-paper-deep text-ink-soft",
  state: "bg-accent-light text-accent-dark",
  signature: "bg-ok-bg text-ok",
  reservation: "bg-caution-bg text-caution",
};
const KIND_LABEL: Record<TimelineKind, string> = { created: "created", edited: "edit", state: "state", signature: "signature", reservation: "stock" };

export function Timeline({ items }: { items: TimelineItem[] }) {
  if (items.length === 0) return <p className="text-sm text-ink-faint">Nothing recorded yet.</p>;
  return (
    <ol className="flex flex-col gap-3 text-sm" data-testid="timeline">
      {items.map((item) => (
        <li key={item.id} className="border-l-2 border-ink-line pl-3" data-testid="timeline-item">
          <div className="flex flex-wrap items-baseline gap-x-2">
            <span className={`rounded px-1.5 py-0.5 text-xs font-medium ${MARK[item.kind]}`}>{KIND_LABEL[item.kind]}</span>
            <span className="font-medium">{item.title}</span>
          </div>
          <p className="text-xs text-ink-faint">
            {item.actor} · <When iso={item.at} /> UTC
          </p>
          {item.changes.length > 0 && (
            <div className="mt-1 text-xs">
              <FieldChanges changes={item.changes} />
            </div>
          )}
        </li>
      ))}
    </ol>
  );
}
