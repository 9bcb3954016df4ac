import "server-only";
import type { Transaction } from "sequelize";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { resolveRuns } from "@/lib/chemistry/design-runs";
import { safeEnvelope } from "@/lib/results/envelope";
import { inTransaction } from "@/lib/server/db";
import { augmentationOf, type AugmentationDetails } from "../augmentation";
import { planAugmentSchema } from "../schemas";
import type { PlanView } from "../view";
import { createPlan } from "./create-plan";
import { withInventoryFacts } from "./evaluate-stored-plan";
import { findPlan, randomSeed } from "./common";

/** States whose plan is not augmented (it was never run, or never will be). */
const NOT_AUGMENTED = new Set(["rejected", "cancelled"]);

/**
 * The next design after a two-level factorial plan (`POST /plans/{plan}/augment`): its
 * augmentation to a central composite design — axial runs at ±α and centre runs in a new
 * block, α rotatable unless asked otherwise and cut to the largest value whose axial runs
 * pass the safe envelope (blocking cautions and the lab's limits, lib/results/envelope.ts, on
 * the document with the inventory's hazard facts applied), the
 * notes saying what was given up — as a new draft plan of the same study, derived from it
 * (`derivation: "augmentation"`, the α and notes in `derivationDetails`). Analysed with the
 * first through the study analysis (a block per plan). Audited as a created plan.
 * @throws AppError invalid_input (`alpha`, `centerPoints`, `name`), not_found, conflict
 *   (`design`: not a two-level factorial; `state`: a rejected or cancelled plan),
 *   infeasible (`alpha`: even face-centred axial runs would block).
 */
export async function augmentPlan(
  opts: { labId: string; actorUserId: string; planId: string; input?: unknown },
  t?: Transaction,
): Promise<{ plan: PlanView; augmentation: AugmentationDetails }> {
  const v = parseOrThrow(planAugmentSchema, opts.input ?? {}, "The augmentation is not valid.");
  return inTransaction(t, async (tx) => {
    const source = await findPlan({ labId: opts.labId, planId: opts.planId }, tx);
    if (NOT_AUGMENTED.has(source.state)) throw new AppError("conflict", `A ${source.state} plan is not augmented.`, [{ path: "state", message: source.state }]);
    let runs;
    try {
      runs = resolveRuns(source.document);
    } catch (e) {
      if (e instanceof AppError) throw new AppError("conflict", "The plan's design gives no runs to augment.", [{ path: "design", message: e.message }]);
      throw e;
    }
    const linked = await withInventoryFacts({ labId: opts.labId, document: source.document }, tx);
    const planned = augmentationOf({
      source: source.document,
      runs,
      alpha: v.alpha,
      ...(v.centerPoints !== undefined ? { centerPoints: v.centerPoints } : {}),
      safety: safeEnvelope(linked.document).check,
      seed: randomSeed(),
      name: v.name ?? `${source.name} — axial and centre runs`,
    });
    const plan = await createPlan(
      {
        labId: opts.labId,
        actorUserId: opts.actorUserId,
        studyId: source.studyId,
        input: { document: planned.document },
        derivedFrom: { planId: source.id, derivation: "augmentation", details: { ...planned.details } },
      },
      tx,
    );
    return { plan, augmentation: planned.details };
  });
}
