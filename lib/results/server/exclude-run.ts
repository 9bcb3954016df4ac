import "server-only";
import type { Transaction } from "sequelize";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { audit } from "@/lib/server/audit";
import { inTransaction } from "@/lib/server/db";
import { AnalysisExclusion } from "@/lib/server/models";
import { exclusionCreateSchema } from "../schemas";
import type { ExclusionView } from "../view";
import { activeExclusions, loadPlanForResults } from "./common";

/**
 * Leaves a run out of the plan's analysis (`POST /plans/{plan}/exclusions`,
 * `{ run, response?, reason }`), for one response or (without `response`) for all; the
 * reason is recorded and shown beside the analysis. Audited (`plan.run_excluded`).
 * Reversible with `restoreRun`.
 * @throws AppError invalid_input (no such run or response; the reason), not_found,
 *   conflict (the run is already left out).
 */
export async function excludeRun(opts: { labId: string; actorUserId: string; planId: string; input: unknown }, t?: Transaction): Promise<ExclusionView> {
  const body = parseOrThrow(exclusionCreateSchema, opts.input, "The run to leave out is not valid.");
  return inTransaction(t, async (tx) => {
    const p = await loadPlanForResults({ labId: opts.labId, planId: opts.planId, lock: true }, tx);
    if (!p.runs.some((r) => r.standardOrder === body.run)) throw AppError.field("run", `the plan has no run ${body.run}`);
    if (body.response !== undefined && !p.responses.some((r) => r.name === body.response)) throw AppError.field("response", `is not a response of the study (${p.responses.map((r) => r.name).join(", ")})`);
    const active = await activeExclusions({ labId: opts.labId, planId: p.plan.id }, tx);
    const clash = active.find((e) => e.run === body.run && (e.response === null || body.response === undefined || e.response === body.response));
    if (clash) throw new AppError("conflict", `Run ${body.run} is already left out${clash.response ? ` for ${clash.response}` : ""}: ${clash.reason}`, [{ path: "run", message: "already left out" }]);
    const e = await AnalysisExclusion.create(
      { labId: opts.labId, planId: p.plan.id, run: body.run, response: body.response ?? null, reason: body.reason, excludedBy: opts.actorUserId, restoredBy: null, restoredAt: null },
      { transaction: tx },
    );
    await audit({ labId: opts.labId, actorUserId: opts.actorUserId, action: "plan.run_excluded", entityType: "plan", entityId: p.plan.id, after: { run: e.run, response: e.response ?? "every response", reason: e.reason } }, tx);
    const [view] = (await activeExclusions({ labId: opts.labId, planId: p.plan.id }, tx)).filter((x) => x.id === e.id);
    return {
      id: e.id,
      run: e.run,
      response: e.response,
      reason: e.reason,
      excludedBy: { id: e.excludedBy, name: view?.excludedByUser?.name ?? "" },
      excludedAt: e.createdAt.toISOString(),
    };
  });
}
