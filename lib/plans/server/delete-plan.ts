import "server-only";
import type { Transaction } from "sequelize";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { audit } from "@/lib/server/audit";
import { inTransaction } from "@/lib/server/db";
import { PlanSignature } from "@/lib/server/models";
import { assertVersion } from "@/inventory/server/common";
import { planDeleteSchema } from "../schemas";
import { DELETABLE_STATES, PLAN_STATE_LABELS, type PlanState } from "../states";
import { findPlan, planAudit } from "./common";

/**
 * Deletes a draft plan (anything further along is cancelled instead, so its history
 * stays). When `version` is given it must be the current one. Audited with the plan's
 * last content hash, version and document.
 * @throws AppError not_found, conflict (not a draft, a stale `version`, or a plan that was
 *   ever signed: its signatures are kept).
 */
export async function deletePlan(opts: { labId: string; actorUserId: string; planId: string; input?: unknown }, t?: Transaction): Promise<{ id: string }> {
  const v = parseOrThrow(planDeleteSchema, opts.input ?? {});
  return inTransaction(t, async (tx) => {
    const plan = await findPlan({ labId: opts.labId, planId: opts.planId, lock: true }, tx);
    const state: PlanState = plan.state;
    if (!DELETABLE_STATES.includes(state)) {
      throw new AppError("conflict", `Only draft plans can be deleted; this one is ${PLAN_STATE_LABELS[state].toLowerCase()}. Cancel it instead.`, [{ path: "state", message: `${state} cannot be deleted` }]);
    }
    if (v.version !== undefined) assertVersion("plan", plan.version, v.version);
    // Signatures are append-only records of a review: a plan that was ever signed keeps its history (cancel it instead).
    if ((await PlanSignature.count({ where: { labId: opts.labId, planId: plan.id }, transaction: tx })) > 0) {
      throw new AppError("conflict", "This plan was reviewed; its signatures are kept, so it cannot be deleted. Cancel it instead.", [{ path: "state", message: "a reviewed plan cannot be deleted" }]);
    }
    await audit({ labId: opts.labId, actorUserId: opts.actorUserId, action: "plan.deleted", entityType: "plan", entityId: plan.id, before: planAudit(plan) }, tx);
    await plan.destroy({ transaction: tx });
    return { id: plan.id };
  });
}
