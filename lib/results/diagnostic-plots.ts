/**
 * What the analysis page draws from a fit's diagnostics, pure: the normal probability
 * plot's scores, and the runs to look at again (flagged), each with why. The numbers
 * plotted (residuals, fitted values, leverages, studentized residuals, Cook's distances)
 * are the fit's own (lib/stats `fitModel` diagnostics); only the plotting positions and
 * the flag rules live here.
 */
import jStat from "jstat";
import type { Diagnostic } from "../stats/fit";

/**
 * Normal scores for a normal probability plot of `values`: the i-th smallest of n gets
 * Φ⁻¹((i − 3/8)/(n + 1/4)) (Blom's plotting positions; Montgomery, Design and Analysis of
 * Experiments, §3.4 on the normal probability plot of residuals; formula from memory).
 * Returns the score of each value in the order given.
 * Example: normalScores([0.1, -0.3, 0.2])[1] < 0
 */
export function normalScores(values: readonly number[]): number[] {
  const n = values.length;
  const order = values.map((v, i) => ({ v, i })).sort((a, b) => a.v - b.v || a.i - b.i);
  const out = new Array<number>(n);
  order.forEach((o, rank) => (out[o.i] = jStat.normal.inv((rank + 1 - 0.375) / (n + 0.25), 0, 1)));
  return out;
}

/** A run the diagnostics point at, and why. */
export interface FlaggedRun {
  run: number;
  index: number;
  reasons: string[];
}

/**
 * Runs worth a second look (common practice, Montgomery §10.7 / Myers, Montgomery &
 * Anderson-Cook §2.7 on regression diagnostics, from memory): an externally scaled
 * residual is not available here, so |studentized residual| > 3 (a likely outlier);
 * leverage above 2p/n (a point far from the others in the design); Cook's distance above
 * 1 (the fit moves much without it).
 */
export function flaggedRuns(diagnostics: readonly Diagnostic[], parameters: number): FlaggedRun[] {
  const n = diagnostics.length;
  const out: FlaggedRun[] = [];
  for (const d of diagnostics) {
    const reasons: string[] = [];
    if (d.studentized !== null && Math.abs(d.studentized) > 3) reasons.push(`studentized residual ${d.studentized.toFixed(2)} (beyond ±3)`);
    if (n > 0 && d.leverage > (2 * parameters) / n && d.leverage < 1 - 1e-9) reasons.push(`leverage ${d.leverage.toFixed(2)} (above 2p/n = ${((2 * parameters) / n).toFixed(2)})`);
    if (d.cooksDistance !== null && d.cooksDistance > 1) reasons.push(`Cook's distance ${d.cooksDistance.toFixed(2)} (above 1)`);
    if (reasons.length) out.push({ run: d.run, index: d.index, reasons });
  }
  return out;
}
