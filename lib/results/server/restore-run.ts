import "server-only";
import type { Transaction } from "sequelize";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { audit } from "@/lib/server/audit";
import { inTransaction } from "@/lib/server/db";
import { AnalysisExclusion } from "@/lib/server/models";
import { pathId } from "@/lib/studies/server/common";
import { exclusionRestoreSchema } from "../schemas";
import { loadPlanForResults } from "./common";

/**
 * Brings a left-out run back into the plan's analysis
 * (`DELETE /plans/{plan}/exclusions/{exclusionId}`): the exclusion is marked restored (who
 * and when; the row stays as history). Audited (`plan.run_restored`).
 * @throws AppError not_found (plan or exclusion), conflict (already restored).
 */
export async function restoreRun(opts: { labId: string; actorUserId: string; planId: string; exclusionId: string; input?: unknown }, t?: Transaction): Promise<{ id: string; run: number; restoredAt: string }> {
  const body = parseOrThrow(exclusionRestoreSchema, opts.input ?? {});
  return inTransaction(t, async (tx) => {
    const p = await loadPlanForResults({ labId: opts.labId, planId: opts.planId, lock: true }, tx);
    const e = await AnalysisExclusion.findOne({ where: { id: pathId(opts.exclusionId, "exclusionId", "left-out run"), labId: opts.labId, planId: p.plan.id }, transaction: tx, lock: tx.LOCK.UPDATE });
    if (!e) throw new AppError("not_found", "No such left-out run in this plan.", [{ path: "exclusionId", message: "no left-out run has this id" }]);
    if (e.restoredAt) throw new AppError("conflict", `Run ${e.run} is already back in the analysis.`, [{ path: "exclusionId", message: "already restored" }]);
    e.restoredAt = new Date();
    e.restoredBy = opts.actorUserId;
    await e.save({ transaction: tx });
    await audit(
      { labId: opts.labId, actorUserId: opts.actorUserId, action: "plan.run_restored", entityType: "plan", entityId: p.plan.id, before: { run: e.run, response: e.response ?? "every response", reason: e.reason }, after: { run: e.run, restored: true, ...(body.reason ? { reason: body.reason } : {}) } },
      tx,
    );
    return { id: e.id, run: e.run, restoredAt: e.restoredAt.toISOString() };
  });
}
