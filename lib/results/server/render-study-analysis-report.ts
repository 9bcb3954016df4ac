import "server-only";
import type { Transaction } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import type { ReportConfirmation } from "../report";
import { studyReportQuerySchema } from "../schemas";
import { studyAnalysisSources } from "./read-analysis-sources";
import { renderReportOf, type RenderedReport } from "./render-analysis-report";

/**
 * The analysis report of several plans of a study analysed together (`GET /studies/{study}/analysis-report.pdf?plans=a,b&…`).
 * @throws AppError invalid_input naming the query parameter, not_found (the study).
 */
export async function renderStudyAnalysisReport(opts: { labId: string; studyId: string; query: unknown; confirmation?: ReportConfirmation | null }, t?: Transaction): Promise<RenderedReport> {
  const query = parseOrThrow(studyReportQuerySchema, opts.query, "The report request is not valid.");
  const s = await studyAnalysisSources({ labId: opts.labId, studyId: opts.studyId, plans: query.plans }, t);
  return renderReportOf(s, query, `${s.study.name} — ${s.plans.length} plans together`, opts.confirmation);
}
