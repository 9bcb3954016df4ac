/**
 * Where a run of a new plan may sit: the verdict safe design gives a run of a design
 * (lib/plans/safe-design.ts `findingsOf`) — every blocking caution the hazard engine would
 * raise there and every physical limit the point leaves (the block's temperature range, the
 * vial's working volume, amounts or fractions without meaning, a stock above its
 * solubility) — as the design and surface engines' `SafetyCheck`. The runs a plan derives
 * (confirmation runs at the optimum, the axial runs of an augmentation, the proposals along
 * the path of steepest ascent) are checked with it, so none of them is a run safe design
 * would flag.
 */
import { pointSafety } from "../chemistry/point-safety";
import type { SafetyCheck } from "../doe/safe-envelope";
import { findingsOf } from "./safe-design";

/**
 * The check of a plan document (in the form the engines judge: the inventory's hazard facts
 * applied, lib/plans/server/evaluate-stored-plan.ts `withInventoryFacts`).
 * Example: runEnvelope(doc)({ temperature: 140, baseEquiv: 2, pdLoading: 1 }).blocking[0]?.code === "TL-V02"
 * @throws AppError invalid_input for a document that does not validate (pointSafety).
 */
export function runEnvelope(document: unknown): SafetyCheck {
  const at = pointSafety(document);
  return (natural) => ({ blocking: findingsOf(at(natural)).map((f) => ({ code: f.code, message: f.message })) });
}
