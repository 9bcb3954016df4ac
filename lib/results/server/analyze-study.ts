import "server-only";
import { Op, type Transaction } from "sequelize";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { withInventoryFacts } from "@/lib/plans/server/evaluate-stored-plan";
import { Plan } from "@/lib/server/models";
import { findStudy } from "@/lib/studies/server/common";
import { analyzeSources, type AnalysisAnswer } from "../analysis";
import { studyAnalysisQuerySchema } from "../schemas";
import { analysisSource, loadPlanForResults } from "./common";

/**
 * Several plans of one study analysed together with a block term (CONTRACT.md
 * `GET /studies/{study}/analysis?plans=a,b&…`): each plan is a block (sum-to-zero coding;
 * lib/stats blocks), coded with the first plan's factors; the safe envelope of the
 * optimum is the first plan's. The answer says which plans and runs were used.
 * @throws AppError invalid_input (`plans`: not of this study, or factors that differ;
 *   the other query parameters), not_found (the study).
 */
export async function analyzeStudy(opts: { labId: string; studyId: string; query: unknown }, t?: Transaction): Promise<AnalysisAnswer> {
  const query = parseOrThrow(studyAnalysisQuerySchema, opts.query, "The analysis request is not valid.");
  const study = await findStudy({ labId: opts.labId, studyId: opts.studyId }, t);
  const found = await Plan.findAll({ where: { labId: opts.labId, studyId: study.id, id: { [Op.in]: query.plans } }, attributes: ["id"], transaction: t });
  const missing = query.plans.filter((id) => !found.some((p) => p.id === id));
  if (missing.length) throw new AppError("invalid_input", "Some plans are not plans of this study.", missing.map((id) => ({ path: "plans", message: `${id} is not a plan of this study` })));
  const loaded = [];
  for (const id of query.plans) loaded.push(await loadPlanForResults({ labId: opts.labId, planId: id }, t));
  const sources = [];
  for (const p of loaded) sources.push(await analysisSource(p, opts.labId, t));
  const first = loaded[0]!;
  const linked = await withInventoryFacts({ labId: opts.labId, document: first.plan.document }, t);
  return analyzeSources(sources, study.responses, query, { plan: { id: first.plan.id, name: first.plan.name }, document: linked.document });
}
