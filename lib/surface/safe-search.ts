/**
 * Maximising inside the region (cube or ball, with half-spaces) and a feasibility
 * callback that can only be evaluated, not described (the safe envelope): a
 * multi-start feasible-direction method. Starting points are the feasible ones among
 * the design points and a random sample of the region; from the best, projected
 * gradient ascent (lib/surface/solvers.ts, Armijo backtracking) treats an infeasible
 * trial point like a failed sufficient-increase test and halves the step, and a
 * compass search then slides along the envelope's edge (Kolda, Lewis & Torczon,
 * "Optimization by direct search", SIAM Review 45, 2003, on pattern search with
 * constraints handled by rejecting infeasible points — the "extreme barrier"). Every
 * point returned has been evaluated by the callback and found feasible.
 */
import type { Rng } from "../doe/randomize";
import { inRegion, patternSearch, projectOntoRegion, rankedStarts, type Objective, type Region } from "./solvers";

export interface SafeSearchOptions {
  /** Random points sampled in the region for starts (default 400). */
  samples?: number;
  /** Starts refined (default 8). */
  starts?: number;
  /** At most this many feasibility calls in all (default 20 000). */
  maxChecks?: number;
}

export interface SafeSearchResult {
  x: number[];
  value: number;
  /** Feasibility calls made. */
  checks: number;
  /** True when the budget of calls ran out before the search finished. */
  budgetSpent: boolean;
}

/**
 * Maximises `obj` over the points of `region` where `feasible` holds. Throws
 * RangeError("no feasible point") when no sampled point is feasible.
 */
export function maximizeWithFeasibility(
  obj: Objective,
  region: Region,
  feasible: (x: readonly number[]) => boolean,
  seeds: readonly (readonly number[])[],
  rng: Rng,
  options: SafeSearchOptions = {},
): SafeSearchResult {
  const samples = options.samples ?? 400;
  const nStarts = options.starts ?? 8;
  const maxChecks = options.maxChecks ?? 20_000;
  let checks = 0;
  const ok = (x: readonly number[]) => {
    if (checks >= maxChecks) return false;
    checks++;
    return feasible(x);
  };
  const { pool, starts } = rankedStarts(obj, region, seeds, rng, { samples, starts: nStarts, minDistance2: 1e-4, accept: ok });
  if (pool.length === 0) throw new RangeError("no feasible point");
  let best = { x: pool[0]!.x, value: pool[0]!.v };
  for (const s of starts) {
    const a = feasibleAscent(obj, region, ok, s);
    if (a.value > best.value) best = a;
  }
  const polished = feasibleCompass(obj, region, ok, best.x, best.value);
  if (polished.value > best.value) best = polished;
  return { x: best.x, value: best.value, checks, budgetSpent: checks >= maxChecks };
}

function gradient(obj: Objective, x: readonly number[]): number[] {
  if (obj.grad) return obj.grad(x);
  const h = 1e-6;
  return x.map((_, i) => {
    const a = [...x];
    const b = [...x];
    a[i]! += h;
    b[i]! -= h;
    return (obj.f(a) - obj.f(b)) / (2 * h);
  });
}

/** Projected gradient ascent that rejects infeasible trial points (the step halves). */
function feasibleAscent(obj: Objective, region: Region, ok: (x: readonly number[]) => boolean, start: readonly number[], maxIter = 120): { x: number[]; value: number } {
  let x = [...start];
  let fx = obj.f(x);
  let step = 0.5;
  for (let it = 0; it < maxIter; it++) {
    const g = gradient(obj, x);
    let accepted = false;
    for (let bt = 0; bt < 30; bt++) {
      const y = projectOntoRegion(region, x.map((v, i) => v + step * g[i]!));
      if (!y) break;
      const d2 = y.reduce((s, v, i) => s + (v - x[i]!) ** 2, 0);
      if (d2 < 1e-22) break;
      const fy = obj.f(y);
      if (fy >= fx + (1e-4 / step) * d2 && ok(y)) {
        const gain = fy - fx;
        x = y;
        fx = fy;
        accepted = true;
        step = Math.min(step * 2, 1e3);
        if (gain < 1e-13 * (1 + Math.abs(fx))) return { x, value: fx };
        break;
      }
      step /= 2;
    }
    if (!accepted) break;
  }
  return { x, value: fx };
}

/** Compass search polish over feasible points only (infeasible trial points count as no better). */
function feasibleCompass(obj: Objective, region: Region, ok: (x: readonly number[]) => boolean, start: readonly number[], f0: number, initial = 0.05, minStep = 1e-6): { x: number[]; value: number } {
  return patternSearch(obj, start, f0, { admit: (y) => (inRegion(region, y) ? y : null), accept: ok, initial, minStep });
}
