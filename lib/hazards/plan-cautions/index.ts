/**
 * The cautions of a plan, by job: the input schema (schema.ts), the accumulator that
 * merges runs (accumulator.ts), hazard profiles (hazard-profile.ts), the component rules
 * (component-checks.ts), the vial rules (vial-checks.ts), one run (run-cautions.ts) and
 * the whole plan (evaluate.ts).
 */
export * from "./schema";
export { CautionAccumulator } from "./accumulator";
export { profileOf, type HazardProfile, type Material } from "./hazard-profile";
export { ownFirings, wetPartnerFirings, secondPersonFirings } from "./component-checks";
export { equipmentFirings, evaluateVial, type VialResult } from "./vial-checks";
export { cautionContext, evaluateRun, runCautionEvaluator, type CautionContext, type RunEvaluation } from "./run-cautions";
export { evaluatePlanCautions, type PlanCautionReport } from "./evaluate";
export type { Caution } from "../caution-rules";
