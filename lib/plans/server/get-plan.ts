import "server-only";
import type { Transaction } from "sequelize";
import { planJsonBytes } from "../plan-json";
import { planView, type PlanView } from "../view";
import { evaluateStoredPlan } from "./evaluate-stored-plan";
import { findPlan, planSummary } from "./common";
import { loadPlanReview } from "./load-plan-review";

/**
 * One plan of the lab as `GET /plans/{plan}` shows it: the stored document, the run sheet
 * and cautions computed from it as the `plan` verb does, the values it was computed with,
 * its latest signature (with whether it still applies) and its reservations.
 * @throws AppError not_found (another lab's plan, or none).
 */
export async function getPlan(opts: { labId: string; planId: string }, t?: Transaction): Promise<PlanView> {
  const plan = await findPlan(opts, t);
  // The evaluation and the review state read different tables: read them at once.
  const [evaluation, review] = await Promise.all([evaluateStoredPlan({ labId: opts.labId, document: plan.document }, t), loadPlanReview(plan, t)]);
  return planView(planSummary(plan), plan.document, evaluation, review);
}

/** `GET /plans/{plan}`'s response: `{ plan }` as JSON (lib/plans/plan-json.ts: the run sheet's bytes shared between requests). */
export function planResponse(plan: PlanView): Response {
  return new Response(planJsonBytes(plan), { headers: { "content-type": "application/json" } });
}
