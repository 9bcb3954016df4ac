import { describe, expect, it } from "vitest";
import { fitModelWithPredictor, predictAt } from "../../../lib/stats";
import { surfaceGrid } from "../../../lib/surface";
import type { SafetyCheck } from "../../../lib/doe/safe-envelope";
import { EX112_NATURAL } from "./montgomery-natural";

// The fitted surface of Montgomery Example 11.2 (REFERENCE.md §6) on natural axes;
// expected values are computed in this test from the same fitted model (predictAt).
describe("surface grid in natural units", () => {
  const { model } = fitModelWithPredictor({ ...EX112_NATURAL, model: "quadratic" });
  const code = (t: number, T: number) => [(t - 85) / 5, (T - 175) / 5];

  it("spans the studied range of the runs by default (the axial points at ±√2: 77.93–92.07 min)", () => {
    const g = surfaceGrid(model, { xFactor: "time", yFactor: "temperature", steps: 5 });
    expect(g.xNatural[0]).toBeCloseTo(85 - 5 * Math.SQRT2, 12);
    expect(g.xNatural[4]).toBeCloseTo(85 + 5 * Math.SQRT2, 12);
    expect(g.studied.x[1]).toBeCloseTo(85 + 5 * Math.SQRT2, 12);
    expect(g.extrapolated.flat().every((e) => !e)).toBe(true);
  });
  it("evaluates the model at each natural point: z[j][i] at (x_i, y_j)", () => {
    const g = surfaceGrid(model, { xFactor: "time", yFactor: "temperature", xRange: [70, 100], yRange: [160, 190], steps: 7 });
    expect(g.xNatural).toEqual([70, 75, 80, 85, 90, 95, 100]);
    for (const [i, j] of [[0, 0], [3, 3], [6, 2], [1, 5]] as const) {
      expect(g.z[j]![i]!).toBeCloseTo(predictAt(model, code(g.xNatural[i]!, g.yNatural[j]!)).predicted, 12);
    }
  });
  it("marks as extrapolated exactly the points outside the range of the runs", () => {
    const g = surfaceGrid(model, { xFactor: "time", yFactor: "temperature", xRange: [70, 100], yRange: [160, 190], steps: 7 });
    const lo = 85 - 5 * Math.SQRT2;
    const hi = 85 + 5 * Math.SQRT2;
    const loT = 175 - 5 * Math.SQRT2;
    const hiT = 175 + 5 * Math.SQRT2;
    g.extrapolated.forEach((row, j) =>
      row.forEach((e, i) => expect(e).toBe(g.xNatural[i]! < lo || g.xNatural[i]! > hi || g.yNatural[j]! < loT || g.yNatural[j]! > hiT)),
    );
  });
  it("hatches where the safety check blocks, listing each caution with the points it covers", () => {
    // An invented envelope: too hot above 180 °F; too long and hot together above 95 min + 175 °F.
    const calls: Record<string, number>[] = [];
    const safety: SafetyCheck = (p) => {
      calls.push(p);
      const blocking = [];
      if (p.temperature! > 180) blocking.push({ code: "vessel.overpressure", message: `over the vial's rating at ${p.temperature} °F` });
      if (p.time! > 95 && p.temperature! > 175) blocking.push({ code: "solvent.decomposition", message: "long and hot" });
      return { blocking };
    };
    const g = surfaceGrid(model, { xFactor: "time", yFactor: "temperature", xRange: [70, 100], yRange: [160, 190], steps: 7, safety });
    expect(calls.length).toBe(49);
    // In scan order (rows of temperature upward) 100 min at 180 °F blocks first; 185 and 190 °F
    // block on all 7 columns; "long and hot" is 100 min at 180, 185, 190 °F (counted by hand).
    expect(g.cautions.map((c) => [c.code, c.points])).toEqual([
      ["solvent.decomposition", 3],
      ["vessel.overpressure", 7 * 2],
    ]);
    const over = g.cautions.findIndex((c) => c.code === "vessel.overpressure");
    g.blocked!.forEach((row, j) => row.forEach((b, i) => expect(b.includes(over)).toBe(g.yNatural[j]! > 180 && g.xNatural[i]! >= 70)));
    expect(g.blocked![0]![0]).toEqual([]);
  });
  it("passes every factor's natural value to the check, the others held where asked", () => {
    const three = {
      factors: [...EX112_NATURAL.factors, { name: "loading", low: 1, high: 5, unit: "mol%" }],
      runs: EX112_NATURAL.runs.map((r, i) => ({ coded: { ...r.coded, loading: i % 3 === 0 ? -1 : i % 3 === 1 ? 0 : 1 }, response: r.response + (i % 3) })),
    };
    const m3 = fitModelWithPredictor({ ...three, model: "linear" }).model;
    const seen: Record<string, number>[] = [];
    const g = surfaceGrid(m3, { xFactor: "time", yFactor: "temperature", steps: 2, fixed: { loading: 4 }, safety: (p) => (seen.push(p), { blocking: [] }) });
    expect(g.fixed).toEqual({ loading: 4 });
    expect(seen.every((p) => p.loading === 4 && Object.keys(p).length === 3)).toBe(true);
    expect(g.z[0]![0]!).toBeCloseTo(predictAt(m3, [...code(g.xNatural[0]!, g.yNatural[0]!), 0.5]).predicted, 12);
    const outside = surfaceGrid(m3, { xFactor: "time", yFactor: "temperature", steps: 2, fixed: { loading: 6 } });
    expect(outside.extrapolated.flat().every(Boolean)).toBe(true); // loading 6 mol% is past the runs (1–5)
  });
  it("names bad options", () => {
    expect(() => surfaceGrid(model, { xFactor: "time", yFactor: "time" })).toThrow(/yFactor/);
    expect(() => surfaceGrid(model, { xFactor: "time", yFactor: "temperature", xRange: [90, 80] })).toThrow(/xRange/);
    expect(() => surfaceGrid(model, { xFactor: "time", yFactor: "temperature", fixed: { pressure: 2 } })).toThrow(/fixed.pressure/);
    expect(() => surfaceGrid(model, { xFactor: "time", yFactor: "temperature", steps: 1 })).toThrow(/steps/);
  });
});
