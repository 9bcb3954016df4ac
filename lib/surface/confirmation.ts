/**
 * Confirmation runs at the optimum: the natural values rounded to what can be set at
 * the bench, checked again against the region, the constraints and the safe envelope
 * after rounding (a rounded point that leaves them moves to the nearest settable point
 * inside), n replicates, and the prediction there with the interval for the mean of
 * the n runs; then the check of the observed results against it.
 *
 * The interval for the mean ȳ₀ of m new runs at x₀ is
 *   ŷ₀ ± t(0.975, df) · s · √(1/m + x₀'(X'X)⁻¹x₀)
 * (Montgomery, Peck & Vining, Introduction to Linear Regression Analysis, §3.5,
 * prediction of new observations — the mean of m future observations; section from
 * memory). The confirmation holds when the observed mean lies inside it (Montgomery,
 * Design and Analysis of Experiments, on confirmation runs: the observed value should
 * fall within the prediction interval at the chosen conditions; from memory).
 */
import { AppError } from "../errors/app-error";
import { satisfiesAll, type LinearConstraint } from "../doe/constraints";
import { codeValue, type Factor } from "../doe/factors";
import type { BlockingCaution, SafetyCheck } from "../doe/safe-envelope";
import { tQuantile } from "../stats/distributions";
import type { FittedModel } from "../stats/fitted-model";
import { modelRow } from "../stats/model-terms";
import { rowPrediction } from "../stats/predict";
import { formatFactorValue, formatNumber as fmt } from "../doe/format";
import { inRegion, type Region } from "./solvers";

/**
 * Default settable steps by factor unit (PRODUCT.md): 1 °C, 0.05 equiv, 0.1 mol %,
 * 0.5 h (and 30 min, 1 K, 1 °F). A factor with another unit is not rounded unless a
 * step is given.
 */
export const DEFAULT_SETTABLE_STEPS: Readonly<Record<string, number>> = {
  degC: 1,
  "°C": 1,
  C: 1,
  K: 1,
  degF: 1,
  "°F": 1,
  equiv: 0.05,
  eq: 0.05,
  equivalents: 0.05,
  "mol%": 0.1,
  "mol %": 0.1,
  h: 0.5,
  hr: 0.5,
  hour: 0.5,
  hours: 0.5,
  min: 30,
};

export interface ConfirmationOptions {
  /** Replicate runs at the point (default 3, 1…50). */
  replicates?: number;
  /** Settable step per factor name (natural units), overriding the defaults by unit; 0 = no rounding. */
  steps?: Record<string, number>;
  /** Where the point must stay (coded): default the cube [−1, 1]^k. */
  region?: Region;
  constraints?: readonly LinearConstraint[];
  safety?: SafetyCheck;
}

/** The interval a confirmation is judged by: ŷ₀ ± t·s·√(1/m + x₀'(X'X)⁻¹x₀), original scale. */
export interface MeanPrediction {
  predicted: number;
  replicates: number;
  /** Null without residual degrees of freedom. */
  interval95: [number, number] | null;
}

export interface ConfirmationPlan {
  /** The settable point: natural values by name, and coded. */
  natural: Record<string, number>;
  coded: Record<string, number>;
  /** The step each factor was rounded to (null: not rounded). */
  steps: Record<string, number | null>;
  /** True when plain rounding left the region, a constraint or the envelope and the point was moved. */
  moved: boolean;
  /** What the plainly rounded point broke, when it was moved. */
  movedBecause: string[];
  /** The runs to make (replicates of the point). */
  runs: { kind: "confirmation"; replicate: number; natural: Record<string, number>; coded: Record<string, number> }[];
  /** Prediction for a single new run there, with its 95 % prediction interval. */
  predicted: number;
  pi95: [number, number] | null;
  /** The interval for the mean of the replicates. */
  mean: MeanPrediction;
  warnings: string[];
}

/** x₀'(X'X)⁻¹x₀ at a coded point, and the prediction there (model scale). */
function leverageAt(model: FittedModel, x: readonly number[]): { yhat: number; q: number } {
  return rowPrediction(model.coefficients, model.covUnscaled, modelRow(model.terms, x));
}

/**
 * The prediction interval for the mean of `replicates` new runs at coded point x
 * (Montgomery, Peck & Vining §3.5): ŷ₀ ± t(0.975, df)·s·√(1/m + x₀'(X'X)⁻¹x₀), on the
 * model scale and transformed back (for ln y, an interval for the geometric mean).
 * Throws RangeError for replicates < 1.
 */
export function predictMeanOf(model: FittedModel, x: readonly number[], replicates: number): MeanPrediction {
  if (!(Number.isInteger(replicates) && replicates >= 1)) throw new RangeError("replicates must be a positive integer");
  const back = (v: number) => (model.transform === "ln" ? Math.exp(v) : v);
  const { yhat, q } = leverageAt(model, x);
  if (model.s2 === null || model.dfResidual <= 0) return { predicted: back(yhat), replicates, interval95: null };
  const half = tQuantile(0.975, model.dfResidual) * Math.sqrt(model.s2 * (1 / replicates + q));
  return { predicted: back(yhat), replicates, interval95: [back(yhat - half), back(yhat + half)] };
}

function roundTo(v: number, step: number): number {
  const r = Math.round(v / step) * step;
  const decimals = Math.max(0, Math.ceil(-Math.log10(step) + 1e-9));
  return Number(r.toFixed(Math.min(decimals + 1, 12)));
}

function stepOf(f: Factor, given: Record<string, number> | undefined): number | null {
  const s = given?.[f.name] ?? (f.unit !== undefined ? DEFAULT_SETTABLE_STEPS[f.unit.trim()] : undefined);
  return s !== undefined && s > 0 ? s : null;
}

/**
 * Plans confirmation runs at an optimum (natural values by factor name): rounds each
 * factor to its settable step, checks the rounded point against the region, the
 * constraints and the safety check, and when it fails moves to the nearest settable
 * point (lattice neighbours in order of coded distance from the optimum, up to three
 * steps away while that is at most 100 000 points) that passes all three; then
 * `replicates` runs there with the predictions. Throws an
 * invalid-input AppError for a missing factor or a bad step (path `steps.<name>`), and
 * an "infeasible" AppError when no settable point within three steps is inside.
 * Example: planConfirmation(model, optimum.natural, { replicates: 3, safety })
 */
export function planConfirmation(model: FittedModel, optimum: Record<string, number>, options: ConfirmationOptions = {}): ConfirmationPlan {
  const factors = model.factors;
  const k = factors.length;
  const replicates = options.replicates ?? 3;
  if (!(Number.isInteger(replicates) && replicates >= 1 && replicates <= 50)) throw AppError.field("replicates", "must be a whole number from 1 to 50");
  for (const [name, s] of Object.entries(options.steps ?? {})) {
    if (!factors.some((f) => f.name === name)) throw AppError.field(`steps.${name}`, "is not one of the factors");
    if (!(Number.isFinite(s) && s >= 0)) throw AppError.field(`steps.${name}`, "must be zero (no rounding) or a positive step");
  }
  const target = factors.map((f) => {
    const v = optimum[f.name];
    if (v === undefined || !Number.isFinite(v)) throw AppError.field(`optimum.${f.name}`, "is missing");
    return v;
  });
  const steps = factors.map((f) => stepOf(f, options.steps));
  const region: Region = options.region ?? { kind: "cube", radius: 1, halfSpaces: [] };
  const constraints = options.constraints ?? [];
  const codedOf = (u: readonly number[]) => factors.map((f, i) => codeValue(f, u[i]!));
  const problems = (u: readonly number[]): { what: string[]; blocking: BlockingCaution[] } => {
    const what: string[] = [];
    if (factors.some((f, i) => f.scale === "log" && !(u[i]! > 0))) return { what: ["a log-scale factor is not positive"], blocking: [] };
    if (!inRegion(region, codedOf(u), 1e-9)) what.push("outside the studied region");
    if (!satisfiesAll(constraints, u)) what.push("breaks a constraint");
    let blocking: BlockingCaution[] = [];
    if (what.length === 0 && options.safety) {
      blocking = options.safety(Object.fromEntries(factors.map((f, i) => [f.name, u[i]!]))).blocking;
      for (const c of blocking) what.push(`${c.code}: ${c.message}`);
    }
    return { what, blocking };
  };
  const rounded = target.map((v, i) => (steps[i] === null ? v : roundTo(v, steps[i]!)));
  let point = rounded;
  const first = problems(rounded);
  const movedBecause = first.what;
  if (first.what.length > 0) {
    // Lattice neighbours of the optimum, nearest first (coded distance), rings of 1–3 steps.
    const base = target.map((v, i) => (steps[i] === null ? v : Math.floor(v / steps[i]!) * steps[i]!));
    const half = factors.map((f) => (f.scale === "log" ? 1 : (f.high - f.low) / 2));
    let found: number[] | null = null;
    const tried = new Set<string>();
    const roundedCount = steps.filter((st) => st !== null).length;
    for (let ring = 1; ring <= 3 && !found && (2 * ring) ** roundedCount <= 100_000; ring++) {
      let offsets: number[][] = [[]];
      for (let i = 0; i < k; i++) {
        const choices = steps[i] === null ? [0] : Array.from({ length: 2 * ring }, (_, j) => j - ring + 1);
        offsets = offsets.flatMap((o) => choices.map((c) => [...o, c]));
      }
      const cands = offsets
        .map((o) => base.map((b, i) => (steps[i] === null ? b : roundTo(b + o[i]! * steps[i]!, steps[i]!))))
        .filter((u) => {
          const key = u.join(",");
          if (tried.has(key)) return false;
          tried.add(key);
          return true;
        })
        .map((u) => ({ u, d: u.reduce((s, v, i) => s + ((v - target[i]!) / half[i]!) ** 2, 0) }))
        .sort((a, b) => a.d - b.d);
      for (const c of cands) {
        if (problems(c.u).what.length === 0) {
          found = c.u;
          break;
        }
      }
    }
    if (!found) {
      throw new AppError("infeasible", "No settable point near the optimum is inside the region, the constraints and the safe envelope.", [
        { path: "optimum", message: `rounded to settable values it is ${first.what.join("; ")}, and so is every settable point within three steps` },
      ]);
    }
    point = found;
  }
  const coded = codedOf(point);
  const natural = Object.fromEntries(factors.map((f, i) => [f.name, point[i]!]));
  const codedRec = Object.fromEntries(factors.map((f, i) => [f.name, coded[i]!]));
  const back = (v: number) => (model.transform === "ln" ? Math.exp(v) : v);
  const { yhat, q } = leverageAt(model, coded);
  const pi95: [number, number] | null =
    model.s2 !== null && model.dfResidual > 0
      ? (() => {
          const h = tQuantile(0.975, model.dfResidual) * Math.sqrt(model.s2! * (1 + q));
          return [back(yhat - h), back(yhat + h)];
        })()
      : null;
  const warnings: string[] = [];
  if (movedBecause.length) {
    warnings.push(
      `Rounded to settable values (${factors.map((f, i) => formatFactorValue(f, rounded[i]!)).join(", ")}) the optimum is ${movedBecause.join("; ")}: the runs use the nearest settable point inside, ${factors.map((f, i) => formatFactorValue(f, point[i]!)).join(", ")}.`,
    );
  }
  factors.forEach((f, i) => {
    if (steps[i] === null) warnings.push(`${f.name} is not rounded: no settable step is known for its unit${f.unit ? ` (${f.unit})` : ""}.`);
  });
  return {
    natural,
    coded: codedRec,
    steps: Object.fromEntries(factors.map((f, i) => [f.name, steps[i]!])),
    moved: movedBecause.length > 0,
    movedBecause,
    runs: Array.from({ length: replicates }, (_, r) => ({ kind: "confirmation" as const, replicate: r + 1, natural: { ...natural }, coded: { ...codedRec } })),
    predicted: back(yhat),
    pi95,
    mean: predictMeanOf(model, coded, replicates),
    warnings,
  };
}

/** The verdict on observed confirmation results. */
export interface ConfirmationVerdict {
  /** Observed mean (for ln y: the geometric mean), original scale. */
  observedMean: number;
  observed: number;
  predicted: number;
  interval95: [number, number] | null;
  /** Null when there is no interval (no residual degrees of freedom). */
  holds: boolean | null;
  message: string;
}

/**
 * Whether observed confirmation results hold: their mean lies inside the 95 %
 * interval for the mean of that many new runs at the point (Montgomery, Peck & Vining
 * §3.5; m = the number of results given, so a failed replicate narrows nothing it
 * should not). Throws an invalid-input AppError (path `observed`) for no results or a
 * non-positive result under the ln transform.
 * Example: confirmationHolds(model, plan.coded, [81.2, 80.4, 82.0]).holds
 */
export function confirmationHolds(model: FittedModel, coded: Record<string, number>, observed: readonly number[]): ConfirmationVerdict {
  if (observed.length === 0) throw AppError.field("observed", "give at least one result");
  observed.forEach((v, i) => {
    if (!Number.isFinite(v)) throw AppError.field(`observed.${i}`, "must be a number");
    if (model.transform === "ln" && !(v > 0)) throw AppError.field(`observed.${i}`, "must be positive for a model of ln y");
  });
  const x = model.factors.map((f) => {
    const v = coded[f.name];
    if (v === undefined) throw AppError.field(`coded.${f.name}`, "is missing");
    return v;
  });
  const m = observed.length;
  const mean = model.transform === "ln" ? Math.exp(observed.reduce((s, v) => s + Math.log(v), 0) / m) : observed.reduce((s, v) => s + v, 0) / m;
  const pr = predictMeanOf(model, x, m);
  if (!pr.interval95) {
    return { observedMean: mean, observed: m, predicted: pr.predicted, interval95: null, holds: null, message: "The model has no residual degrees of freedom, so there is no interval to judge the confirmation by." };
  }
  const [lo, hi] = pr.interval95;
  const holds = mean >= lo && mean <= hi;
  const message = holds
    ? `The confirmation holds: the mean of ${m} run${m > 1 ? "s" : ""}, ${fmt(mean)}, lies inside the 95 % interval ${fmt(lo)} to ${fmt(hi)} around the predicted ${fmt(pr.predicted)}.`
    : `The confirmation does not hold: the mean of ${m} run${m > 1 ? "s" : ""}, ${fmt(mean)}, lies ${mean < lo ? "below" : "above"} the 95 % interval ${fmt(lo)} to ${fmt(hi)} around the predicted ${fmt(pr.predicted)}. The model may not describe the process there.`;
  return { observedMean: mean, observed: m, predicted: pr.predicted, interval95: pr.interval95, holds, message };
}
