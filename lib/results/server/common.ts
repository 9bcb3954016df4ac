import "server-only";
import type { Transaction } from "sequelize";
import { AppError } from "@/lib/errors/app-error";
import { resolveRuns, type ResolvedRun } from "@/lib/chemistry/design-runs";
import { findPlan } from "@/lib/plans/server/common";
import { PLAN_STATE_LABELS, type PlanState } from "@/lib/plans/states";
import { AnalysisExclusion, PlanResult, Study, User, type Plan } from "@/lib/server/models";
import type { StudyResponse } from "@/lib/studies/schemas";
import { cellKey, type ResultCell } from "../entries";
import type { AnalysisFactor, AnalysisPlanSource } from "../analysis-input";

/** A plan with what results and analyses need: its study's responses and its runs (the run sheet's run numbers). */
export interface PlanForResults {
  plan: Plan;
  responses: StudyResponse[];
  runs: ResolvedRun[];
}

/**
 * The lab's plan with its study's responses and its runs (lib/chemistry `resolveRuns`: the
 * design's runs, numbered as the run sheet numbers them, by standard order), the plan row
 * locked when `lock` is set.
 * @throws AppError not_found (another lab's plan, or none); conflict when the plan's design
 *   cannot give runs (it could never have been released).
 */
export async function loadPlanForResults(opts: { labId: string; planId: string; lock?: boolean }, t?: Transaction): Promise<PlanForResults> {
  const plan = await findPlan(opts, t);
  const study = await Study.findOne({ where: { id: plan.studyId, labId: opts.labId }, attributes: ["id", "responses"], transaction: t });
  let runs: ResolvedRun[];
  try {
    runs = resolveRuns(plan.document);
  } catch (e) {
    if (e instanceof AppError) throw new AppError("conflict", `The plan's design gives no runs, so it takes no results (${PLAN_STATE_LABELS[plan.state as PlanState].toLowerCase()}).`, [{ path: "state", message: e.message }]);
    throw e;
  }
  return { plan, responses: study?.responses ?? [], runs };
}

/** The stored result rows of a plan, with who entered them. */
export async function resultRows(opts: { labId: string; planId: string }, t?: Transaction): Promise<PlanResult[]> {
  return PlanResult.findAll({
    where: { labId: opts.labId, planId: opts.planId },
    include: [{ model: User, as: "enteredByUser", attributes: ["id", "name"], required: false }],
    order: [["run", "ASC"], ["response", "ASC"]],
    transaction: t,
  });
}

/** Result rows as cells by `cellKey(run, response)`. */
export function cellMap(rows: readonly PlanResult[]): Map<string, ResultCell> {
  return new Map(rows.map((r) => [cellKey(r.run, r.response), { run: r.run, response: r.response, value: r.value, failed: r.failed, reason: r.failureReason }]));
}

/** The runs currently left out of the plan's analysis. */
export async function activeExclusions(opts: { labId: string; planId: string }, t?: Transaction): Promise<AnalysisExclusion[]> {
  return AnalysisExclusion.findAll({
    where: { labId: opts.labId, planId: opts.planId, restoredAt: null },
    include: [{ model: User, as: "excludedByUser", attributes: ["id", "name"], required: false }],
    order: [["run", "ASC"], ["createdAt", "ASC"]],
    transaction: t,
  });
}

/** The plan's factors as the fit takes them (name, limits, unit, scale). */
export function analysisFactors(plan: Plan): AnalysisFactor[] {
  return plan.document.factors.map((f) => ({ name: f.name, low: f.low, high: f.high, unit: f.unit, ...(f.scale ? { scale: f.scale } : {}) }));
}

/** The plan's result cells alone (no people), as plain rows: what an analysis reads. */
async function resultCells(opts: { labId: string; planId: string }, t?: Transaction): Promise<Map<string, ResultCell>> {
  const rows = (await PlanResult.findAll({ where: { labId: opts.labId, planId: opts.planId }, attributes: ["run", "response", "value", "failed", "failureReason"], raw: true, transaction: t })) as unknown as Pick<PlanResult, "run" | "response" | "value" | "failed" | "failureReason">[];
  return new Map(rows.map((r) => [cellKey(r.run, r.response), { run: r.run, response: r.response, value: r.value, failed: r.failed, reason: r.failureReason }]));
}

/** A plan as an analysis reads it: factors, runs, results and active exclusions. */
export async function analysisSource(p: PlanForResults, labId: string, t?: Transaction): Promise<AnalysisPlanSource> {
  const [results, exclusions] = await Promise.all([resultCells({ labId, planId: p.plan.id }, t), activeExclusions({ labId, planId: p.plan.id }, t)]);
  return {
    id: p.plan.id,
    name: p.plan.name,
    factors: analysisFactors(p.plan),
    runs: p.runs.map((r) => ({ run: r.standardOrder, runOrder: r.runOrder, natural: r.natural })),
    results,
    exclusions: exclusions.map((e) => ({ id: e.id, run: e.run, response: e.response, reason: e.reason })),
  };
}
