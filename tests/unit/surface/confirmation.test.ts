import { describe, expect, it } from "vitest";
import { fitModelWithPredictor, predictAt, tQuantile } from "../../../lib/stats";
import { confirmationHolds, findOptimum, planConfirmation, predictMeanOf } from "../../../lib/surface";
import type { SafetyCheck } from "../../../lib/doe/safe-envelope";
import { AppError } from "../../../lib/errors/app-error";
import { EX112_NATURAL } from "./montgomery-natural";

// Montgomery Example 11.2 (REFERENCE.md §6): the maximum at 86.95 min, 176.53 °F.
const { model } = fitModelWithPredictor({ ...EX112_NATURAL, model: "quadratic" });
const optimum = findOptimum({ kind: "response", model, goal: "maximize" }).natural;
const coded = (t: number, T: number) => [(t - 85) / 5, (T - 175) / 5];

describe("the confirmation plan", () => {
  it("rounds to settable values (1 min, 1 °F here) and gives n replicate runs there", () => {
    const plan = planConfirmation(model, optimum, { replicates: 3, steps: { time: 1, temperature: 1 } });
    expect(plan.natural).toEqual({ time: 87, temperature: 177 });
    expect(plan.moved).toBe(false);
    expect(plan.runs).toHaveLength(3);
    expect(plan.runs.every((r) => r.kind === "confirmation" && r.natural.time === 87 && r.natural.temperature === 177)).toBe(true);
    expect(plan.coded).toEqual({ time: 0.4, temperature: 0.4 });
    expect(plan.predicted).toBeCloseTo(predictAt(model, [0.4, 0.4]).predicted, 12);
  });
  it("gives the interval for the mean of the n runs: ŷ ± t(0.975, df)·√(s²/n + se(ŷ)²) (Montgomery, Peck & Vining §3.5; computed in this test)", () => {
    const plan = planConfirmation(model, optimum, { replicates: 3, steps: { time: 1, temperature: 1 } });
    const pr = predictAt(model, [0.4, 0.4]);
    const half = tQuantile(0.975, 7) * Math.sqrt(model.s2! / 3 + pr.stdError! ** 2);
    expect(plan.mean.interval95![0]).toBeCloseTo(pr.predicted - half, 10);
    expect(plan.mean.interval95![1]).toBeCloseTo(pr.predicted + half, 10);
    expect(plan.pi95).toEqual(pr.pi95); // one new run: the ordinary prediction interval
    // The mean of n runs is known better than one run, worse than the fitted mean.
    expect(plan.mean.interval95![1] - plan.mean.interval95![0]).toBeLessThan(pr.pi95![1] - pr.pi95![0]);
    expect(plan.mean.interval95![1] - plan.mean.interval95![0]).toBeGreaterThan(pr.ci95![1] - pr.ci95![0]);
  });
  it("checks the rounded point again against the envelope and moves to the nearest settable point inside", () => {
    // An invented envelope that blocks above 176.6 °F: 176.53 is safe, 177 is not.
    const safety: SafetyCheck = (p) => ({ blocking: p.temperature! > 176.6 ? [{ code: "vessel.overpressure", message: "above the vial's rating" }] : [] });
    const safeOpt = findOptimum({ kind: "response", model, goal: "maximize" }, { safety }).natural;
    expect(safeOpt.temperature!).toBeCloseTo(176.53, 2); // the optimum itself is safe
    const plan = planConfirmation(model, safeOpt, { replicates: 2, steps: { time: 1, temperature: 1 }, safety });
    expect(plan.natural).toEqual({ time: 87, temperature: 176 });
    expect(plan.moved).toBe(true);
    expect(plan.movedBecause).toEqual(["vessel.overpressure: above the vial's rating"]);
    expect(plan.runs.every((r) => safety(r.natural).blocking.length === 0)).toBe(true);
    expect(plan.warnings[0]).toMatch(/nearest settable point inside, time 87 min, temperature 176 °F/);
  });
  it("uses the default steps by unit: 1 °C, 0.05 equiv, 0.1 mol %, 0.5 h (PRODUCT.md)", () => {
    const factors = [
      { name: "temperature", low: 60, high: 100, unit: "degC" },
      { name: "base", low: 1, high: 2, unit: "equiv" },
      { name: "loading", low: 1, high: 5, unit: "mol%" },
      { name: "time", low: 1, high: 5, unit: "h" },
      { name: "stirring", low: 300, high: 900, unit: "rpm" },
    ];
    const runs = [-1, 1].flatMap((a) => [-1, 1].flatMap((b) => [-1, 0, 1].map((c) => ({ coded: { temperature: a, base: b, loading: c, time: c * a, stirring: b * c }, response: 50 + 5 * a + 2 * b + c }))));
    const m = fitModelWithPredictor({ factors, runs, model: "linear" }).model;
    const plan = planConfirmation(m, { temperature: 84.6, base: 1.234, loading: 2.26, time: 3.3, stirring: 612.4 });
    expect(plan.natural).toEqual({ temperature: 85, base: 1.25, loading: 2.3, time: 3.5, stirring: 612.4 });
    expect(plan.steps).toEqual({ temperature: 1, base: 0.05, loading: 0.1, time: 0.5, stirring: null });
    expect(plan.warnings.join(" ")).toMatch(/stirring is not rounded/);
    expect(plan.runs).toHaveLength(3);
    // Rounding past the studied range (2.04 → 2.05 equiv > high 2) moves inside, to 2.00.
    const edge = planConfirmation(m, { temperature: 84.6, base: 2.04, loading: 2.26, time: 3.3, stirring: 612.4 });
    expect(edge.natural.base).toBe(2);
    expect(edge.movedBecause).toEqual(["outside the studied region"]);
  });
  it("names a bad step and refuses when no settable point nearby is safe", () => {
    expect(() => planConfirmation(model, optimum, { steps: { pressure: 1 } })).toThrow(/steps.pressure/);
    try {
      planConfirmation(model, optimum, { steps: { time: 1, temperature: 1 }, safety: () => ({ blocking: [{ code: "x", message: "always" }] }) });
      expect.unreachable();
    } catch (e) {
      expect((e as AppError).code).toBe("infeasible");
    }
  });
});

describe("whether the confirmation holds", () => {
  const plan = planConfirmation(model, optimum, { replicates: 3, steps: { time: 1, temperature: 1 } });
  it("holds when the observed mean lies inside the interval for the mean of that many runs", () => {
    const v = confirmationHolds(model, plan.coded, [80.0, 80.4, 80.2]);
    expect(v.observedMean).toBeCloseTo(80.2, 12);
    expect(v.interval95).toEqual(predictMeanOf(model, coded(87, 177), 3).interval95);
    expect(v.holds).toBe(true);
    expect(v.message).toMatch(/^The confirmation holds/);
  });
  it("does not hold when it lies outside, and says on which side", () => {
    const v = confirmationHolds(model, plan.coded, [77.1, 77.5, 76.9]);
    expect(v.holds).toBe(false);
    expect(v.message).toMatch(/below the 95 % interval/);
  });
  it("judges with m = the results given (two of three replicates came back)", () => {
    const v = confirmationHolds(model, plan.coded, [80.0, 80.4]);
    expect(v.interval95).toEqual(predictMeanOf(model, coded(87, 177), 2).interval95);
    expect(() => confirmationHolds(model, plan.coded, [])).toThrow(AppError);
  });
  it("under the ln transform compares the geometric mean with the back-transformed interval", () => {
    const lnModel = fitModelWithPredictor({ ...EX112_NATURAL, model: "quadratic", transform: "ln" }).model;
    const v = confirmationHolds(lnModel, plan.coded, [79, 81]);
    expect(v.observedMean).toBeCloseTo(Math.sqrt(79 * 81), 12);
    const lo = Math.exp(Math.log(v.predicted) - tQuantile(0.975, 7) * Math.sqrt(lnModel.s2! * (1 / 2 + (predictAt(lnModel, [0.4, 0.4]).stdError! ** 2) / lnModel.s2!)));
    expect(v.interval95![0]).toBeCloseTo(lo, 10);
  });
});
