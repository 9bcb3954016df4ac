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
import { pointSafety } from "../chemistry/point-safety";
import { buildTerms, type ModelSpec } from "../stats/model-terms";
import { fitResponseSurface, type SurfaceFitOutput } from "../surface/response-surface";
import { findOptimum, type OptimizeOutput, type OptimumTarget } from "../surface/optimize";
import type { StudyResponse } from "../studies/schemas";
import { analysisIssues, fitInputOf, type AnalysisPlanSource, type AnalysisRunInfo } from "./analysis-input";
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
}

/** `GET …/analysis`: the `fit` verb's output, the optimum, and what the analysis used. */
export type AnalysisAnswer = SurfaceFitOutput & { optimum: OptimizeOutput | null; analysis: AnalysisMeta };

/**
 * Analyses `response` over the plans. `envelope` is the plan document (with the
 * inventory's facts applied) whose safe envelope bounds the optimum, with its plan.
 * Example: analyzeSources([source], study.responses, query, { plan, document }).terms
 * @throws AppError invalid_input at the query's own parameters (`response`, `model`,
 *   `transform`) when the fit cannot be made.
 */
export function analyzeSources(
  sources: readonly AnalysisPlanSource[],
  responses: readonly StudyResponse[],
  query: AnalysisQuery,
  envelope: { plan: { id: string; name: string }; document: unknown } | null,
): AnalysisAnswer {
  if (responses.length === 0) throw AppError.field("response", "the study names no response to analyse");
  const response = query.response === undefined ? responses[0]! : responses.find((r) => r.name === query.response);
  if (!response) throw AppError.field("response", `is not a response of the study (${responses.map((r) => r.name).join(", ")})`);
  const { input, runs } = fitInputOf(sources, response.name, query);
  let fitted: ReturnType<typeof fitResponseSurface>;
  try {
    fitted = fitResponseSurface(input);
  } catch (e) {
    if (e instanceof AppError && e.code === "invalid_input") {
      const used = runs.filter((r) => r.status === "used").length;
      throw new AppError("invalid_input", `${e.message} (${used} of ${runs.length} runs have a ${response.name} result in the analysis)`, analysisIssues(e.issues, runs));
    }
    throw e;
  }
  const { output, model } = fitted;

  let optimum: OptimizeOutput | null = null;
  let optimumNote: string | null = null;
  const target = optimumTarget(model, response);
  if (typeof target === "string") optimumNote = target;
  else {
    let safety: ReturnType<typeof pointSafety> | undefined;
    if (envelope) {
      try {
        safety = pointSafety(envelope.document);
      } catch (e) {
        if (!(e instanceof AppError)) throw e;
        optimumNote = `The safe envelope could not be computed (${e.message}); the optimum below is not checked against it.`;
      }
    }
    try {
      optimum = findOptimum(target, { region: "cube", ...(safety ? { safety } : {}) });
    } catch (e) {
      if (!(e instanceof AppError) || (e.code !== "infeasible" && e.code !== "invalid_input")) throw e;
      optimumNote = e.message;
    }
  }
  const names = model.factors.map((f) => f.name);
  const planCounts = sources.map((s) => ({ id: s.id, name: s.name, runs: runs.filter((r) => r.planId === s.id).length, used: runs.filter((r) => r.planId === s.id && r.status === "used").length }));
  return {
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
    },
  };
}

/** What to optimise for a study response: its goal, or a reason there is none. */
function optimumTarget(model: ReturnType<typeof fitResponseSurface>["model"], r: StudyResponse): OptimumTarget | string {
  if (model.terms.length <= 1) return "The model has no factor term left, so there are no best conditions to find.";
  if (r.goal === "maximize" || r.goal === "minimize") return { kind: "response", model, goal: r.goal, name: r.name, unit: r.unit };
  if (r.target === undefined || r.low === undefined || r.high === undefined || !(r.low < r.target && r.target < r.high)) {
    return `The target of ${r.name} must lie strictly inside its acceptable range to find the best conditions.`;
  }
  return { kind: "desirability", responses: [{ spec: { name: r.name, goal: "target", low: r.low, high: r.high, target: r.target, shape: 1, shapeHigh: 1, weight: 1 }, model, unit: r.unit }] };
}
