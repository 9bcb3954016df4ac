/**
 * The confirmation plan of an analysis, pure: replicate runs at the optimum, rounded to what
 * can be set at the bench and checked again against the safe envelope (lib/surface
 * `planConfirmation`: the rounding, the re-check, the prediction and its intervals), as a
 * plan document — the source plan's recipe, factors, vessel, block and limits, with its
 * design replaced by the given runs (`design.runs`, kind "confirmation") — and the details
 * the new plan keeps of what it was derived with (`plans.derivation_details`), so the source
 * plan's analysis can later judge the results against the prediction
 * (lib/results/confirmation-check.ts).
 */
import { AppError, type FieldIssue } from "../errors/app-error";
import type { PlanDocument } from "../chemistry/plan-document";
import type { SafetyCheck } from "../doe/safe-envelope";
import { formatFactorValue } from "../doe/format";
import { displayUnit } from "../units/display-unit";
import type { FittedModel } from "../stats/fitted-model";
import type { ModelSpec } from "../stats/model-terms";
import { planConfirmation, type ConfirmationPlan } from "../surface/confirmation";
import type { Region } from "../surface/solvers";
import type { OptimizeOutput } from "../surface/optimize";
import type { AnalysisQuery } from "./schemas";

/** The analysis a derived plan was planned from (the analysis query, resolved). */
export interface DerivedAnalysis {
  response: string;
  model: ModelSpec;
  alpha: number | null;
  hierarchy: boolean;
  transform: "none" | "ln";
  /** Where the optimum was looked for, and the responses optimised with it through their desirability. */
  region: "cube" | "sphere";
  combine: string[];
}

/** What a confirmation plan keeps of its derivation (`plans.derivation_details`). */
export interface ConfirmationDetails {
  kind: "confirmation";
  analysis: DerivedAnalysis;
  /** The optimum the analysis found (before rounding). */
  optimum: { natural: Record<string, number>; coded: Record<string, number>; predicted: number; pi95: [number, number] | null };
  /** The settable point the runs sit at. */
  point: { natural: Record<string, number>; coded: Record<string, number> };
  /** The step each factor was rounded to (null: not rounded). */
  steps: Record<string, number | null>;
  replicates: number;
  /** Prediction at the point, the 95 % prediction interval of one run and the interval for the mean of the replicates. */
  predicted: number;
  pi95: [number, number] | null;
  meanInterval95: [number, number] | null;
  /** True when plain rounding left the region or the envelope and the point moved to the nearest settable point inside. */
  moved: boolean;
  warnings: string[];
}

/** The confirmation of an analysis: the plan to make and its document. */
export interface Confirmation {
  plan: ConfirmationPlan;
  details: ConfirmationDetails;
  document: Record<string, unknown>;
}

/** The coded region the optimum was searched in (the answer's `region` and `radius`). */
function regionOf(optimum: OptimizeOutput): Region {
  return optimum.region === "sphere" && optimum.radius !== null ? { kind: "sphere", radius: optimum.radius, halfSpaces: [] } : { kind: "cube", radius: 1, halfSpaces: [] };
}

/**
 * Plans the confirmation of `optimum` (the analysis answer's) for a source plan document
 * (its stored form: what the new plan copies). `safety` is the check every run of the new
 * plan must pass (the safe envelope of lib/results/envelope.ts on the document with the
 * inventory's facts: the envelope the optimum was found in).
 * Example: confirmationOf({ model, optimum, source, analysis, replicates: 3, safety, name }).document.design.runs.length === 3
 * @throws AppError invalid_input at `steps.<factor>` (a step for no factor, a bad step);
 *   infeasible with an issue at `steps.<factor>` for each rounded factor when no settable
 *   point near the optimum is inside the region and the envelope.
 */
export function confirmationOf(opts: {
  model: FittedModel;
  optimum: OptimizeOutput;
  source: PlanDocument;
  analysis: DerivedAnalysis;
  replicates: number;
  steps?: Record<string, number>;
  safety: SafetyCheck;
  name: string;
}): Confirmation {
  const { model, optimum } = opts;
  let plan: ConfirmationPlan;
  try {
    plan = planConfirmation(model, optimum.natural, { replicates: opts.replicates, ...(opts.steps ? { steps: opts.steps } : {}), region: regionOf(optimum), safety: opts.safety });
  } catch (e) {
    if (e instanceof AppError && e.code === "infeasible") throw infeasibleAtSteps(model, optimum, opts.steps, e);
    throw e;
  }
  const details: ConfirmationDetails = {
    kind: "confirmation",
    analysis: opts.analysis,
    optimum: { natural: optimum.natural, coded: optimum.coded, predicted: optimum.predicted, pi95: optimum.pi95 },
    point: { natural: plan.natural, coded: plan.coded },
    steps: plan.steps,
    replicates: opts.replicates,
    predicted: plan.predicted,
    pi95: plan.pi95,
    meanInterval95: plan.mean.interval95,
    moved: plan.moved,
    warnings: plan.warnings,
  };
  return { plan, details, document: confirmationDocument(opts.source, plan, opts.name) };
}

/**
 * The source document with its design replaced by the confirmation runs (given runs, run
 * order = standard order: replicates at one point need no randomised order).
 */
export function confirmationDocument(source: PlanDocument, plan: ConfirmationPlan, name: string): Record<string, unknown> {
  return {
    ...source,
    name: name.slice(0, 300),
    design: { runs: plan.runs.map((r, i) => ({ standardOrder: i + 1, runOrder: i + 1, kind: "confirmation", natural: { ...r.natural } })) },
  };
}

/** The analysis query as a derived plan records it. */
export function derivedAnalysis(response: string, query: AnalysisQuery): DerivedAnalysis {
  return { response, model: query.model, alpha: query.alpha ?? null, hierarchy: query.hierarchy, transform: query.transform, region: query.region, combine: [...query.combine] };
}

/** No settable point near the optimum is safe: each rounded factor named, with its step and the optimum's value. */
function infeasibleAtSteps(model: FittedModel, optimum: OptimizeOutput, given: Record<string, number> | undefined, e: AppError): AppError {
  const why = e.issues.map((i) => i.message).join("; ");
  const issues: FieldIssue[] = [];
  for (const f of model.factors) {
    const step = given?.[f.name];
    if (step === 0) continue;
    issues.push({ path: `steps.${f.name}`, message: `the optimum's ${formatFactorValue(f, optimum.natural[f.name]!)}${step ? ` rounded to steps of ${step}${displayUnit(f.unit) ? ` ${displayUnit(f.unit)}` : ""}` : ""}: ${why}; a finer step (or 0, not rounded) may keep it inside` });
  }
  return new AppError("infeasible", "No settable point near the optimum is inside the studied region and the safe envelope.", issues.length ? issues : e.issues);
}
