import "server-only";
import type { Transaction } from "sequelize";
import { missingCells } from "../entries";
import type { ResultsView } from "../view";
import { RESULTS_STATES } from "@/lib/plans/states";
import type { AnalysisExclusion, PlanResult } from "@/lib/server/models";
import { activeExclusions, cellMap, loadPlanForResults, resultRows, type PlanForResults } from "./common";

/** The results view of a loaded plan from its rows and exclusions. */
export function resultsView(p: PlanForResults, rows: readonly PlanResult[], exclusions: readonly AnalysisExclusion[]): ResultsView {
  const runNumbers = p.runs.map((r) => r.standardOrder).sort((a, b) => a - b);
  const missing = missingCells(cellMap(rows), runNumbers, p.responses).length;
  return {
    planId: p.plan.id,
    state: p.plan.state,
    acceptsResults: RESULTS_STATES.includes(p.plan.state),
    responses: p.responses,
    runNumbers,
    cells: rows.map((r) => ({
      run: r.run,
      response: r.response,
      value: r.value,
      failed: r.failed,
      reason: r.failureReason,
      enteredBy: { id: r.enteredBy, name: r.enteredByUser?.name ?? "" },
      enteredAt: r.enteredAt.toISOString(),
    })),
    missing,
    complete: missing === 0,
    exclusions: exclusions.map((e) => ({
      id: e.id,
      run: e.run,
      response: e.response,
      reason: e.reason,
      excludedBy: { id: e.excludedBy, name: e.excludedByUser?.name ?? "" },
      excludedAt: e.createdAt.toISOString(),
    })),
  };
}

/**
 * The plan's results (`GET /plans/{plan}/results`): every cell with who entered it and
 * when, what is missing, and the runs left out of the analysis.
 * @throws AppError not_found.
 */
export async function getResults(opts: { labId: string; planId: string }, t?: Transaction): Promise<ResultsView> {
  const p = await loadPlanForResults(opts, t);
  const [rows, exclusions] = await Promise.all([resultRows({ labId: opts.labId, planId: p.plan.id }, t), activeExclusions({ labId: opts.labId, planId: p.plan.id }, t)]);
  return resultsView(p, rows, exclusions);
}
