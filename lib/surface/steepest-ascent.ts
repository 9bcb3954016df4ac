/**
 * The path of steepest ascent from a first-order model (Box & Wilson 1951; Montgomery,
 * Design and Analysis of Experiments, §11.2, as in Example 11.1): from the design
 * centre, move in coded units in proportion to the first-order coefficients,
 * Δxᵢ = Δ·bᵢ/|b_base| with the base factor the one with the largest |b| (or the one
 * named) stepping Δ coded units; in natural units each step is Δuᵢ = Δxᵢ·(halfrange
 * of factor i), so the natural steps are proportional to bᵢ times the factor half-ranges.
 * The path stops at the first point outside a factor's limits, breaking a constraint or
 * where a blocking caution fires (the safe envelope), and says which.
 */
import { AppError } from "../errors/app-error";
import { satisfiesAll, type LinearConstraint } from "../doe/constraints";
import { decodeValue } from "../doe/factors";
import { formatNatural } from "../doe/format";
import { naturalRecord, type BlockingCaution, type FactorLimit, type SafetyCheck } from "../doe/safe-envelope";
import type { FittedModel } from "../stats/fitted-model";
import { predictAt } from "../stats/predict";
import { termDegree } from "../stats/model-terms";
import { outsideStudied, studiedRanges } from "./studied-region";

export interface SteepestAscentOptions {
  goal?: "maximize" | "minimize";
  /** The factor that moves `step` coded units per step (default: the largest |coefficient|). */
  baseFactor?: string;
  /** Coded units the base factor moves per step (default 1). */
  step?: number;
  /** Most steps proposed (default 10, 1…50). */
  maxSteps?: number;
  limits?: Record<string, FactorLimit>;
  constraints?: readonly LinearConstraint[];
  safety?: SafetyCheck;
}

export interface PathPoint {
  step: number;
  coded: Record<string, number>;
  natural: Record<string, number>;
  /** The first-order model's prediction (an extrapolation once past the runs). */
  predicted: number;
  extrapolated: boolean;
}

export interface SteepestAscentPath {
  /** Coded step per factor (Δxᵢ). */
  codedStep: Record<string, number>;
  /** Natural step per factor (Δuᵢ = Δxᵢ × half-range; for a log-scale factor, the factor by which it multiplies). */
  naturalStep: Record<string, number>;
  baseFactor: string;
  points: PathPoint[];
  /** Where and why the path stopped before maxSteps; null when it did not. */
  stoppedAt: { step: number; natural: Record<string, number>; reasons: string[]; blocking: BlockingCaution[] } | null;
  warnings: string[];
}

/**
 * The path of steepest ascent (or descent, for `goal: "minimize"`) of a fitted model's
 * first-order part. Throws an invalid-input AppError for an unknown base factor, a bad
 * step count or step, or a model whose first-order coefficients are all zero.
 * Example: steepestAscent(model, { step: 1, maxSteps: 8, safety }).points
 */
export function steepestAscent(model: FittedModel, options: SteepestAscentOptions = {}): SteepestAscentPath {
  const factors = model.factors;
  const k = factors.length;
  const sign = options.goal === "minimize" ? -1 : 1;
  const b = new Array<number>(k).fill(0);
  let higher = false;
  model.terms.forEach((t, j) => {
    const d = termDegree(t);
    if (d === 1) b[t.exponents.findIndex((e) => e === 1)] = sign * model.coefficients[j]!;
    else if (d > 1) higher = true;
  });
  const maxSteps = options.maxSteps ?? 10;
  if (!(Number.isInteger(maxSteps) && maxSteps >= 1 && maxSteps <= 50)) throw AppError.field("maxSteps", "must be a whole number from 1 to 50");
  const step = options.step ?? 1;
  if (!(Number.isFinite(step) && step > 0 && step <= 5)) throw AppError.field("step", "must be a positive number of coded units, at most 5");
  let base = b.reduce((best, v, i) => (Math.abs(v) > Math.abs(b[best]!) ? i : best), 0);
  if (options.baseFactor !== undefined) {
    base = factors.findIndex((f) => f.name === options.baseFactor);
    if (base < 0) throw AppError.field("baseFactor", "is not one of the factors");
  }
  if (b[base] === 0) throw AppError.field(options.baseFactor !== undefined ? "baseFactor" : "model", "has no first-order effect to follow");
  const dx = b.map((v) => (step * v) / Math.abs(b[base]!));
  const names = factors.map((f) => f.name);
  const warnings: string[] = [];
  if (higher) warnings.push("The model has terms above first order: the path follows the first-order coefficients only, the direction of steepest ascent at the centre.");
  const ranges = studiedRanges(model);
  const points: PathPoint[] = [];
  let stoppedAt: SteepestAscentPath["stoppedAt"] = null;
  for (let s = 1; s <= maxSteps; s++) {
    const x = dx.map((v) => s * v);
    const natural = naturalRecord(factors, x);
    const reasons: string[] = [];
    factors.forEach((f) => {
      const lim = options.limits?.[f.name];
      const u = natural[f.name]!;
      if (lim?.max !== undefined && u > lim.max + 1e-9 * (1 + Math.abs(lim.max))) reasons.push(`${f.name} would pass its upper limit of ${lim.max}${f.unit ? ` ${f.unit}` : ""}`);
      if (lim?.min !== undefined && u < lim.min - 1e-9 * (1 + Math.abs(lim.min))) reasons.push(`${f.name} would pass its lower limit of ${lim.min}${f.unit ? ` ${f.unit}` : ""}`);
    });
    if (options.constraints && !satisfiesAll(options.constraints, names.map((n) => natural[n]!))) reasons.push("a constraint would be broken");
    const blocking = reasons.length === 0 && options.safety ? options.safety(natural).blocking : [];
    for (const c of blocking) reasons.push(`${c.code}: ${c.message}`);
    if (reasons.length) {
      stoppedAt = { step: s, natural, reasons, blocking };
      warnings.push(`The path stops before step ${s} (${formatNatural(factors, x)}): ${reasons.join("; ")}.`);
      break;
    }
    points.push({
      step: s,
      coded: Object.fromEntries(names.map((n, i) => [n, x[i]!])),
      natural,
      predicted: predictAt(model, x).predicted,
      extrapolated: outsideStudied(ranges, x).length > 0,
    });
  }
  return {
    codedStep: Object.fromEntries(names.map((n, i) => [n, dx[i]!])),
    naturalStep: Object.fromEntries(
      factors.map((f, i) => [f.name, f.scale === "log" ? decodeValue(f, dx[i]!) / decodeValue(f, 0) : decodeValue(f, dx[i]!) - decodeValue(f, 0)]),
    ),
    baseFactor: names[base]!,
    points,
    stoppedAt,
    warnings,
  };
}
