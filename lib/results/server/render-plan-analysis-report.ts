import "server-only";
import type { Transaction } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import { reportConfirmation, type ReportConfirmation } from "../report";
import { reportQuerySchema } from "../schemas";
import { listDerivedPlans } from "./list-derived-plans";
import { planAnalysisSources } from "./read-analysis-sources";
import { renderReportOf, type RenderedReport } from "./render-analysis-report";

/**
 * The analysis report of a plan (`GET /plans/{plan}/analysis-report.pdf?…`, the analysis
 * query plus the contour's `x`, `y`, `xRange`, `yRange`, `hold`, `steps`): the model, its
 * coefficient and ANOVA tables, the diagnostics, the contour with the safe envelope through
 * the best conditions, the optimum, the confirmation (given, or else the latest confirmation
 * plan derived from this plan, judged against the report's model), and the safety notice.
 * Reads only.
 * @throws AppError invalid_input naming the query parameter, not_found.
 */
export async function renderPlanAnalysisReport(opts: { labId: string; planId: string; query: unknown; confirmation?: ReportConfirmation | null }, t?: Transaction): Promise<RenderedReport> {
  const query = parseOrThrow(reportQuerySchema, opts.query, "The report request is not valid.");
  const [s, derived] = await Promise.all([planAnalysisSources(opts, t), opts.confirmation === undefined ? listDerivedPlans(opts, t) : null]);
  const confirmation = derived ? reportConfirmation({ sources: s.sources, responses: s.responses, envelope: s.envelope, query, confirmations: derived.confirmations }) : opts.confirmation;
  return renderReportOf(s, query, s.plans[0]!.plan.name, confirmation);
}

