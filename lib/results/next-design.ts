/**
 * What an analysis proposes next, pure (the `nextDesign` field of the analysis answer):
 *
 * - `confirmations`: the confirmation plans derived from the plan, each judged against the
 *   model shown (lib/results/confirmation-check.ts);
 * - `steepestAscent`: from a first-order model, the path of steepest ascent stopped at the
 *   safe envelope (lib/results/steepest-ascent-path.ts);
 * - `settableSteps`: the default settable step of each factor (what the confirmation rounds to);
 * - `augmentation`: whether the plan can be augmented to a central composite design (a
 *   two-level factorial: lib/plans/augmentation.ts), and the augmentations made already.
 */
import type { ResolvedRun } from "../chemistry/design-runs";
import type { SafetyCheck } from "../doe/safe-envelope";
import { factorialRunsOf } from "../plans/augmentation";
import type { PlanState } from "../plans/states";
import type { FittedModel } from "../stats/fitted-model";
import type { StudyResponse } from "../studies/schemas";
import { DEFAULT_SETTABLE_STEPS } from "../surface/confirmation";
import { confirmationChecks, type ConfirmationCheck, type ConfirmationSource } from "./confirmation-check";
import type { AnalysisQuery } from "./schemas";
import { steepestAscentOf, type SteepestAscentView } from "./steepest-ascent-path";

/** A plan derived from the analysed plan. */
export interface DerivedPlanRef {
  id: string;
  name: string;
  state: PlanState;
}

export interface NextDesign {
  /** The settable step of each factor by default (lib/surface `DEFAULT_SETTABLE_STEPS` by unit; 0 = not rounded): what the page offers to adjust. */
  settableSteps: Record<string, number>;
  confirmations: ConfirmationCheck[];
  steepestAscent: SteepestAscentView;
  augmentation: { available: boolean; note: string | null; plans: DerivedPlanRef[] };
}

/**
 * The next design of an analysis. `plan` is the analysed plan (a single-plan analysis), or
 * null for several plans analysed together (nothing to confirm or augment there: that is
 * done from a plan's own analysis).
 * Example: nextDesignOf({ model, response, query, safety, plan: null }).steepestAscent.path?.points
 */
export function nextDesignOf(opts: {
  model: FittedModel;
  response: StudyResponse;
  query: AnalysisQuery;
  /** The safe envelope of the plan whose document bounds the analysis (lib/results/envelope.ts; made only when a path is drawn). */
  safety: (() => SafetyCheck) | null;
  plan: { runs: readonly ResolvedRun[]; confirmations: readonly ConfirmationSource[]; augmentations: readonly DerivedPlanRef[] } | null;
}): NextDesign {
  const { model } = opts;
  const firstOrder = !model.terms.some((t) => t.exponents.some((e) => e >= 2));
  const steepestAscent = steepestAscentOf(model, opts.response, firstOrder && opts.safety ? opts.safety() : undefined);
  const settableSteps = Object.fromEntries(model.factors.map((f) => [f.name, (f.unit !== undefined ? DEFAULT_SETTABLE_STEPS[f.unit.trim()] : undefined) ?? 0]));
  if (!opts.plan) {
    return {
      settableSteps,
      confirmations: [],
      steepestAscent,
      augmentation: { available: false, note: "Plan confirmation runs or an augmentation from a plan's own analysis.", plans: [] },
    };
  }
  const found = factorialRunsOf(opts.plan.runs, model.factors.map((f) => f.name));
  return {
    settableSteps,
    confirmations: confirmationChecks(model, opts.response.name, opts.query, opts.plan.confirmations),
    steepestAscent,
    augmentation: { available: !("reason" in found), note: "reason" in found ? found.reason : null, plans: [...opts.plan.augmentations] },
  };
}
