import { describe, expect, it } from "vitest";
import { canonicalAnalysis, desirability, optimizeResponse, overallDesirability, desirabilitySpecSchema } from "../../../lib/surface";
import { buildTerms, fitModel } from "../../../lib/stats";
import { EX112 } from "../stats/montgomery-data";

describe("optimum of Montgomery Example 11.2", () => {
  // The stationary point (0.389, 0.306) is a maximum inside both the cube and the design's
  // sphere (REFERENCE.md §6 [C]), so it is the constrained optimum in both.
  it.each(["cube", "sphere"] as const)("finds the stationary point in the %s", (region) => {
    const o = optimizeResponse({ ...EX112, model: "quadratic", goal: "maximize", region });
    expect(o.coded.x1!).toBeCloseTo(0.389, 3);
    expect(o.coded.x2!).toBeCloseTo(0.306, 3);
    expect(o.predicted).toBeCloseTo(80.21, 2);
    expect(o.onBoundary).toEqual([]);
    expect(o.ci95![0]).toBeLessThan(o.predicted);
    expect(o.pi95![1] - o.pi95![0]).toBeGreaterThan(o.ci95![1] - o.ci95![0]); // PI wider than CI
  });
  it("uses the design's sphere: radius √2, the distance of the axial points", () => {
    const o = optimizeResponse({ ...EX112, region: "sphere" });
    expect(o.radius!).toBeCloseTo(Math.SQRT2, 12);
  });
  it("minimising puts the optimum on the boundary, matching a brute-force search of the disc", () => {
    const o = optimizeResponse({ ...EX112, goal: "minimize", region: "sphere" });
    expect(Math.hypot(o.coded.x1!, o.coded.x2!)).toBeCloseTo(Math.SQRT2, 6);
    expect(o.onBoundary).toEqual(["x1", "x2"]);
    expect(o.warnings.join(" ")).toMatch(/sphere/);
    // Brute force over the circle of radius √2 (computed in this test) with the fitted model.
    const fit = fitModel({ ...EX112, model: "quadratic" });
    const c = (t: string) => fit.terms.find((x) => x.term === t)!.estimate;
    let best = Infinity;
    let bestX = [0, 0];
    for (let i = 0; i < 3600; i++) {
      const th = (2 * Math.PI * i) / 3600;
      const x1 = Math.SQRT2 * Math.cos(th);
      const x2 = Math.SQRT2 * Math.sin(th);
      const v = c("intercept") + c("x1") * x1 + c("x2") * x2 + c("x1^2") * x1 * x1 + c("x2^2") * x2 * x2 + c("x1*x2") * x1 * x2;
      if (v < best) {
        best = v;
        bestX = [x1, x2];
      }
    }
    expect(o.coded.x1!).toBeCloseTo(bestX[0]!, 2);
    expect(o.coded.x2!).toBeCloseTo(bestX[1]!, 2);
  });
  it("honours a linear constraint on natural values: the optimum on the line x1 + x2 = −1", () => {
    const factors = [
      { name: "time", low: 80, high: 90, unit: "min" },
      { name: "temperature", low: 170, high: 180, unit: "degF" },
    ];
    const runs = EX112.runs.map((r) => ({ coded: { time: r.coded.x1, temperature: r.coded.x2 }, response: r.response }));
    // time + temperature ≤ 255 ⇔ (85 + 5x1) + (175 + 5x2) ≤ 255 ⇔ x1 + x2 ≤ −1 (derived by hand)
    const o = optimizeResponse({ factors, runs, constraints: [{ expr: "time + temperature <= 255" }] });
    expect(o.coded.time! + o.coded.temperature!).toBeCloseTo(-1, 6);
    expect(o.activeConstraints).toEqual(["time + temperature <= 255"]);
    // Exact optimum on the line x2 = −1 − x1 of ŷ (Example 11.2 fit with α = √2): the
    // 1-D quadratic's vertex, computed in this test from the fitted coefficients.
    const fit = fitModel({ factors, runs, model: "quadratic" });
    const c = (t: string) => fit.terms.find((x) => x.term === t)!.estimate;
    const b = { b1: c("time"), b2: c("temperature"), b11: c("time^2"), b22: c("temperature^2"), b12: c("time*temperature") };
    // ŷ(x1) = b1x1 + b2(−1−x1) + b11x1² + b22(1 + 2x1 + x1²) + b12(−x1 − x1²) + const
    const A2 = b.b11 + b.b22 - b.b12;
    const A1 = b.b1 - b.b2 + 2 * b.b22 - b.b12;
    expect(o.coded.time!).toBeCloseTo(-A1 / (2 * A2), 4);
  });
  it("warns when a yield is predicted above 100 % and when the optimum is on an edge", () => {
    // A steep invented linear yield surface: at x = +1 the prediction is 110 %.
    const factors = [{ name: "temperature", low: 60, high: 100 }];
    const runs = [-1, -0.5, 0, 0.5, 1].map((x) => ({ coded: { temperature: x }, response: 90 + 20 * x + (x === 0 ? 0.1 : 0) }));
    const o = optimizeResponse({ factors, runs, model: "linear", responseName: "yield" });
    expect(o.natural.temperature).toBeCloseTo(100, 9);
    expect(o.onBoundary).toEqual(["temperature"]);
    expect(o.warnings.some((w) => /above 100 %/.test(w))).toBe(true);
    expect(o.warnings.some((w) => /high limit/.test(w))).toBe(true);
  });
});

describe("Derringer–Suich desirability", () => {
  const spec = (o: object) => desirabilitySpecSchema.parse(o);
  it("follows the one-sided and two-sided forms (Derringer & Suich 1980), values computed by hand", () => {
    const max = spec({ name: "yield", goal: "maximize", low: 60, high: 90 });
    expect(desirability(max, 75)).toBeCloseTo(0.5, 12);
    expect(desirability(max, 50)).toBe(0);
    expect(desirability(max, 95)).toBe(1);
    const max2 = spec({ name: "yield", goal: "maximize", low: 60, high: 90, shape: 2 });
    expect(desirability(max2, 75)).toBeCloseTo(0.25, 12);
    const min = spec({ name: "impurity", goal: "minimize", low: 0, high: 2 });
    expect(desirability(min, 0.5)).toBeCloseTo(0.75, 12);
    const tgt = spec({ name: "ee", goal: "target", low: 80, high: 100, target: 95 });
    expect(desirability(tgt, 90)).toBeCloseTo(10 / 15, 12);
    expect(desirability(tgt, 97.5)).toBeCloseTo(0.5, 12);
    // Weighted geometric mean: (0.5^1 · 0.75^3)^(1/4)
    const minW = spec({ name: "impurity", goal: "minimize", low: 0, high: 2, weight: 3 });
    expect(overallDesirability([max, minW], [75, 0.5])).toBeCloseTo(Math.pow(0.5 * 0.75 ** 3, 0.25), 12);
  });
  it("optimize with several responses maximises D and trades them off", () => {
    // Invented, noise-free so the fitted models are these functions exactly: yield rises
    // with temperature, impurity rises faster at the high end.
    const factors = [{ name: "temperature", low: 60, high: 100 }];
    const xs = [-1, -0.5, 0, 0.5, 1, 0, 0];
    const runs = xs.map((x) => ({
      coded: { temperature: x },
      responses: { yield: 70 + 15 * x, impurity: 1 + x + x * x },
    }));
    const o = optimizeResponse({
      factors,
      runs,
      model: "quadratic",
      responses: [
        { name: "yield", goal: "maximize", low: 60, high: 90 },
        { name: "impurity", goal: "minimize", low: 0, high: 3 },
      ],
    });
    expect(o.desirability!).toBeGreaterThan(0);
    expect(o.responses!.map((r) => r.name)).toEqual(["yield", "impurity"]);
    // Neither extreme: the trade-off is inside (−1, 1), and no grid point does better (computed in this test).
    expect(Math.abs(o.coded.temperature!)).toBeLessThan(1);
    const D = (x: number) => {
      const y = 70 + 15 * x;
      const imp = 1 + x + x * x;
      return Math.sqrt(Math.min(1, Math.max(0, (y - 60) / 30)) * Math.min(1, Math.max(0, (3 - imp) / 3)));
    };
    let best = 0;
    for (let i = 0; i <= 2000; i++) best = Math.max(best, D(-1 + i / 1000));
    expect(o.desirability!).toBeGreaterThanOrEqual(best - 2e-3);
  });
});

describe("canonical analysis kinds", () => {
  const names = ["a", "b"];
  const terms = buildTerms("quadratic", names); // intercept, a, b, a*b, a^2, b^2
  it.each([
    [[0, 1, 1, 0, -1, -2], "maximum"],
    [[0, 1, 1, 0, 1, 2], "minimum"],
    [[0, 1, 1, 0, 1, -2], "saddle"],
    [[0, 1, 1, 0, -1, -0.001], "ridge"],
  ] as const)("coefficients %j give a %s (signs of the eigenvalues of B)", (coef, kind) => {
    const ca = canonicalAnalysis(terms, coef, 2)!;
    expect(ca.kind).toBe(kind);
  });
  it("the stationary point solves ∇ŷ = 0 (computed in this test)", () => {
    const coef = [5, 1, -2, 0.5, -1, -3];
    const ca = canonicalAnalysis(terms, coef, 2)!;
    const [a, b] = ca.stationaryPoint!;
    expect(1 + 0.5 * b! - 2 * a!).toBeCloseTo(0, 12);
    expect(-2 + 0.5 * a! - 6 * b!).toBeCloseTo(0, 12);
  });
});
