/**
 * The safe envelope as the design and surface engines see it: a callback that takes
 * the natural value of every factor and answers with the blocking cautions that would
 * fire there. The engines never know why a point is unsafe (the hazard engine does:
 * the caller passes its `pointSafety` check); they only avoid, stop at or mark the
 * points where something blocks.
 */
import { decodeValue, type Factor } from "./factors";

/** A caution that blocks a plan at a point: its code and the message to show. */
export interface BlockingCaution {
  code: string;
  message: string;
}

/** What the safety check says about one point. */
export interface SafetyVerdict {
  blocking: BlockingCaution[];
}

/** The safety check of one point, given natural factor values by name. */
export type SafetyCheck = (natural: Record<string, number>) => SafetyVerdict;

/** The natural values, by factor name, of a coded point (factor order). */
export function naturalRecord(factors: readonly Factor[], coded: readonly number[]): Record<string, number> {
  const out: Record<string, number> = {};
  factors.forEach((f, i) => (out[f.name] = decodeValue(f, coded[i]!)));
  return out;
}

/** The blocking cautions at a coded point (none without a check). */
export function blockingAt(check: SafetyCheck | undefined, factors: readonly Factor[], coded: readonly number[]): BlockingCaution[] {
  return check ? check(naturalRecord(factors, coded)).blocking : [];
}

/** Natural limits a factor can be set to (a lab's block temperature, a pump's range), either side optional. */
export interface FactorLimit {
  min?: number;
  max?: number;
}
