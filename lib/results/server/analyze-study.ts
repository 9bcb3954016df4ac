import "server-only";
import type { Transaction } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import { analyzeSources, type AnalysisAnswer } from "../analysis";
import { studyAnalysisQuerySchema } from "../schemas";
import { studyAnalysisSources } from "./read-analysis-sources";

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
  const s = await studyAnalysisSources({ labId: opts.labId, studyId: opts.studyId, plans: query.plans }, t);
  return analyzeSources(s.sources, s.responses, query, s.envelope);
}
