/**
 * The analysis of a plan's (or several plans') results, pure: the `fit` verb's own
 * function (lib/surface `fitResponseSurface`, which lib/cli/verbs/fit.ts runs) on the
 * input lib/results/analysis-input.ts builds, and the optimum (lib/surface `findOptimum`)
 * inside the studied region (the coded cube) and the safe envelope — the hazard engine's
 * verdict at each point, `pointSafety(document)` of lib/chemistry. The answer is the fit
 * output (CONTRACT.md) plus `optimum`, plus `analysis`: which plans and runs were used,
 * and the terms a chemist may tick.
 */
import { AppError } from "../errors/app-error";
import { buildTerms, type ModelSpec } from "../stats/model-terms";
import type { FittedModel } from "../stats/fitted-model";
import { fitResponseSurface, type SurfaceFitOutput } from "../surface/response-surface";
import { findOptimum, type OptimizeOutput, type OptimumTarget } from "../surface/optimize";
import { desirabilitySpecSchema, type DesirabilitySpec } from "../surface/desirability";
import type { StudyResponse } from "../studies/schemas";
import { analysisIssues, fitInputOf, type AnalysisPlanSource, type AnalysisRunInfo } from "./analysis-input";
import { safeEnvelope, type SafeEnvelope } from "./envelope";
import type { NextDesign } from "./next-design";
import type { AnalysisQuery } from "./schemas";

export interface AnalysisMeta {
  response: StudyResponse;
  model: ModelSpec;
  transform: "none" | "ln";
  /** Pruning level, null when nothing is pruned. */
  alpha: number | null;
  hierarchy: boolean;
  plans: { id: string; name: string; runs: number; used: number }[];
  /** Every run of the plans and how it went into the fit (index = the fit's run index). */
  runs: AnalysisRunInfo[];
  /** The terms of the full quadratic in these factors, in model order (what can be ticked). */
  candidateTerms: string[];
  /** The plan whose recipe, vessel and limits define the safe envelope of the optimum. */
  envelopeOf: { id: string; name: string } | null;
  /** Why there is no optimum (or why it ignores the envelope), null when there is nothing to say. */
  optimumNote: string | null;
  /** Where the optimum was looked for. */
  region: "cube" | "sphere";
  /** The responses optimised together through their desirability (with the bounds used), null for one response's own goal. */
  desirability: DesirabilityUse[] | null;
}

/** One response in a desirability optimum: its goal and bounds, and where the bounds come from. */
export interface DesirabilityUse {
  name: string;
  unit: string | null;
  goal: "maximize" | "minimize" | "target";
  low: number;
  high: number;
  target: number | null;
  /** "study": the study's acceptable bounds; "observed": the lowest and highest result (the study gives none). */
  bounds: "study" | "observed";
}

/**
 * `GET …/analysis`: the `fit` verb's output, the optimum, and what the analysis used; the
 * plan and study routes add `nextDesign` (confirmations, steepest ascent, augmentation:
 * lib/results/next-design.ts).
 */
export type AnalysisAnswer = SurfaceFitOutput & { optimum: OptimizeOutput | null; analysis: AnalysisMeta; nextDesign?: NextDesign };

/** A response fitted for an analysis query: the study's response, the fit (output and model) and the runs used. */
export interface FittedQuery {
  response: StudyResponse;
  output: SurfaceFitOutput;
  model: FittedModel;
  runs: AnalysisRunInfo[];
}

/**
 * Fits `name` (default: the study's first response) over the plans as the query asks.
 * @throws AppError invalid_input at the query's own parameters (`response`, `model`,
 *   `transform`) when the fit cannot be made.
 */
export function fitQuery(sources: readonly AnalysisPlanSource[], responses: readonly StudyResponse[], query: AnalysisQuery, name: string | undefined = query.response, path = "response"): FittedQuery {
  if (responses.length === 0) throw AppError.field(path, "the study names no response to analyse");
  const response = name === undefined ? responses[0]! : responses.find((r) => r.name === name);
  if (!response) throw AppError.field(path, `${name} is not a response of the study (${responses.map((r) => r.name).join(", ")})`);
  const { input, runs } = fitInputOf(sources, response.name, query);
  try {
    const { output, model } = fitResponseSurface(input);
    return { response, output, model, runs };
  } catch (e) {
    if (e instanceof AppError && e.code === "invalid_input") {
      const used = runs.filter((r) => r.status === "used").length;
      const issues = analysisIssues(e.issues, runs).map((i) => (path === "response" ? i : { path, message: `${response.name}: ${i.message}` }));
      throw new AppError("invalid_input", `${e.message} (${used} of ${runs.length} runs have a ${response.name} result in the analysis)`, issues);
    }
    throw e;
  }
}

/** The plan whose document bounds the envelope, and that document (inventory facts applied). */
export type EnvelopeSource = { plan: { id: string; name: string }; document: unknown } | null;

/** The safe envelope of the source, or the note saying why there is none. */
export function envelopeOf(envelope: EnvelopeSource): { envelope: SafeEnvelope | null; note: string | null } {
  if (!envelope) return { envelope: null, note: null };
  try {
    return { envelope: safeEnvelope(envelope.document), note: null };
  } catch (e) {
    if (!(e instanceof AppError)) throw e;
    return { envelope: null, note: `The safe envelope could not be computed (${e.message}); the optimum below is not checked against it.` };
  }
}

/**
 * Analyses `response` over the plans. `envelope` is the plan document (with the
 * inventory's facts applied) whose safe envelope bounds the optimum, with its plan.
 * Example: analyzeSources([source], study.responses, query, { plan, document }).terms
 * @throws AppError invalid_input at the query's own parameters (`response`, `model`,
 *   `transform`, `combine`) when the fit cannot be made.
 */
export function analyzeSources(sources: readonly AnalysisPlanSource[], responses: readonly StudyResponse[], query: AnalysisQuery, envelope: EnvelopeSource): AnalysisAnswer {
  return analyzeSourcesWithModel(sources, responses, query, envelope).answer;
}

/**
 * `analyzeSources`, with the fitted model of the response itself (what the confirmation runs
 * and the path of steepest ascent are computed from: lib/results/next-design.ts).
 */
export function analyzeSourcesWithModel(sources: readonly AnalysisPlanSource[], responses: readonly StudyResponse[], query: AnalysisQuery, envelope: EnvelopeSource): { answer: AnalysisAnswer; model: FittedModel } {
  const main = fitQuery(sources, responses, query);
  const { output, model, runs, response } = main;
  const others = query.combine.filter((n) => n !== response.name).map((n) => fitQuery(sources, responses, { ...query, transform: "none" }, n, "combine"));

  let optimum: OptimizeOutput | null = null;
  let optimumNote: string | null = null;
  let desirability: DesirabilityUse[] | null = null;
  const target = optimumTarget(main, others);
  if (typeof target === "string") optimumNote = target;
  else {
    desirability = target.uses;
    const env = envelopeOf(envelope);
    optimumNote = env.note;
    try {
      optimum = findOptimum(target.target, { region: query.region, ...(env.envelope ? { safety: env.envelope.check } : {}) });
    } catch (e) {
      if (!(e instanceof AppError) || (e.code !== "infeasible" && e.code !== "invalid_input")) throw e;
      optimumNote = e.message;
    }
  }
  const names = model.factors.map((f) => f.name);
  const planCounts = sources.map((s) => ({ id: s.id, name: s.name, runs: runs.filter((r) => r.planId === s.id).length, used: runs.filter((r) => r.planId === s.id && r.status === "used").length }));
  const answer: AnalysisAnswer = {
    ...output,
    optimum,
    analysis: {
      response,
      model: query.model,
      transform: query.transform,
      alpha: query.alpha ?? null,
      hierarchy: query.hierarchy,
      plans: planCounts,
      runs,
      candidateTerms: buildTerms("quadratic", names).map((t) => t.name),
      envelopeOf: envelope ? envelope.plan : null,
      optimumNote,
      region: query.region,
      desirability,
    },
  };
  return { answer, model };
}

/**
 * A study response's desirability (Derringer–Suich) with the study's goal and bounds; a
 * response to maximise or minimise without both bounds is scaled between its lowest and
 * highest observed result. A string says why it cannot be valued.
 */
function desirabilityOf(f: FittedQuery): { spec: DesirabilitySpec; use: DesirabilityUse } | string {
  const r = f.response;
  let low = r.low;
  let high = r.high;
  let bounds: DesirabilityUse["bounds"] = "study";
  if (r.goal === "target") {
    if (r.target === undefined || low === undefined || high === undefined || !(low < r.target && r.target < high)) return `The target of ${r.name} must lie strictly inside its acceptable range to find the best conditions.`;
  } else if (low === undefined || high === undefined) {
    const seen = f.runs.filter((x) => x.status === "used" && x.observed !== null).map((x) => x.observed!);
    low = Math.min(...seen);
    high = Math.max(...seen);
    bounds = "observed";
    if (!(low < high)) return `Every ${r.name} result is the same, so it cannot be scaled for the desirability.`;
  }
  const spec = desirabilitySpecSchema.parse({ name: r.name, goal: r.goal, low, high, ...(r.goal === "target" ? { target: r.target } : {}) });
  return { spec, use: { name: r.name, unit: r.unit || null, goal: r.goal, low: low!, high: high!, target: r.goal === "target" ? r.target! : null, bounds } };
}

/** What to optimise: the response's goal, the desirability of several responses (or of one with a target), or a reason there is none. */
function optimumTarget(main: FittedQuery, others: readonly FittedQuery[]): { target: OptimumTarget; uses: DesirabilityUse[] | null } | string {
  const all = [main, ...others];
  for (const f of all) if (f.model.terms.length <= 1) return `The model of ${f.response.name} has no factor term left, so there are no best conditions to find.`;
  const r = main.response;
  if (others.length === 0 && (r.goal === "maximize" || r.goal === "minimize")) return { target: { kind: "response", model: main.model, goal: r.goal, name: r.name, unit: r.unit }, uses: null };
  const specs = [];
  for (const f of all) {
    const d = desirabilityOf(f);
    if (typeof d === "string") return d;
    specs.push({ ...d, model: f.model, unit: f.response.unit });
  }
  return { target: { kind: "desirability", responses: specs.map((s) => ({ spec: s.spec, model: s.model, unit: s.unit })) }, uses: specs.map((s) => s.use) };
}
