import "server-only";
import type { Transaction } from "sequelize";
import { releaseReservationsForPlan } from "@/inventory/server/close-reservation";
import { inTransaction } from "@/lib/server/db";
import type { PlanView } from "../view";
import { evaluateStoredPlan } from "./evaluate-stored-plan";
import { fullPlanView } from "./load-plan-review";
import { applyMove, lockPlanForMove } from "./move-plan";
import { planRefOf } from "./release-plan";

/**
 * Cancels a plan (CONTRACT.md `POST /plans/{plan}/cancel`): the move from any state before
 * running to cancelled of lib/plans/states.ts, in one transaction with the plan row
 * locked. A released plan's held reservations are released in the same transaction
 * (inventory's releaseReservationsForPlan, by the plan's id), so stock is never held for a
 * cancelled plan. Version + 1, audited with how many reservations were released.
 * @throws AppError not_found, conflict (running or later, already cancelled), forbidden.
 */
export async function cancelPlan(opts: { labId: string; actorUserId: string; planId: string }, t?: Transaction): Promise<PlanView> {
  return inTransaction(t, async (tx) => {
    const { plan, move } = await lockPlanForMove({ ...opts, action: "cancel" }, tx);
    let released = 0;
    if (move.guards.includes("releases_reservations")) {
      ({ released } = await releaseReservationsForPlan(
        { labId: opts.labId, actorUserId: opts.actorUserId, planRef: planRefOf(plan), planId: plan.id, reason: `Plan "${plan.name}" cancelled`.slice(0, 500) },
        tx,
      ));
    }
    await applyMove({ labId: opts.labId, actorUserId: opts.actorUserId, plan, move, details: { reservationsReleased: released } }, tx);
    const evaluation = await evaluateStoredPlan({ labId: opts.labId, document: plan.document }, tx);
    return fullPlanView(plan, evaluation, tx);
  });
}
