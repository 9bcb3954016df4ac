import "server-only";
import type { Transaction } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import { analyzeSourcesWithModel, type AnalysisAnswer } from "../analysis";
import { safeEnvelope } from "../envelope";
import { nextDesignOf } from "../next-design";
import { analysisQuerySchema } from "../schemas";
import { listDerivedPlans } from "./list-derived-plans";
import { planAnalysisSources } from "./read-analysis-sources";

/**
 * The analysis of a plan's results (CONTRACT.md `GET /plans/{plan}/analysis?response=&model=&alpha=&hierarchy=`,
 * plus `transform=ln`, `region=cube|sphere`, `combine=`): the `fit` verb's output for that
 * response and model — runs that failed, have no result or were left out excluded with
 * their reason — and the optimum inside the region and the plan's safe envelope (blocking
 * cautions and the lab's limits, lib/results/envelope.ts, on the document with the
 * inventory's hazard facts applied); `nextDesign`: its confirmation plans judged against the
 * model, the path of steepest ascent of a first-order model (stopped at the same envelope),
 * and whether it can be augmented to a central composite design. Reads only.
 * @throws AppError invalid_input naming the query parameter, not_found.
 */
export async function analyzePlan(opts: { labId: string; planId: string; query: unknown }, t?: Transaction): Promise<AnalysisAnswer> {
  const query = parseOrThrow(analysisQuerySchema, opts.query, "The analysis request is not valid.");
  const [s, derived] = await Promise.all([planAnalysisSources(opts, t), listDerivedPlans(opts, t)]);
  const { answer, model } = analyzeSourcesWithModel(s.sources, s.responses, query, s.envelope);
  const document = s.envelope?.document;
  const nextDesign = nextDesignOf({
    model,
    response: answer.analysis.response,
    query,
    safety: document === undefined ? null : () => safeEnvelope(document).check,
    plan: { runs: s.plans[0]!.runs, confirmations: derived.confirmations, augmentations: derived.augmentations },
  });
  return { ...answer, nextDesign };
}
