import "server-only";
import type { Transaction } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import { renderAnalysisReport } from "@/lib/reports/analysis-report";
import { reportInput, type ReportConfirmation } from "../report";
import { reportQuerySchema, studyReportQuerySchema } from "../schemas";
import { planAnalysisSources, studyAnalysisSources, type AnalysisSources } from "./analysis-sources";

/** A PDF and the name to save it under. */
export interface RenderedReport {
  pdf: Buffer;
  filename: string;
}

const fileName = (name: string) => `analysis-${name.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "").slice(0, 80) || "report"}.pdf`;

async function render(s: AnalysisSources, query: ReturnType<typeof reportQuerySchema.parse>, title: string, confirmation: ReportConfirmation | null | undefined): Promise<RenderedReport> {
  const input = reportInput({ sources: s.sources, responses: s.responses, envelope: s.envelope, query, title, studyName: s.study.name, confirmation });
  return { pdf: await renderAnalysisReport(input), filename: fileName(title) };
}

/**
 * The analysis report of a plan (`GET /plans/{plan}/analysis-report.pdf?…`, the analysis
 * query plus the contour's `x`, `y`, `xRange`, `yRange`, `hold`, `steps`): the model, its
 * coefficient and ANOVA tables, the diagnostics, the contour with the safe envelope through
 * the best conditions, the optimum, the confirmation when given, and the safety notice.
 * Reads only.
 * @throws AppError invalid_input naming the query parameter, not_found.
 */
export async function renderPlanAnalysisReport(opts: { labId: string; planId: string; query: unknown; confirmation?: ReportConfirmation | null }, t?: Transaction): Promise<RenderedReport> {
  const query = parseOrThrow(reportQuerySchema, opts.query, "The report request is not valid.");
  const s = await planAnalysisSources(opts, t);
  return render(s, query, s.plans[0]!.plan.name, opts.confirmation);
}

/**
 * The analysis report of several plans of a study analysed together (`GET /studies/{study}/analysis-report.pdf?plans=a,b&…`).
 * @throws AppError invalid_input naming the query parameter, not_found (the study).
 */
export async function renderStudyAnalysisReport(opts: { labId: string; studyId: string; query: unknown; confirmation?: ReportConfirmation | null }, t?: Transaction): Promise<RenderedReport> {
  const query = parseOrThrow(studyReportQuerySchema, opts.query, "The report request is not valid.");
  const s = await studyAnalysisSources({ labId: opts.labId, studyId: opts.studyId, plans: query.plans }, t);
  return render(s, query, `${s.study.name} — ${s.plans.length} plans together`, opts.confirmation);
}
