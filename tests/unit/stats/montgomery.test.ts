import { describe, expect, it } from "vitest";
import { fitModel } from "../../../lib/stats";
import { fitResponseSurface } from "../../../lib/surface";
import { EX112, F4, RUNS62 as runs62 } from "./montgomery-data";

// Montgomery, Design and Analysis of Experiments, Example 6.2 (unreplicated 2^4,
// filtration rate), REFERENCE.md §6 [V]: data in montgomery-data.ts.
const ALL15 = ["A", "B", "C", "D", "A*B", "A*C", "A*D", "B*C", "B*D", "C*D", "A*B*C", "A*B*D", "A*C*D", "B*C*D", "A*B*C*D"];

describe("Montgomery Example 6.2 (2^4 filtration rate)", () => {
  it("gives the published effects (effect = 2 × coded coefficient)", () => {
    const out = fitModel({ factors: F4, runs: runs62, model: ALL15 });
    const effect = (t: string) => 2 * out.terms.find((x) => x.term === t)!.estimate;
    // Montgomery Example 6.2 effect estimates (REFERENCE.md §6, [V]); exact to 3 decimals.
    expect(effect("A")).toBeCloseTo(21.625, 9);
    expect(effect("B")).toBeCloseTo(3.125, 9);
    expect(effect("C")).toBeCloseTo(9.875, 9);
    expect(effect("D")).toBeCloseTo(14.625, 9);
    expect(effect("A*C")).toBeCloseTo(-18.125, 9);
    expect(effect("A*D")).toBeCloseTo(16.625, 9);
    // Saturated: no residual degrees of freedom, so no standard errors (not garbage numbers).
    expect(out.stats.dfResidual).toBe(0);
    expect(out.terms[1]!.stdError).toBeNull();
  });
  it("gives the reduced model's coefficients, SSE 195.125 on 10 df and R² 0.9660", () => {
    const out = fitModel({ factors: F4, runs: runs62, model: ["A", "C", "D", "A*C", "A*D"] });
    const b = Object.fromEntries(out.terms.map((t) => [t.term, t.estimate]));
    // Montgomery Example 6.2 reduced model (REFERENCE.md §6, [V]).
    expect(b.intercept).toBeCloseTo(70.0625, 9);
    expect(b.A).toBeCloseTo(10.8125, 9);
    expect(b.C).toBeCloseTo(4.9375, 9);
    expect(b.D).toBeCloseTo(7.3125, 9);
    expect(b["A*C"]).toBeCloseTo(-9.0625, 9);
    expect(b["A*D"]).toBeCloseTo(8.3125, 9);
    expect(out.anova.residual.ss).toBeCloseTo(195.125, 8);
    expect(out.anova.residual.df).toBe(10);
    expect(out.stats.r2!).toBeCloseTo(0.966, 3);
    expect(out.anova.lackOfFit).toBeNull(); // no replicated points
    expect(out.anova.pureError).toBeNull();
  });
  it("backward elimination from the two-factor-interaction model keeps A, C, D, AC, AD", () => {
    // Expected terms from Montgomery Example 6.2's reduced model; hierarchy keeps A with AC, AD.
    const out = fitModel({ factors: F4, runs: runs62, model: "interaction", prune: { alpha: 0.05, hierarchy: true } });
    expect(out.terms.map((t) => t.term)).toEqual(["intercept", "A", "C", "D", "A*C", "A*D"]);
    expect(out.dropped.sort()).toEqual(["A*B", "B", "B*C", "B*D", "C*D"]);
  });
});

describe("Montgomery Example 11.2 (central composite, k = 2)", () => {
  const out = fitResponseSurface({ ...EX112, model: "quadratic" }).output;
  const b = Object.fromEntries(out.terms.map((t) => [t.term, t.estimate]));
  it("gives the full quadratic's coefficients", () => {
    // REFERENCE.md §6 [C]: ŷ = 79.940 + 0.9950x1 + 0.5152x2 − 1.3763x1² − 1.0013x2² + 0.2500x1x2
    expect(b.intercept).toBeCloseTo(79.94, 3);
    expect(b.x1).toBeCloseTo(0.995, 4);
    expect(b.x2).toBeCloseTo(0.5152, 4);
    // The square terms' exact values are −1101/800 = −1.37625 and −801/800 = −1.00125 (by the
    // design's symmetry the intercept, squares and x1x2 decouple from x1 and x2; their normal
    // equations solved in rational arithmetic): REFERENCE.md's −1.3763 and −1.0013 are these
    // rounded half up, exactly on the rounding boundary, so they are checked unrounded.
    expect(b["x1^2"]).toBeCloseTo(-1101 / 800, 12);
    expect(b["x2^2"]).toBeCloseTo(-801 / 800, 12);
    expect(b["x1*x2"]).toBeCloseTo(0.25, 4);
  });
  it("gives lack of fit 0.2833 on 3 df against pure error 0.2120 on 4 df, and R² 0.9828", () => {
    expect(out.anova.lackOfFit!.ss).toBeCloseTo(0.2833, 4);
    expect(out.anova.lackOfFit!.df).toBe(3);
    expect(out.anova.pureError!.ss).toBeCloseTo(0.212, 4);
    expect(out.anova.pureError!.df).toBe(4);
    expect(out.stats.r2!).toBeCloseTo(0.9828, 4);
    // The ANOVA adds up (computed in this test): SS_model + SS_residual = SS_total.
    expect(out.anova.model.ss + out.anova.residual.ss).toBeCloseTo(out.anova.total.ss, 10);
  });
  it("finds the stationary point (0.389, 0.306) with ŷ 80.21, a maximum", () => {
    const sp = out.canonical!.stationaryPoint!.coded;
    expect(sp.x1).toBeCloseTo(0.389, 3);
    expect(sp.x2).toBeCloseTo(0.306, 3);
    expect(out.canonical!.predicted!).toBeCloseTo(80.21, 2);
    expect(out.canonical!.kind).toBe("maximum");
    expect(out.canonical!.eigenvalues.every((l) => l < 0)).toBe(true);
  });
});
