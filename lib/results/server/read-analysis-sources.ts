import "server-only";
import { Op, type Transaction } from "sequelize";
import { AppError } from "@/lib/errors/app-error";
import { withInventoryFacts } from "@/lib/plans/server/evaluate-stored-plan";
import { Plan, Study } from "@/lib/server/models";
import { findStudy } from "@/lib/studies/server/common";
import type { StudyResponse } from "@/lib/studies/schemas";
import type { EnvelopeSource } from "../analysis";
import type { AnalysisPlanSource } from "../analysis-input";
import { analysisSource, loadPlanForResults, type PlanForResults } from "./common";

/** What an analysis reads: the plans' runs and results, the study's responses, and the envelope's document. */
export interface AnalysisSources {
  study: { id: string; name: string };
  plans: PlanForResults[];
  sources: AnalysisPlanSource[];
  responses: StudyResponse[];
  /** The first plan's document with the inventory's hazard facts applied (what `pointSafety` is given). */
  envelope: EnvelopeSource;
}

async function sourcesOf(study: { id: string; name: string }, loaded: PlanForResults[], responses: StudyResponse[], labId: string, t?: Transaction): Promise<AnalysisSources> {
  const sources: AnalysisPlanSource[] = [];
  for (const p of loaded) sources.push(await analysisSource(p, labId, t));
  const first = loaded[0]!;
  const linked = await withInventoryFacts({ labId, document: first.plan.document }, t);
  return { study, plans: loaded, sources, responses, envelope: { plan: { id: first.plan.id, name: first.plan.name }, document: linked.document } };
}

/**
 * One plan of the lab as an analysis reads it. Reads only.
 * @throws AppError not_found (another lab's plan, or none).
 */
export async function planAnalysisSources(opts: { labId: string; planId: string }, t?: Transaction): Promise<AnalysisSources> {
  const p = await loadPlanForResults(opts, t);
  const study = await Study.findOne({ where: { id: p.plan.studyId, labId: opts.labId }, attributes: ["id", "name"], transaction: t });
  return sourcesOf({ id: p.plan.studyId, name: study?.name ?? "" }, [p], p.responses, opts.labId, t);
}

/**
 * Several plans of one study as an analysis reads them (each a block; the envelope is the first plan's).
 * @throws AppError invalid_input at `plans` (not plans of this study), not_found (the study).
 */
export async function studyAnalysisSources(opts: { labId: string; studyId: string; plans: readonly string[] }, t?: Transaction): Promise<AnalysisSources> {
  const study = await findStudy({ labId: opts.labId, studyId: opts.studyId }, t);
  const found = await Plan.findAll({ where: { labId: opts.labId, studyId: study.id, id: { [Op.in]: [...opts.plans] } }, attributes: ["id"], transaction: t });
  const missing = opts.plans.filter((id) => !found.some((p) => p.id === id));
  if (missing.length) throw new AppError("invalid_input", "Some plans are not plans of this study.", missing.map((id) => ({ path: "plans", message: `${id} is not a plan of this study` })));
  const loaded: PlanForResults[] = [];
  for (const id of opts.plans) loaded.push(await loadPlanForResults({ labId: opts.labId, planId: id }, t));
  return sourcesOf({ id: study.id, name: study.name }, loaded, study.responses, opts.labId, t);
}
