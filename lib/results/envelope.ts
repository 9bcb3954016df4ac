/**
 * The safe envelope of an analysis, pure: what bounds the optimum and what the surface
 * hatches. One verdict per point, the hazard engine's own (`pointSafety` of lib/chemistry,
 * on the plan document with the inventory's hazard facts applied):
 *
 * - **blocking cautions** (TL-V02 over the vessel's pressure limit, TL-F02 near the
 *   autoignition temperature, …): a plan with one can never be released;
 * - **the lab's limits**: the heating block's maximum and the cooling method's minimum
 *   (TL-T01, TL-T02), the vial's working volume (`vessel_volume_above`/`_below`), liquids as
 *   supplied over the final volume, and points where the recipe has no meaning (an amount
 *   not above zero, a solvent fraction out of range, a temperature the engine does not take).
 *
 * A stock above its solubility (`stock_solubility`) is not a limit of the envelope: the
 * dispensing planner then weighs that solid into each vial, which can be set at the bench.
 * The optimum is never a point with either kind of finding; the grid marks
 * both, each finding with its kind (`findingKind` of lib/results/envelope-codes.ts).
 */
import { pointSafety, type PointSafetyResult } from "../chemistry/point-safety";
import type { SafetyCheck } from "../doe/safe-envelope";
import { ENVELOPE_LIMITS, findingKind, type FindingKind } from "./envelope-codes";

/** The findings of one verdict that bound the envelope, blocking cautions first. */
function envelopeFindings(r: PointSafetyResult): { code: string; message: string }[] {
  const limits = r.limits.filter((l) => Object.hasOwn(ENVELOPE_LIMITS, l.code));
  return limits.length === 0 ? r.blocking : [...r.blocking, ...limits];
}

/** The envelope of a plan document: the check of a point, and the kind of each code it reports. */
export interface SafeEnvelope {
  /** Blocking cautions and the lab's limits at a point, as one list (what the optimiser and the grid take). */
  check: SafetyCheck;
  /** Whether a code reported by `check` is a blocking caution or a limit. */
  kindOf: (code: string) => FindingKind;
}

/**
 * The safe envelope of a plan document (with inventory facts applied).
 * Example: safeEnvelope(document).check({ temperature: 150, … }).blocking[0]?.code === "TL-V02"
 * @throws AppError invalid_input from pointSafety for a document that does not validate.
 */
export function safeEnvelope(document: unknown): SafeEnvelope {
  const at = pointSafety(document);
  return { check: (natural) => ({ blocking: envelopeFindings(at(natural)) }), kindOf: findingKind };
}
