import "server-only";
import type { Transaction } from "sequelize";
import { compareCautions, type Severity } from "@/lib/hazards/caution-rules";
import { Plan } from "@/lib/server/models";
import { compareQueueEntries, worstSeverity } from "../review-queue";
import type { PlanSummary } from "../schemas";
import { evaluateStoredPlan } from "./evaluate-stored-plan";
import { planAuthor, planStudy, planSummary } from "./common";

export interface ReviewQueueItem {
  plan: PlanSummary;
  submittedAt: string | null;
  worst: Severity | null;
  counts: Record<Severity, number>;
  /** The cautions' codes, worst first. */
  codes: string[];
  signOffReasons: string[];
}

/**
 * The lab's review queue: every plan in review with its cautions as they are now (the
 * inventory's facts may have changed since it was submitted), worst caution first, then
 * the longest waiting (lib/plans/review-queue.ts).
 */
export async function listReviewQueue(opts: { labId: string }, t?: Transaction): Promise<ReviewQueueItem[]> {
  const plans = await Plan.findAll({ where: { labId: opts.labId, state: "in_review" }, include: [planAuthor, planStudy], order: [["submittedAt", "ASC"], ["id", "ASC"]], transaction: t });
  const items: ReviewQueueItem[] = [];
  for (const p of plans) {
    const ev = await evaluateStoredPlan({ labId: opts.labId, document: p.document }, t);
    const counts: Record<Severity, number> = { blocking: 0, warning: 0, info: 0 };
    for (const c of ev.cautions) counts[c.severity]++;
    items.push({
      plan: planSummary(p),
      submittedAt: p.submittedAt ? p.submittedAt.toISOString() : null,
      worst: worstSeverity(ev.cautions),
      counts,
      codes: [...new Set([...ev.cautions].sort(compareCautions).map((c) => c.code))],
      signOffReasons: ev.signOffReasons,
    });
  }
  return items.sort(compareQueueEntries);
}
