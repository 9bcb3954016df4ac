/**
 * The plan's earlier reviews (issue 11, the review page): each signature with its meaning,
 * signer, time, comment, the version and SHA-256 it was given for.
 */
import type { ReviewHistoryItem } from "@/lib/plans/server/get-plan-review";
import { When } from "@/components/studies/bits";

export function ReviewHistory({ history }: { history: ReviewHistoryItem[] }) {
  if (history.length === 0) return <p className="text-sm text-ink-soft">No earlier review.</p>;
  return (
    <ol className="flex flex-col gap-2 text-sm" data-testid="review-history">
      {[...history].reverse().map((h) => (
        <li key={`${h.signedAt}-${h.contentHash}`} className="border-l-2 border-ink-line pl-3">
          <p>
            <span className="font-medium">{h.meaning[0]!.toUpperCase() + h.meaning.slice(1)}</span> by {h.signerName}
          </p>
          <p className="text-xs text-ink-faint">
            <When iso={h.signedAt} /> UTC · version <span className="num">{h.planVersion}</span> · <span className="font-mono">{h.contentHash.slice(0, 12)}…</span>
          </p>
          {h.comment && <p className="mt-0.5 whitespace-pre-line text-ink-soft">“{h.comment}”</p>}
        </li>
      ))}
    </ol>
  );
}
