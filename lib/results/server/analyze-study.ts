import "server-only";
import type { Transaction } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import { analyzeSourcesWithModel, type AnalysisAnswer } from "../analysis";
import { safeEnvelope } from "../envelope";
import { nextDesignOf } from "../next-design";
import { studyAnalysisQuerySchema } from "../schemas";
import { studyAnalysisSources } from "./read-analysis-sources";

/**
 * Several plans of one study analysed together with a block term (CONTRACT.md
 * `GET /studies/{study}/analysis?plans=a,b&…`): each plan is a block (sum-to-zero coding;
 * lib/stats blocks), coded with the first plan's factors; the safe envelope of the
 * optimum is the first plan's. The answer says which plans and runs were used; `nextDesign`
 * holds the path of steepest ascent of a first-order model.
 * @throws AppError invalid_input (`plans`: not of this study, or factors that differ;
 *   the other query parameters), not_found (the study).
 */
export async function analyzeStudy(opts: { labId: string; studyId: string; query: unknown }, t?: Transaction): Promise<AnalysisAnswer> {
  const query = parseOrThrow(studyAnalysisQuerySchema, opts.query, "The analysis request is not valid.");
  const s = await studyAnalysisSources({ labId: opts.labId, studyId: opts.studyId, plans: query.plans }, t);
  const { answer, model } = analyzeSourcesWithModel(s.sources, s.responses, query, s.envelope);
  const document = s.envelope?.document;
  return { ...answer, nextDesign: nextDesignOf({ model, response: answer.analysis.response, query, safety: document === undefined ? null : () => safeEnvelope(document).check, plan: null }) };
}
