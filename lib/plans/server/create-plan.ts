import "server-only";
import type { Transaction } from "sequelize";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { getLabSettings } from "@/lib/lab-settings/server/get-lab-settings";
import { audit } from "@/lib/server/audit";
import { inTransaction } from "@/lib/server/db";
import { Plan } from "@/lib/server/models";
import { findStudy } from "@/lib/studies/server/common";
import { planName, storedDocument } from "../document";
import { planCreateSchema, type PlanDerivation } from "../schemas";
import { planView, type PlanView } from "../view";
import { evaluateStoredPlan } from "./evaluate-stored-plan";
import { findPlan, planAudit, planSummary, randomSeed, refuseInvalid, runCountOf } from "./common";

/**
 * Creates a draft plan in a study (CONTRACT.md `POST /studies/{study}/plans`): the
 * document gets the lab's defaults where it gives none, is validated with the engine's
 * schema and stored in that form with its content hash; the run sheet and cautions are
 * computed at once. `derivedFrom` records where a copy came from (and, for a confirmation or an augmentation, what it was derived with). Audited.
 * @throws AppError invalid_input with paths under `document.` (nothing stored),
 *   not_found (study), conflict (archived study).
 */
export async function createPlan(
  opts: { labId: string; actorUserId: string; studyId: string; input: unknown; derivedFrom?: { planId: string; derivation: PlanDerivation; details?: Record<string, unknown> } },
  t?: Transaction,
): Promise<PlanView> {
  const body = parseOrThrow(planCreateSchema, opts.input, "The plan is not valid.");
  return inTransaction(t, async (tx) => {
    const study = await findStudy({ labId: opts.labId, studyId: opts.studyId }, tx);
    if (study.archivedAt) throw new AppError("conflict", "The study is archived; restore it before adding plans.", [{ path: "studyId", message: "archived" }]);
    const { settings } = await getLabSettings({ labId: opts.labId }, tx);
    const stored = await storedDocument(body.document, settings, randomSeed);
    const evaluation = await evaluateStoredPlan({ labId: opts.labId, document: stored.document, refuseUnknownChemicals: true }, tx);
    refuseInvalid(evaluation);
    const created = await Plan.create(
      {
        labId: opts.labId,
        studyId: study.id,
        name: planName(stored.document),
        state: "draft",
        document: stored.document,
        contentHash: stored.contentHash,
        runCount: runCountOf(stored.document, evaluation),
        authorId: opts.actorUserId,
        derivedFromPlanId: opts.derivedFrom?.planId ?? null,
        derivation: opts.derivedFrom?.derivation ?? null,
        derivationDetails: opts.derivedFrom?.details ?? null,
      },
      { transaction: tx },
    );
    const plan = await findPlan({ labId: opts.labId, planId: created.id }, tx);
    await audit({ labId: opts.labId, actorUserId: opts.actorUserId, action: "plan.created", entityType: "plan", entityId: plan.id, after: planAudit(plan) }, tx);
    return planView(planSummary(plan), plan.document, evaluation);
  });
}
