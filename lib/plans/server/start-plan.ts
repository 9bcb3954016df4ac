import "server-only";
import type { Transaction } from "sequelize";
import { inTransaction } from "@/lib/server/db";
import type { PlanView } from "../view";
import { evaluateStoredPlan } from "./evaluate-stored-plan";
import { fullPlanView } from "./load-plan-review";
import { applyMove, lockPlanForMove } from "./move-plan";

/**
 * Marks a released plan as running (`POST /plans/{plan}/start`, the move released →
 * running of lib/plans/states.ts; `plans.execute`): the bench has started. From here the
 * plan can no longer be cancelled; its reservations are consumed or released when results
 * are entered. One transaction with the plan row locked; version + 1; audited.
 * @throws AppError not_found, conflict (not released), forbidden.
 */
export async function startPlan(opts: { labId: string; actorUserId: string; planId: string }, t?: Transaction): Promise<PlanView> {
  return inTransaction(t, async (tx) => {
    const { plan, move } = await lockPlanForMove({ ...opts, action: "start" }, tx);
    await applyMove({ labId: opts.labId, actorUserId: opts.actorUserId, plan, move }, tx);
    const evaluation = await evaluateStoredPlan({ labId: opts.labId, document: plan.document }, tx);
    return fullPlanView(plan, evaluation, tx);
  });
}
