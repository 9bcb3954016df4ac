/**
 * What changed in the plan since its last review (issue 11, the review page): the plan
 * document as the last signature kept it, compared field by field with the document now
 * (lib/plans/diff.ts).
 */
import type { PlanReviewPage } from "@/lib/plans/server/get-plan-review";

export function ChangesSinceReview({ since, currentVersion }: { since: PlanReviewPage["sinceLastReview"]; currentVersion: number }) {
  if (!since) return <p className="text-sm text-ink-soft" data-testid="changes-first-review">First review: no earlier signature to compare with.</p>;
  if (since.changes.length === 0) {
    return (
      <p className="text-sm text-ink-soft" data-testid="changes-none">
        No change to the content since the last review (version <span className="num">{since.reviewedVersion}</span>).
      </p>
    );
  }
  return (
    <div className="flex flex-col gap-2">
      <p className="text-sm text-ink-soft">
        From version <span className="num">{since.reviewedVersion}</span> (last reviewed) to version <span className="num">{currentVersion}</span>:
      </p>
      <table className="w-full text-sm" data-testid="changes-since-review">
        <thead>
          <tr className="border-b border-ink-line text-left text-ink-soft">
            <th className="py-1 pr-2 font-medium">What</th>
            <th className="py-1 pr-2 font-medium">Reviewed</th>
            <th className="py-1 font-medium">Now</th>
          </tr>
        </thead>
        <tbody>
          {since.changes.map((c) => (
            <tr key={c.path} className="border-b border-ink-line/60 align-top last:border-0">
              <td className="py-1 pr-2">{c.label}</td>
              <td className="num py-1 pr-2 text-ink-faint">{c.before ?? "—"}</td>
              <td className="num py-1 font-medium">{c.after ?? "removed"}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
