/**
 * The studied region of a fitted model: the range of the runs in each factor (coded
 * units). A point outside it is an extrapolation of the model — for a central
 * composite design that range includes the axial points. One rule, used by the grid,
 * the optimum and the confirmation plan.
 */
import type { FittedModel } from "../stats/fitted-model";

/** Coded tolerance below which a point on the edge still counts as inside. */
const EDGE_TOLERANCE = 1e-9;

/** The lowest and highest coded value of each factor over the runs of the fit. */
export function studiedRanges(model: FittedModel): { lo: number; hi: number }[] {
  return model.factors.map((_, i) => {
    let lo = Infinity;
    let hi = -Infinity;
    for (const r of model.codedRuns) {
      lo = Math.min(lo, r[i]!);
      hi = Math.max(hi, r[i]!);
    }
    return { lo, hi };
  });
}

/** The factors (indices) whose coded value at x lies outside the studied range. */
export function outsideStudied(ranges: readonly { lo: number; hi: number }[], x: ArrayLike<number>): number[] {
  const out: number[] = [];
  ranges.forEach((r, i) => {
    if (x[i]! < r.lo - EDGE_TOLERANCE || x[i]! > r.hi + EDGE_TOLERANCE) out.push(i);
  });
  return out;
}
