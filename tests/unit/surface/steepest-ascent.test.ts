import { describe, expect, it } from "vitest";
import { fitModelWithPredictor } from "../../../lib/stats";
import { steepestAscent } from "../../../lib/surface";

// Montgomery, Design and Analysis of Experiments, Example 11.1 (from memory): reaction time
// 30–40 min and temperature 150–160 °F, a 2^2 with 5 centre runs; the fitted first-order
// model is ŷ = 40.44 + 0.775x1 + 0.325x2, and the path moves 5 min and about 2 °F per step
// (Δx2 = 0.325/0.775 = 0.42). The coefficients follow from the data by hand:
// b1 = (40.9 + 41.5 − 39.3 − 40.0)/4 = 0.775, b2 = (40.0 + 41.5 − 39.3 − 40.9)/4 = 0.325.
const factors = [
  { name: "time", low: 30, high: 40, unit: "min" },
  { name: "temperature", low: 150, high: 160, unit: "degF" },
];
const pts: [number, number, number][] = [
  [-1, -1, 39.3], [-1, 1, 40.0], [1, -1, 40.9], [1, 1, 41.5],
  [0, 0, 40.3], [0, 0, 40.5], [0, 0, 40.7], [0, 0, 40.2], [0, 0, 40.6],
];
const { model, output } = fitModelWithPredictor({ factors, runs: pts.map(([a, b, y]) => ({ coded: { time: a, temperature: b }, response: y })), model: "linear" });

describe("path of steepest ascent (Montgomery Example 11.1)", () => {
  it("fits the published first-order model", () => {
    expect(output.terms.map((t) => t.estimate)).toEqual([expect.closeTo(40.444, 3), expect.closeTo(0.775, 12), expect.closeTo(0.325, 12)]);
  });
  it("steps 5 min and 2.10 °F (0.42 coded) per step from the centre, time as the base factor", () => {
    const p = steepestAscent(model, { maxSteps: 12 });
    expect(p.baseFactor).toBe("time");
    expect(p.codedStep.temperature).toBeCloseTo(0.325 / 0.775, 12);
    expect(p.naturalStep.time).toBeCloseTo(5, 12);
    expect(p.naturalStep.temperature).toBeCloseTo((5 * 0.325) / 0.775, 12);
    expect(p.points[0]!.natural).toEqual({ time: 40, temperature: expect.closeTo(157.097, 3) });
    expect(p.points).toHaveLength(12);
    expect(p.stoppedAt).toBeNull();
  });
  it("is proportional to the coefficients scaled by the half-ranges at every point: (u − u0)/(b·h) is the same for both factors", () => {
    const p = steepestAscent(model, { maxSteps: 6, step: 0.5 });
    p.points.forEach((pt, s) => {
      const a = (pt.natural.time! - 35) / (0.775 * 5);
      const b = (pt.natural.temperature! - 155) / (0.325 * 5);
      expect(a).toBeCloseTo(b, 12);
      expect(a).toBeCloseTo(((s + 1) * 0.5) / 0.775, 12);
    });
  });
  it("stops at the safe envelope: a blocking caution above 170 °F ends the path before step 8 (155 + 8·2.097 °F)", () => {
    const p = steepestAscent(model, {
      maxSteps: 12,
      safety: (x) => ({ blocking: x.temperature! > 170 ? [{ code: "solvent.boiling", message: "the solvent boils in an open vial" }] : [] }),
    });
    expect(p.points.map((x) => x.step)).toEqual([1, 2, 3, 4, 5, 6, 7]);
    expect(p.stoppedAt!.step).toBe(8);
    expect(p.stoppedAt!.blocking.map((c) => c.code)).toEqual(["solvent.boiling"]);
    expect(p.warnings.join(" ")).toMatch(/stops before step 8/);
    expect(p.points.every((x) => x.natural.temperature! <= 170)).toBe(true);
  });
  it("stops at a factor's limit, marks points past the runs as extrapolated, and descends for a minimum", () => {
    const p = steepestAscent(model, { maxSteps: 12, limits: { time: { max: 70 } } });
    expect(p.points[p.points.length - 1]!.natural.time).toBe(70);
    expect(p.stoppedAt!.reasons).toEqual(["time would pass its upper limit of 70 min"]);
    // Step 1 (40 min, 157.1 °F) is on the edge of the runs; every later step is past them.
    expect(p.points.map((x) => x.extrapolated)).toEqual([false, true, true, true, true, true, true]);
    const down = steepestAscent(model, { goal: "minimize", maxSteps: 1 });
    expect(down.points[0]!.natural.time).toBe(30);
  });
});
