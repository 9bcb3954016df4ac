/**
 * The parts of the analysis of variance that do not need the fit: pure error from
 * replicated points, for the lack-of-fit test (Montgomery, Design and Analysis of
 * Experiments, ch. 11, as in Example 11.2) and the curvature test of a two-level design with centre
 * points (Montgomery §6.8).
 */
import { fUpperP } from "./distributions";

/** The single-degree-of-freedom curvature test (CONTRACT.md `fit` output, `curvature`). */
export interface CurvatureTest {
  ss: number;
  df: 1;
  f: number | null;
  p: number | null;
  meanFactorial: number;
  meanCenter: number;
  nFactorial: number;
  nCenter: number;
}

/** Groups identical design points (coded values equal to 1e-9, and the same block when given): sorts rows, then scans. */
function groupPoints(X: readonly number[][], blockOf?: readonly number[]): number[][] {
  const idx = X.map((_, i) => i);
  const k = X[0]?.length ?? 0;
  const cmp = (a: number, b: number) => {
    if (blockOf && blockOf[a] !== blockOf[b]) return blockOf[a]! - blockOf[b]!;
    for (let j = 0; j < k; j++) {
      const d = X[a]![j]! - X[b]![j]!;
      if (Math.abs(d) > 1e-9) return d;
    }
    return 0;
  };
  idx.sort(cmp);
  const groups: number[][] = [];
  for (const i of idx) {
    const last = groups[groups.length - 1];
    if (last && cmp(last[0]!, i) === 0) last.push(i);
    else groups.push([i]);
  }
  return groups;
}

/**
 * Pure-error sum of squares from replicated points: Σ over groups of Σ(y − ȳ_g)², df =
 * n − groups. With `blockOf`, replicates count only within a block (a block shifts
 * every run in it, so runs in different blocks are not pure replicates).
 */
export function pureError(X: readonly number[][], y: readonly number[], blockOf?: readonly number[]): { ss: number; df: number; groups: number } {
  const groups = groupPoints(X, blockOf);
  let ss = 0;
  for (const g of groups) {
    const m = g.reduce((a, i) => a + y[i]!, 0) / g.length;
    for (const i of g) ss += (y[i]! - m) ** 2;
  }
  return { ss, df: X.length - groups.length, groups: groups.length };
}

/**
 * Curvature test of a two-level design with centre points (Montgomery §6.8):
 * SS = n_F·n_C·(ȳ_F − ȳ_C)²/(n_F + n_C) on 1 df, against the pure error of the centre
 * points (df n_C − 1). Null without factorial (all ±1) points or without centre points.
 */
export function curvatureTest(X: readonly number[][], y: readonly number[]): CurvatureTest | null {
  const fac: number[] = [];
  const cen: number[] = [];
  X.forEach((x, i) => {
    if (x.every((v) => Math.abs(Math.abs(v) - 1) < 1e-9)) fac.push(y[i]!);
    else if (x.every((v) => Math.abs(v) < 1e-9)) cen.push(y[i]!);
  });
  if (fac.length === 0 || cen.length === 0) return null;
  const mF = fac.reduce((a, b) => a + b, 0) / fac.length;
  const mC = cen.reduce((a, b) => a + b, 0) / cen.length;
  const ss = (fac.length * cen.length * (mF - mC) ** 2) / (fac.length + cen.length);
  let f: number | null = null;
  let p: number | null = null;
  if (cen.length >= 2) {
    const msPe = cen.reduce((a, v) => a + (v - mC) ** 2, 0) / (cen.length - 1);
    if (msPe > 0) {
      f = ss / msPe;
      p = fUpperP(f, 1, cen.length - 1);
    }
  }
  return { ss, df: 1, f, p, meanFactorial: mF, meanCenter: mC, nFactorial: fac.length, nCenter: cen.length };
}

