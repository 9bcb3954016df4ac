/**
 * The `fit` verb's input for a plan's (or several plans') results, pure: every run of the
 * plans in run-number order, with its natural factor values and the response entered for
 * it; runs that failed, have no result yet or were left out by the chemist go into the
 * fit's `exclude` with their reason, so the engine reports each with its prediction and
 * the page can say which runs the analysis used. Several plans get a block term (each
 * run's `block` is its plan), coded with the first plan's factors.
 */
import { AppError, type FieldIssue } from "../errors/app-error";
import type { FitInputRaw } from "../stats/fit-schema";
import { cellKey, type ResultCell } from "./entries";
import type { AnalysisQuery } from "./schemas";

/** A factor as the fit takes it. */
export interface AnalysisFactor {
  name: string;
  low: number;
  high: number;
  unit?: string;
  scale?: "linear" | "log";
}

/** One plan going into an analysis. */
export interface AnalysisPlanSource {
  id: string;
  name: string;
  factors: AnalysisFactor[];
  runs: { run: number; runOrder: number; natural: Record<string, number> }[];
  /** Stored results of the plan, by `cellKey(run, response)`. */
  results: ReadonlyMap<string, ResultCell>;
  /** Active exclusions: the run, the response (null: every response) and the reason. */
  exclusions: { id: string; run: number; response: string | null; reason: string }[];
}

export type AnalysisRunStatus = "used" | "failed" | "missing" | "excluded";

/** How each run of the plans went into the fit (index = position in the fit's `runs`). */
export interface AnalysisRunInfo {
  index: number;
  planId: string;
  planName: string;
  run: number;
  runOrder: number;
  status: AnalysisRunStatus;
  /** Why a run is not used; null when it is. */
  reason: string | null;
  /** The exclusion that leaves it out (status "excluded"), to restore it. */
  exclusionId: string | null;
  /** The response entered, null when none (failed or missing). */
  observed: number | null;
}

/** The plans' factors must agree (names, in order) to be analysed together. */
function checkFactors(plans: readonly AnalysisPlanSource[]): AnalysisFactor[] {
  const first = plans[0]!;
  const names = first.factors.map((f) => f.name).join(", ");
  const issues: FieldIssue[] = [];
  plans.slice(1).forEach((p) => {
    const other = p.factors.map((f) => f.name).join(", ");
    if (other !== names) issues.push({ path: "plans", message: `${p.name} varies ${other || "no factors"}, ${first.name} varies ${names}: plans analysed together need the same factors` });
  });
  if (issues.length) throw new AppError("invalid_input", "These plans cannot be analysed together.", issues);
  return first.factors.map((f) => ({ name: f.name, low: f.low, high: f.high, ...(f.unit !== undefined ? { unit: f.unit } : {}), ...(f.scale ? { scale: f.scale } : {}) }));
}

/**
 * Builds the fit input of `response` over the plans' runs. With more than one plan each
 * run's block is its plan's name (unique names; the id when two plans share a name).
 * Example: fitInputOf([plan], "yield", query).input.exclude → [{ index: 4, reason: "failed: vial cracked" }]
 */
export function fitInputOf(plans: readonly AnalysisPlanSource[], response: string, query: AnalysisQuery): { input: FitInputRaw; runs: AnalysisRunInfo[] } {
  if (plans.length === 0) throw AppError.field("plans", "name at least one plan");
  const factors = checkFactors(plans);
  const blocked = plans.length > 1;
  const nameCount = new Map<string, number>();
  for (const p of plans) nameCount.set(p.name, (nameCount.get(p.name) ?? 0) + 1);
  const blockOf = (p: AnalysisPlanSource) => (nameCount.get(p.name)! > 1 ? `${p.name} (${p.id.slice(0, 8)})` : p.name).slice(0, 80);
  const runs: FitInputRaw["runs"] = [];
  const exclude: { index: number; reason: string }[] = [];
  const info: AnalysisRunInfo[] = [];
  for (const p of plans) {
    const active = new Map<number, { id: string; reason: string }>();
    for (const e of p.exclusions) if (e.response === null || e.response === response) active.set(e.run, { id: e.id, reason: e.reason });
    for (const r of [...p.runs].sort((a, b) => a.run - b.run)) {
      const index = runs.length;
      const cell = p.results.get(cellKey(r.run, response));
      const value = cell && !cell.failed && cell.value !== null ? cell.value : null;
      const natural: Record<string, number> = {};
      for (const f of factors) natural[f.name] = r.natural[f.name]!;
      runs.push({ natural, ...(value !== null ? { response: value } : {}), ...(blocked ? { block: blockOf(p) } : {}) });
      const ex = active.get(r.run);
      let status: AnalysisRunStatus = "used";
      let reason: string | null = null;
      if (cell?.failed) {
        status = "failed";
        reason = cell.reason ? `the run failed: ${cell.reason}` : "the run failed";
      } else if (value === null) {
        status = "missing";
        reason = "no result entered";
      } else if (ex) {
        status = "excluded";
        reason = ex.reason;
      }
      if (status !== "used") exclude.push({ index, reason: reason! });
      info.push({ index, planId: p.id, planName: p.name, run: r.run, runOrder: r.runOrder, status, reason, exclusionId: status === "excluded" ? ex!.id : null, observed: value });
    }
  }
  const input: FitInputRaw = {
    factors,
    runs,
    model: query.model,
    transform: query.transform,
    exclude,
    ...(query.alpha !== undefined ? { prune: { alpha: query.alpha, hierarchy: query.hierarchy } } : {}),
  };
  return { input, runs: info };
}

/**
 * An engine's issue (paths into the fit input) said at the analysis request's own
 * parameters: `model…` → `model`, a response the ln transform cannot take → `transform`,
 * too few runs → `response` (the runs with results), anything else → `response`.
 */
export function analysisIssues(issues: readonly FieldIssue[], runs: readonly AnalysisRunInfo[]): FieldIssue[] {
  return issues.map((i) => {
    if (i.path.startsWith("model")) return { path: "model", message: i.message };
    const m = /^runs\.(\d+)/.exec(i.path);
    if (m) {
      const r = runs[Number(m[1])];
      const where = r ? `run ${r.run}${runs.some((x) => x.planId !== r.planId) ? ` of ${r.planName}` : ""}` : "a run";
      if (/ln transform/.test(i.message)) return { path: "transform", message: `${where}: ${i.message}` };
      return { path: "response", message: `${where}: ${i.message}` };
    }
    if (i.path === "exclude" || i.path === "runs") return { path: "response", message: i.message };
    return { path: i.path || "response", message: i.message };
  });
}
