import "server-only";
import type { Transaction } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import { inTransaction } from "@/lib/server/db";
import { planDuplicateSchema } from "../schemas";
import type { PlanView } from "../view";
import { createPlan } from "./create-plan";
import { findPlan } from "./common";

/**
 * Copies a plan (any state) into a new draft of the same study, derived from it
 * (`derivation: "duplicate"`), named "Copy of …" unless a name is given. The copy keeps
 * the design's seed, so its runs come in the same order. Audited as a created plan.
 * @throws AppError not_found, invalid_input (`name`, or a document the engine no longer accepts).
 */
export async function duplicatePlan(opts: { labId: string; actorUserId: string; planId: string; input?: unknown }, t?: Transaction): Promise<PlanView> {
  const v = parseOrThrow(planDuplicateSchema, opts.input ?? {}, "The copy is not valid.");
  return inTransaction(t, async (tx) => {
    const source = await findPlan({ labId: opts.labId, planId: opts.planId }, tx);
    const document = { ...source.document, name: v.name ?? `Copy of ${source.name}`.slice(0, 300) };
    return createPlan(
      { labId: opts.labId, actorUserId: opts.actorUserId, studyId: source.studyId, input: { document }, derivedFrom: { planId: source.id, derivation: "duplicate" } },
      tx,
    );
  });
}
