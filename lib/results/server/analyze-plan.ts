import "server-only";
import type { Transaction } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import { analyzeSources, type AnalysisAnswer } from "../analysis";
import { analysisQuerySchema } from "../schemas";
import { planAnalysisSources } from "./read-analysis-sources";

/**
 * The analysis of a plan's results (CONTRACT.md `GET /plans/{plan}/analysis?response=&model=&alpha=&hierarchy=`,
 * plus `transform=ln`, `region=cube|sphere`, `combine=`): the `fit` verb's output for that
 * response and model — runs that failed, have no result or were left out excluded with
 * their reason — and the optimum inside the region and the plan's safe envelope (blocking
 * cautions and the lab's limits, lib/results/envelope.ts, on the document with the
 * inventory's hazard facts applied). Reads only.
 * @throws AppError invalid_input naming the query parameter, not_found.
 */
export async function analyzePlan(opts: { labId: string; planId: string; query: unknown }, t?: Transaction): Promise<AnalysisAnswer> {
  const query = parseOrThrow(analysisQuerySchema, opts.query, "The analysis request is not valid.");
  const s = await planAnalysisSources(opts, t);
  return analyzeSources(s.sources, s.responses, query, s.envelope);
}
