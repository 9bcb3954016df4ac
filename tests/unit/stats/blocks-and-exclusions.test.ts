import { describe, expect, it } from "vitest";
import { Matrix, SVD, inverse } from "ml-matrix";
import { fitModel, fitModelWithPredictor, predictAt } from "../../../lib/stats";
import { AppError } from "../../../lib/errors/app-error";
import { EX112 } from "./montgomery-data";

/** Least squares by SVD on an explicit matrix (ml-matrix), independent of the engine's QR and coding. */
function svdFit(rows: number[][], y: number[]) {
  const X = new Matrix(rows);
  const b = new SVD(X).solve(Matrix.columnVector(y)).getColumn(0);
  const fitted = X.mmul(Matrix.columnVector(b)).getColumn(0);
  const rss = y.reduce((s, v, i) => s + (v - fitted[i]!) ** 2, 0);
  const C = inverse(X.transpose().mmul(X));
  return { b, rss, C };
}

// Montgomery Example 11.2's CCD (REFERENCE.md §6 [V*]) analysed as two plans: the
// factorial plan (4 factorial runs + the first 3 centre runs) and its augmentation (4
// axial runs + the last 2 centre runs). No published blocked analysis of these data is
// used: the reference is computed in this test by SVD least squares on the explicit
// sum-to-zero dummy-coded matrix [1, block, x1, x2, x1x2, x1², x2²].
describe("several plans analysed together with a block term", () => {
  const blockOf = (i: number) => (i < 7 ? "factorial plan" : "axial plan");
  const runs = EX112.runs.map((r, i) => ({ ...r, block: blockOf(i) }));
  const { output: out, model } = fitModelWithPredictor({ factors: EX112.factors, runs, model: "quadratic" });
  const y = EX112.runs.map((r) => r.response);
  const rows = EX112.runs.map((r, i) => {
    const [a, b] = [r.coded.x1, r.coded.x2];
    return [1, blockOf(i) === "factorial plan" ? 1 : -1, a, b, a * b, a * a, b * b];
  });
  const ref = svdFit(rows, y);
  const s2 = ref.rss / (13 - 7);

  it("gives the coefficients and standard errors of the explicit dummy-coded fit", () => {
    const b = Object.fromEntries(out.terms.map((t) => [t.term, t]));
    const order = ["intercept", "x1", "x2", "x1*x2", "x1^2", "x2^2"];
    const refIdx = [0, 2, 3, 4, 5, 6];
    order.forEach((t, k) => {
      expect(b[t]!.estimate).toBeCloseTo(ref.b[refIdx[k]!]!, 10);
      expect(b[t]!.stdError!).toBeCloseTo(Math.sqrt(s2 * ref.C.get(refIdx[k]!, refIdx[k]!)), 10);
    });
    expect(out.stats.p).toBe(7);
    expect(out.stats.dfResidual).toBe(6);
    expect(out.anova.residual.ss).toBeCloseTo(ref.rss, 10);
  });
  it("shows the block row: SS between blocks on 1 df, blocks entered first; the rows add up to the total", () => {
    const mean = y.reduce((a, v) => a + v, 0) / 13;
    const sst = y.reduce((a, v) => a + (v - mean) ** 2, 0);
    const onlyBlocks = svdFit(rows.map((r) => r.slice(0, 2)), y);
    expect(out.anova.blocks!.df).toBe(1);
    expect(out.anova.blocks!.ss).toBeCloseTo(sst - onlyBlocks.rss, 10);
    expect(out.anova.blocks!.ss + out.anova.model.ss + out.anova.residual.ss).toBeCloseTo(out.anova.total.ss, 10);
    expect(out.anova.model.df).toBe(5);
    // R² on the variation left after the blocks (documented in docs/design-and-analysis.md).
    expect(out.stats.r2!).toBeCloseTo(out.anova.model.ss / (out.anova.model.ss + out.anova.residual.ss), 12);
  });
  it("reports the block effects in sum-to-zero coding: they add to zero, the first is the block column's coefficient", () => {
    const [f, a] = out.blocks!.effects;
    expect(out.blocks!.coding).toBe("sum-to-zero");
    expect(f!.label).toBe("factorial plan");
    expect(f!.runs).toBe(7);
    expect(a!.runs).toBe(6);
    expect(f!.effect).toBeCloseTo(ref.b[1]!, 10);
    expect(f!.effect + a!.effect).toBeCloseTo(0, 12);
    expect(a!.stdError!).toBeCloseTo(Math.sqrt(s2 * ref.C.get(1, 1)), 10);
  });
  it("pure error counts replicates within a block only: (3 − 1) + (2 − 1) = 3 df", () => {
    expect(out.anova.pureError!.df).toBe(3);
    const pe = (ys: number[]) => {
      const m = ys.reduce((s, v) => s + v, 0) / ys.length;
      return ys.reduce((s, v) => s + (v - m) ** 2, 0);
    };
    expect(out.anova.pureError!.ss).toBeCloseTo(pe([79.9, 80.3, 80.0]) + pe([79.7, 79.8]), 12);
    expect(out.anova.lackOfFit!.df).toBe(3);
  });
  it("predicts with the blocks averaged out: the surface is the same under treatment coding except the intercept, which is the mean of the block intercepts", () => {
    const treat = svdFit(rows.map((r) => [1, r[1] === 1 ? 1 : 0, ...r.slice(2)]), y);
    // Treatment coding (block 'axial' as reference): block intercepts treat.b0 + treat.b1 and treat.b0.
    const average = treat.b[0]! + treat.b[1]! / 2;
    expect(predictAt(model, [0, 0]).predicted).toBeCloseTo(average, 10);
    for (let k = 2; k < 7; k++) expect(model.coefficients[k - 1]!).toBeCloseTo(treat.b[k]!, 10);
    expect(model.blocks).toEqual(["factorial plan", "axial plan"]);
    // The surface terms' (X'X)⁻¹ block gives the prediction variance at the centre.
    expect(predictAt(model, [0, 0]).stdError!).toBeCloseTo(Math.sqrt(s2 * ref.C.get(0, 0)), 10);
    expect(out.curvature).toBeNull();
  });
  it("asks for a block on every run or on none, naming the run", () => {
    const bad = runs.map((r, i) => (i === 3 ? { coded: r.coded, response: r.response } : r));
    try {
      fitModel({ factors: EX112.factors, runs: bad, model: "quadratic" });
      expect.unreachable();
    } catch (e) {
      expect((e as AppError).issues.map((x) => x.path)).toEqual(["runs.3.block"]);
    }
  });
});

describe("leaving runs out", () => {
  const exclude = [
    { index: 2, reason: "vial cap split" },
    { index: 10, reason: "wrong base added" },
  ];
  const out = fitModel({ ...EX112, model: "quadratic", exclude });
  const kept = EX112.runs.filter((_, i) => i !== 2 && i !== 10);
  const direct = fitModel({ ...EX112, runs: kept, model: "quadratic" });

  it("is exactly the fit on the n − k runs that remain (computed in this test)", () => {
    out.terms.forEach((t, j) => {
      expect(t.estimate).toBeCloseTo(direct.terms[j]!.estimate, 12);
      expect(t.stdError!).toBeCloseTo(direct.terms[j]!.stdError!, 12);
    });
    expect(out.stats).toEqual(direct.stats);
    expect(out.anova).toEqual(direct.anova);
  });
  it("keeps each remaining run's own number in the diagnostics", () => {
    expect(out.diagnostics.map((d) => d.run)).toEqual([1, 2, 4, 5, 6, 7, 8, 9, 10, 12, 13]);
    expect(out.diagnostics.map((d) => d.residual)).toEqual(direct.diagnostics.map((d) => d.residual));
  });
  it("carries the reason through, with the observed value and the model's prediction and PI there", () => {
    const { model } = fitModelWithPredictor({ ...EX112, runs: kept, model: "quadratic" });
    out.excluded.forEach((e, k) => {
      const i = exclude[k]!.index;
      const pr = predictAt(model, [EX112.runs[i]!.coded.x1, EX112.runs[i]!.coded.x2]);
      expect(e).toEqual({ index: i, run: i + 1, reason: exclude[k]!.reason, observed: EX112.runs[i]!.response, predicted: pr.predicted, pi95: pr.pi95 });
    });
  });
  it("accepts a failed run without a response when it is left out, and names it when it is not", () => {
    const failed = EX112.runs.map((r, i) => (i === 4 ? { coded: r.coded } : r));
    const o = fitModel({ ...EX112, runs: failed, model: "quadratic", exclude: [{ index: 4, reason: "failed: no product" }] });
    expect(o.excluded[0]!.observed).toBeNull();
    expect(o.stats.n).toBe(12);
    try {
      fitModel({ ...EX112, runs: failed, model: "quadratic" });
      expect.unreachable();
    } catch (e) {
      expect((e as AppError).issues.map((x) => x.path)).toEqual(["runs.4.response"]);
    }
  });
  it("names bad exclusions: an index past the runs, a repeat, a missing reason; too few runs left at `exclude`", () => {
    const paths = (ex: unknown) => {
      try {
        fitModel({ ...EX112, model: "quadratic", exclude: ex });
        return [];
      } catch (e) {
        return (e as AppError).issues.map((x) => x.path);
      }
    };
    expect(paths([{ index: 13, reason: "x" }])).toEqual(["exclude.0.index"]);
    expect(paths([{ index: 1, reason: "x" }, { index: 1, reason: "y" }])).toEqual(["exclude.1.index"]);
    expect(paths([{ index: 1, reason: " " }])).toEqual(["exclude.0.reason"]);
    expect(paths([0, 1, 2, 3, 4, 5, 6, 7].map((index) => ({ index, reason: "lost" })))).toEqual(["exclude"]);
  });
});
