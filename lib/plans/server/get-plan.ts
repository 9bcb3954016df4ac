import "server-only";
import type { Transaction } from "sequelize";
import { planJsonBytes } from "../plan-json";
import type { PlanView } from "../view";
import { evaluateStoredPlan } from "./evaluate-stored-plan";
import { findPlan } from "./common";
import { fullPlanView } from "./load-plan-review";

/**
 * One plan of the lab as `GET /plans/{plan}` shows it: the stored document, the run sheet
 * and cautions computed from it as the `plan` verb does, the values it was computed with,
 * its latest signature (with whether it still applies) and its reservations.
 * @throws AppError not_found (another lab's plan, or none).
 */
export async function getPlan(opts: { labId: string; planId: string }, t?: Transaction): Promise<PlanView> {
  const plan = await findPlan(opts, t);
  const evaluation = await evaluateStoredPlan({ labId: opts.labId, document: plan.document }, t);
  return fullPlanView(plan, evaluation, t);
}

/** `GET /plans/{plan}`'s response: `{ plan }` as JSON (lib/plans/plan-json.ts: the run sheet's bytes shared between requests). */
export function planResponse(plan: PlanView): Response {
  return new Response(planJsonBytes(plan), { headers: { "content-type": "application/json" } });
}
