import "server-only";
import type { Transaction } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import { withInventoryFacts } from "@/lib/plans/server/evaluate-stored-plan";
import { analyzeSources, type AnalysisAnswer } from "../analysis";
import { analysisQuerySchema } from "../schemas";
import { analysisSource, loadPlanForResults } from "./common";

/**
 * The analysis of a plan's results (CONTRACT.md `GET /plans/{plan}/analysis?response=&model=&alpha=&hierarchy=`,
 * plus `transform=ln`): the `fit` verb's output for that response and model — runs that
 * failed, have no result or were left out excluded with their reason — and the optimum
 * inside the studied region and the plan's safe envelope (`pointSafety` of the document
 * with the inventory's hazard facts applied). Reads only.
 * @throws AppError invalid_input naming the query parameter, not_found.
 */
export async function analyzePlan(opts: { labId: string; planId: string; query: unknown }, t?: Transaction): Promise<AnalysisAnswer> {
  const query = parseOrThrow(analysisQuerySchema, opts.query, "The analysis request is not valid.");
  const p = await loadPlanForResults({ labId: opts.labId, planId: opts.planId }, t);
  const [source, linked] = await Promise.all([analysisSource(p, opts.labId, t), withInventoryFacts({ labId: opts.labId, document: p.plan.document }, t)]);
  return analyzeSources([source], p.responses, query, { plan: { id: p.plan.id, name: p.plan.name }, document: linked.document });
}
