import "server-only";
import type { Transaction } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import { getLabSettings } from "@/lib/lab-settings/server/get-lab-settings";
import { audit } from "@/lib/server/audit";
import { inTransaction } from "@/lib/server/db";
import { assertVersion } from "@/inventory/server/common";
import { planName, storedDocument } from "../document";
import { planUpdateSchema } from "../schemas";
import { stateAfterEdit } from "../states";
import type { PlanView } from "../view";
import { evaluateStoredPlan } from "./evaluate-stored-plan";
import { findPlan, planAudit, randomSeed, refuseInvalid, runCountOf } from "./common";
import { fullPlanView } from "./load-plan-review";

/**
 * Replaces a plan's document (CONTRACT.md `PUT /plans/{plan}`) when `version` is the
 * current one and the plan's state allows an edit (lib/plans/states.ts `EDITABLE_STATES`:
 * drafts and plans sent back for changes stay as they are; an approved plan returns to
 * draft, and its signature — bound to the old content hash — no longer applies). Any
 * change of content clears the plan's current signature (lib/plans/signature.ts): it stays
 * void even if a later edit brings the signed content back. The document is stored as
 * `createPlan` stores it. A save that changes nothing is not a new
 * version. Audited with the content hash and version before → after.
 * @throws AppError invalid_input (paths under `document.`; nothing changes), not_found,
 *   conflict (stale `version`, or a state that cannot be edited).
 */
export async function updatePlan(opts: { labId: string; actorUserId: string; planId: string; input: unknown }, t?: Transaction): Promise<PlanView> {
  const body = parseOrThrow(planUpdateSchema, opts.input, "The plan is not valid.");
  return inTransaction(t, async (tx) => {
    const plan = await findPlan({ labId: opts.labId, planId: opts.planId, lock: true }, tx);
    assertVersion("plan", plan.version, body.version);
    const next = stateAfterEdit(plan.state);
    const { settings } = await getLabSettings({ labId: opts.labId }, tx);
    const stored = await storedDocument(body.document, settings, randomSeed);
    const evaluation = await evaluateStoredPlan({ labId: opts.labId, document: stored.document, refuseUnknownChemicals: true }, tx);
    refuseInvalid(evaluation);
    if (stored.contentHash === plan.contentHash) return fullPlanView(plan, evaluation, tx);

    const before = planAudit(plan, false);
    plan.document = stored.document;
    plan.contentHash = stored.contentHash;
    plan.name = planName(stored.document);
    plan.runCount = runCountOf(stored.document, evaluation);
    plan.state = next.state;
    plan.version = plan.version + 1;
    const voided = (plan.signatureId ?? null) !== null || next.voidsSignature;
    plan.signatureId = null;
    await plan.save({ transaction: tx });
    await audit(
      {
        labId: opts.labId,
        actorUserId: opts.actorUserId,
        action: "plan.updated",
        entityType: "plan",
        entityId: plan.id,
        before,
        after: { ...planAudit(plan), ...(voided ? { signatureVoided: true } : {}) },
      },
      tx,
    );
    return fullPlanView(plan, evaluation, tx);
  });
}
