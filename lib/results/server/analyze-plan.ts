import "server-only";
import type { Transaction } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import { runEnvelope } from "@/lib/plans/run-envelope";
import { withInventoryFacts } from "@/lib/plans/server/evaluate-stored-plan";
import { analyzeSourcesWithModel, type AnalysisAnswer } from "../analysis";
import { nextDesignOf } from "../next-design";
import { analysisQuerySchema } from "../schemas";
import { analysisSource, loadPlanForResults } from "./common";
import { listDerivedPlans } from "./list-derived-plans";

/**
 * The analysis of a plan's results (CONTRACT.md `GET /plans/{plan}/analysis?response=&model=&alpha=&hierarchy=`,
 * plus `transform=ln`): the `fit` verb's output for that response and model — runs that
 * failed, have no result or were left out excluded with their reason — and the optimum
 * inside the studied region and the plan's safe envelope (`pointSafety` of the document
 * with the inventory's hazard facts applied); `nextDesign`: its confirmation plans judged
 * against the model, the path of steepest ascent of a first-order model, and whether it can
 * be augmented to a central composite design. Reads only.
 * @throws AppError invalid_input naming the query parameter, not_found.
 */
export async function analyzePlan(opts: { labId: string; planId: string; query: unknown }, t?: Transaction): Promise<AnalysisAnswer> {
  const query = parseOrThrow(analysisQuerySchema, opts.query, "The analysis request is not valid.");
  const p = await loadPlanForResults({ labId: opts.labId, planId: opts.planId }, t);
  const [source, linked, derived] = await Promise.all([
    analysisSource(p, opts.labId, t),
    withInventoryFacts({ labId: opts.labId, document: p.plan.document }, t),
    listDerivedPlans({ labId: opts.labId, planId: p.plan.id }, t),
  ]);
  const { answer, model } = analyzeSourcesWithModel([source], p.responses, query, { plan: { id: p.plan.id, name: p.plan.name }, document: linked.document });
  const nextDesign = nextDesignOf({
    model,
    response: answer.analysis.response,
    query,
    safety: () => runEnvelope(linked.document),
    plan: { runs: p.runs, confirmations: derived.confirmations, augmentations: derived.augmentations },
  });
  return { ...answer, nextDesign };
}
