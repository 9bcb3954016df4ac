/**
 * The review queue (issue 11): plans waiting for a safety officer, worst caution first,
 * then the longest waiting — with how long each has waited, who wrote it, its runs, the
 * cautions' codes and why sign-off is needed. Severity is said in words as well as colour.
 */
import Link from "next/link";
import { SIGN_OFF_RULES, type Severity } from "@/lib/hazards/caution-rules";
import { waitedFor } from "@/lib/plans/review-queue";
import type { ReviewQueueItem } from "@/lib/plans/server/list-review-queue";
import { When } from "@/components/studies/bits";

const TONE: Record<Severity, string> = { blocking: "bg-blocks-bg text-blocks", warning: "bg-caution-bg text-caution", info: "bg-ok-bg text-ok" };
const WORD: Record<Severity, string> = { blocking: "Blocks", warning: "Caution", info: "Note" };

export function SeverityBadge({ severity }: { severity: Severity | null }) {
  if (!severity) return <span className="whitespace-nowrap rounded bg-paper-deep px-1.5 py-0.5 text-xs font-medium text-ink-soft">No cautions</span>;
  return <span className={`whitespace-nowrap rounded px-1.5 py-0.5 text-xs font-medium ${TONE[severity]}`}>{WORD[severity]}</span>;
}

export function ReviewQueueTable({ labSlug, items, now }: { labSlug: string; items: ReviewQueueItem[]; now: Date }) {
  if (items.length === 0) {
    return (
      <div className="rounded-lg border border-dashed border-ink-line bg-paper-card p-6 text-center text-sm text-ink-soft" data-testid="review-queue-empty">
        <p className="font-medium text-ink">Nothing waits for review.</p>
        <p>When a chemist submits a plan, it appears here and you are e-mailed a link to it.</p>
      </div>
    );
  }
  return (
    <div className="overflow-x-auto rounded-lg border border-ink-line bg-paper-card">
      <table className="w-full text-sm" data-testid="review-queue">
        <thead>
          <tr className="border-b border-ink-line text-left text-ink-soft">
            <th className="px-3 py-2 font-medium">Worst caution</th>
            <th className="px-3 py-2 font-medium">Plan</th>
            <th className="px-3 py-2 font-medium">Author</th>
            <th className="px-3 py-2 text-right font-medium">Runs</th>
            <th className="px-3 py-2 font-medium">Cautions</th>
            <th className="px-3 py-2 font-medium">Sign-off because</th>
            <th className="px-3 py-2 text-right font-medium">Waiting</th>
          </tr>
        </thead>
        <tbody>
          {items.map((item) => (
            <tr key={item.plan.id} className="border-b border-ink-line/60 align-top last:border-0" data-testid="review-queue-row">
              <td className="px-3 py-2">
                <SeverityBadge severity={item.worst} />
              </td>
              <td className="px-3 py-2">
                <Link href={`/labs/${labSlug}/review/${item.plan.id}`} className="font-medium" data-testid="review-queue-link">
                  {item.plan.name}
                </Link>
                <p className="text-xs text-ink-faint">{item.plan.studyName}</p>
              </td>
              <td className="px-3 py-2 whitespace-nowrap">{item.plan.authorName}</td>
              <td className="num px-3 py-2 text-right">{item.plan.runCount ?? "—"}</td>
              <td className="px-3 py-2">
                <span className="flex flex-wrap gap-x-2 font-mono text-xs">
                  {item.codes.length
                    ? item.codes.map((c) => (
                        <span key={c} className="whitespace-nowrap">
                          {c}
                        </span>
                      ))
                    : "—"}
                </span>
                <p className="num text-xs text-ink-faint">
                  <span className="whitespace-nowrap">{item.counts.blocking} blocking</span> · <span className="whitespace-nowrap">{item.counts.warning} warning</span> · <span className="whitespace-nowrap">{item.counts.info} info</span>
                </p>
              </td>
              <td className="px-3 py-2 text-xs text-ink-soft">
                {item.signOffReasons.length ? (
                  <ul className="flex flex-col gap-0.5">
                    {item.signOffReasons.map((r) => {
                      const code = r.replace(/:.*$/, "");
                      return (
                        <li key={r}>
                          <span className="font-mono">{code}</span> {(SIGN_OFF_RULES as Record<string, string | undefined>)[code] ?? r.slice(code.length + 1).trim()}
                        </li>
                      );
                    })}
                  </ul>
                ) : (
                  "asked by the author"
                )}
              </td>
              <td className="num px-3 py-2 text-right whitespace-nowrap">
                {waitedFor(item.submittedAt, now)}
                {item.submittedAt && (
                  <p className="text-xs text-ink-faint">
                    since <When iso={item.submittedAt} />
                  </p>
                )}
              </td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
