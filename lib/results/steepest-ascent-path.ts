/**
 * The path of steepest ascent an analysis proposes, pure: from a first-order model (main
 * effects, with or without two-factor interactions — the path follows the first-order
 * coefficients, lib/surface `steepestAscent`), a short list of conditions from the design
 * centre in the direction of the study's goal, half a coded unit of the factor with the
 * largest effect per step, stopped where a run could not be made (the safe envelope the optimum
 * keeps to: a blocking caution or one of the lab's limits, lib/results/envelope.ts). A model with
 * square terms gets no path: its best conditions are the optimum.
 */
import { AppError } from "../errors/app-error";
import type { SafetyCheck } from "../doe/safe-envelope";
import type { FittedModel } from "../stats/fitted-model";
import { termDegree } from "../stats/model-terms";
import { steepestAscent, type SteepestAscentPath } from "../surface/steepest-ascent";
import type { StudyResponse } from "../studies/schemas";

/** Coded units the factor with the largest effect moves per step, and the most steps proposed. */
export const PATH_STEP = 0.5;
export const PATH_STEPS = 8;

/** The path, or why there is none. */
export interface SteepestAscentView {
  path: SteepestAscentPath | null;
  note: string | null;
}

const isSquare = (t: FittedModel["terms"][number]) => t.exponents.some((e) => e >= 2);

/**
 * The path of steepest ascent (descent for a response to minimise) of the model, or a note.
 * Example: steepestAscentOf(model, { name: "yield", goal: "maximize", unit: "%" }, safety).path?.points.length
 */
export function steepestAscentOf(model: FittedModel, response: StudyResponse, safety?: SafetyCheck): SteepestAscentView {
  if (model.terms.some(isSquare)) return { path: null, note: "The model has square terms: its best conditions are the optimum above, not a path." };
  if (!model.terms.some((t) => termDegree(t) === 1)) return { path: null, note: "The model has no main effect left to follow." };
  if (response.goal === "target") return { path: null, note: `${response.name} has a target, not a direction: the path of steepest ascent applies to a response to maximise or minimise.` };
  try {
    const path = steepestAscent(model, { goal: response.goal, step: PATH_STEP, maxSteps: PATH_STEPS, ...(safety ? { safety } : {}) });
    return { path, note: null };
  } catch (e) {
    if (e instanceof AppError && e.code === "invalid_input") return { path: null, note: e.message };
    throw e;
  }
}
