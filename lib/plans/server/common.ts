import "server-only";
import { randomInt } from "node:crypto";
import type { IncludeOptions, Transaction } from "sequelize";
import { AppError } from "@/lib/errors/app-error";
import { resolveRuns } from "@/lib/chemistry/design-runs";
import type { PlanDocument } from "@/lib/chemistry/plan-document";
import { Plan, Study, User } from "@/lib/server/models";
import { pathId } from "@/lib/studies/server/common";
import type { PlanEvaluation } from "../evaluate";
import type { PlanSummary } from "../schemas";

export const planAuthor = { model: User, as: "author", attributes: ["id", "name"], required: false } satisfies IncludeOptions;
export const planStudy = { model: Study, as: "study", attributes: ["id", "name"], required: false } satisfies IncludeOptions;

/** A new seed for a design's run order (lib/plans/document.ts `withFixedSeed`). */
export const randomSeed = (): number => randomInt(0, 2 ** 31);

/** A plan as a list row shows it. */
export function planSummary(p: Plan): PlanSummary {
  return {
    id: p.id,
    studyId: p.studyId,
    studyName: p.study?.name ?? "",
    name: p.name,
    state: p.state,
    version: p.version,
    contentHash: p.contentHash,
    runCount: p.runCount,
    authorId: p.authorId,
    authorName: p.author?.name ?? "",
    derivedFromPlanId: p.derivedFromPlanId,
    derivation: p.derivation,
    derivationDetails: p.derivationDetails ?? null,
    createdAt: p.createdAt.toISOString(),
    updatedAt: p.updatedAt.toISOString(),
  };
}

/**
 * The lab's plan `planId` with its author and study, locked for update when `lock` is set.
 * @throws AppError not_found for another lab's plan, or none.
 */
export async function findPlan(opts: { labId: string; planId: string; lock?: boolean }, t?: Transaction): Promise<Plan> {
  const where = { id: pathId(opts.planId, "planId", "plan"), labId: opts.labId };
  if (opts.lock && t) {
    // Lock the plan row alone (FOR UPDATE cannot apply to the outer-joined author and study).
    const locked = await Plan.findOne({ where, attributes: ["id"], transaction: t, lock: t.LOCK.UPDATE });
    if (!locked) throw notFound();
  }
  const plan = await Plan.findOne({ where, include: [planAuthor, planStudy], transaction: t });
  if (!plan) throw notFound();
  return plan;
}

const notFound = () => new AppError("not_found", "No such plan in this lab.", [{ path: "planId", message: "no plan has this id" }]);

/** What the audit log records of each change of a plan: its content hash and version, and the document. */
export function planAudit(p: Plan, withDocument = true): Record<string, unknown> {
  return {
    studyId: p.studyId,
    name: p.name,
    state: p.state,
    version: p.version,
    contentHash: p.contentHash,
    derivedFromPlanId: p.derivedFromPlanId,
    derivation: p.derivation,
    ...(p.derivationDetails ? { derivationDetails: p.derivationDetails } : {}),
    ...(withDocument ? { document: p.document } : {}),
  };
}

/** The number of runs of the plan's design: from the run sheet, or the design alone when amounts are infeasible. */
export function runCountOf(doc: PlanDocument, ev: PlanEvaluation): number | null {
  if (ev.runSheet) return ev.runSheet.runs.length;
  try {
    return resolveRuns(doc).length;
  } catch {
    return null;
  }
}

/** A document the engine refuses outright (a field it cannot use) is a 422 naming the fields; nothing is stored. */
export function refuseInvalid(ev: PlanEvaluation): void {
  if (ev.problem?.code === "invalid_input") throw new AppError("invalid_input", ev.problem.message, ev.problem.issues);
}
