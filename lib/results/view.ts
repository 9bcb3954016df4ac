/**
 * The results of a plan as `GET /plans/{plan}/results` (and the answer of the PUT) show
 * them: every stored cell with who entered it and when, how many are still missing, and
 * the runs left out of the analysis.
 */
import type { FieldIssue } from "../errors/app-error";
import type { PlanState } from "../plans/states";
import type { StudyResponse } from "../studies/schemas";

export interface ResultCellView {
  run: number;
  response: string;
  /** The value; null when failed. */
  value: number | null;
  failed: boolean;
  reason: string | null;
  enteredBy: { id: string; name: string };
  enteredAt: string;
}

export interface ExclusionView {
  id: string;
  run: number;
  /** The response it applies to, null for every response. */
  response: string | null;
  reason: string;
  excludedBy: { id: string; name: string };
  excludedAt: string;
}

export interface ResultsView {
  planId: string;
  state: PlanState;
  /** Whether the state takes results (lib/plans/states.ts RESULTS_STATES). */
  acceptsResults: boolean;
  responses: StudyResponse[];
  /** The plan's run numbers (the run sheet's `run`), ascending. */
  runNumbers: number[];
  cells: ResultCellView[];
  /** Cells (run × response) with neither a value nor a failure. */
  missing: number;
  complete: boolean;
  exclusions: ExclusionView[];
}

/** What a results entry answers: the plan, its results, and the values accepted with a warning. */
export interface ResultsEntryAnswer<P> {
  plan: P;
  results: ResultsView;
  warnings: FieldIssue[];
  /** What the entry did: cells set and cleared, the state moves made, reservations consumed and released. */
  changed: { set: number; cleared: number; moves: string[]; consumed: number; released: number };
}
