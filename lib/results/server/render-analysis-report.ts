import "server-only";
import { renderAnalysisReport } from "@/lib/reports/analysis-report";
import { reportInput, type ReportConfirmation } from "../report";
import type { ReportQuery } from "../schemas";
import type { AnalysisSources } from "./read-analysis-sources";

/** A PDF and the name to save it under. */
export interface RenderedReport {
  pdf: Buffer;
  filename: string;
}

const fileName = (name: string) => `analysis-${name.toLowerCase().replace(/[^a-z0-9]+/g, "-").replace(/^-|-$/g, "").slice(0, 80) || "report"}.pdf`;

/** The analysis report of what an analysis read (the plan or study operations call it). */
export async function renderReportOf(s: AnalysisSources, query: ReportQuery, title: string, confirmation: ReportConfirmation | null | undefined): Promise<RenderedReport> {
  const input = reportInput({ sources: s.sources, responses: s.responses, envelope: s.envelope, query, title, studyName: s.study.name, confirmation });
  return { pdf: await renderAnalysisReport(input), filename: fileName(title) };
}

