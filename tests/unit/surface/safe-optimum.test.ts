import { describe, expect, it } from "vitest";
import { fitModelWithPredictor, predictModelScale, type FittedModel } from "../../../lib/stats";
import { findOptimum, fitResponseSurface } from "../../../lib/surface";
import { generateDesign, seededRng } from "../../../lib/doe";
import { parseConstraints } from "../../../lib/doe/constraints";
import { desirabilitySpecSchema } from "../../../lib/surface/desirability";
import type { SafetyCheck } from "../../../lib/doe/safe-envelope";
import { AppError } from "../../../lib/errors/app-error";
import { EX112_NATURAL } from "./montgomery-natural";

const decode = (m: FittedModel, x: readonly number[]) => Object.fromEntries(m.factors.map((f, i) => [f.name, (f.low + f.high) / 2 + (x[i]! * (f.high - f.low)) / 2]));

describe("the optimum inside the safe envelope (Montgomery Example 11.2)", () => {
  const { model } = fitModelWithPredictor({ ...EX112_NATURAL, model: "quadratic" });
  // The unrestricted maximum is the stationary point, 86.95 min and 176.53 °F (x = 0.389, 0.306;
  // REFERENCE.md §6 [C]). An invented envelope blocks everything above 176 °F.
  const tooHot: SafetyCheck = (p) => ({ blocking: p.temperature! > 176 ? [{ code: "vessel.overpressure", message: "over the vial's rating" }] : [] });

  it("without a block, the optimum is the stationary point and the check is asked once", () => {
    const o = findOptimum({ kind: "response", model, goal: "maximize" }, { safety: () => ({ blocking: [] }) });
    expect(o.coded.time!).toBeCloseTo(0.389, 3);
    expect(o.safety).toEqual({ checked: true, blockedWithoutEnvelope: [], onEnvelopeEdge: false, checks: 1 });
    expect(o.method).toBe("faces");
  });
  it("with the envelope, finds the best safe point: on the edge (176 °F), as good as a fine search of the safe part of the cube", () => {
    const o = findOptimum({ kind: "response", model, goal: "maximize" }, { safety: tooHot });
    expect(o.natural.temperature!).toBeLessThanOrEqual(176);
    expect(o.natural.temperature!).toBeGreaterThan(175.99);
    expect(o.method).toBe("safe-search");
    expect(o.safety.blockedWithoutEnvelope.map((c) => c.code)).toEqual(["vessel.overpressure"]);
    expect(o.safety.onEnvelopeEdge).toBe(true);
    expect(o.warnings.join(" ")).toMatch(/edge of the safe envelope/);
    // Brute force (computed in this test): the best of a 401 × 401 grid of safe points of the cube.
    let best = -Infinity;
    for (let i = 0; i <= 400; i++)
      for (let j = 0; j <= 400; j++) {
        const x = [-1 + i / 200, -1 + j / 200];
        if (tooHot(decode(model, x)).blocking.length) continue;
        best = Math.max(best, predictModelScale(model, x));
      }
    expect(o.predicted).toBeGreaterThanOrEqual(best - 1e-6);
    expect(o.pi95![0]).toBeLessThan(o.ci95![0]);
  });
  it("says so when no point of the region is safe", () => {
    try {
      findOptimum({ kind: "response", model, goal: "maximize" }, { safety: () => ({ blocking: [{ code: "x", message: "always" }] }) });
      expect.unreachable();
    } catch (e) {
      expect((e as AppError).code).toBe("infeasible");
      expect((e as AppError).issues[0]!.path).toBe("safety");
    }
  });
  it("keeps linear constraints and the envelope together", () => {
    const constraints = parseConstraints([{ expr: "time + temperature <= 260" }], model.factors);
    const o = findOptimum({ kind: "response", model, goal: "maximize" }, { constraints, safety: tooHot });
    expect(o.natural.time! + o.natural.temperature!).toBeLessThanOrEqual(260 + 1e-6);
    expect(o.natural.temperature!).toBeLessThanOrEqual(176);
  });
});

describe("property: the optimum is never where the safety check blocks", () => {
  // Random fitted models (random quadratics plus noise on a CCD, k = 2–4) and random unsafe
  // regions (balls and half-planes in natural units), generated in this test.
  const rng = seededRng(2027);
  const cases = Array.from({ length: 24 }, (_, c) => c);
  it.each(cases)("case %i", (c) => {
    const k = 2 + (c % 3);
    const factors = Array.from({ length: k }, (_, i) => ({ name: `f${i}`, low: 10 * i, high: 10 * i + 20 }));
    const d = generateDesign({ factors, design: "central-composite", alpha: "face-centered", centerPoints: 3, seed: c });
    const coef = Array.from({ length: 1 + 2 * k + (k * (k - 1)) / 2 }, () => 4 * rng() - 2);
    const runs = d.runs.map((r) => {
      const x = factors.map((f) => r.coded[f.name]!);
      let y = 50 + coef[0]!;
      let t = 1;
      for (let i = 0; i < k; i++) y += coef[t++]! * x[i]! + coef[t++]! * x[i]! * x[i]!;
      for (let i = 0; i < k; i++) for (let j = i + 1; j < k; j++) y += coef[t++]! * x[i]! * x[j]!;
      return { natural: r.natural, responses: { yield: y + 0.2 * (rng() - 0.5), purity: 90 - y / 5 + 0.2 * (rng() - 0.5) } };
    });
    const fitted = fitModelWithPredictor({ factors, runs, model: "quadratic", responseName: "yield" }).model;
    const target =
      c % 4 === 3
        ? {
            kind: "desirability" as const,
            responses: [
              { spec: desirabilitySpecSchema.parse({ name: "yield", goal: "maximize", low: 40, high: 60 }), model: fitted },
              { spec: desirabilitySpecSchema.parse({ name: "purity", goal: "target", low: 78, high: 82, target: 80 }), model: fitModelWithPredictor({ factors, runs, model: "quadratic", responseName: "purity" }).model },
            ],
          }
        : { kind: "response" as const, model: fitted, goal: c % 2 ? ("minimize" as const) : ("maximize" as const) };
    const region = c % 5 === 4 ? ("sphere" as const) : ("cube" as const);
    // The unsafe ball sits near the unrestricted optimum (so the envelope matters), the plane anywhere.
    const free = findOptimum(target, { region, seed: c });
    const centre = factors.map((f) => free.natural[f.name]! + 2 * (rng() - 0.5));
    const r = 3 + 7 * rng();
    const w = factors.map(() => 2 * rng() - 1);
    const cut = w.reduce((s, v, i) => s + v * (factors[i]!.low + 10), 0) + 6 * (rng() - 0.2);
    const safety: SafetyCheck = (p) => {
      const blocking = [];
      const dist = Math.sqrt(factors.reduce((s, f, i) => s + (p[f.name]! - centre[i]!) ** 2, 0));
      if (dist < r) blocking.push({ code: "ball", message: "inside the unsafe ball" });
      if (factors.reduce((s, f, i) => s + w[i]! * p[f.name]!, 0) > cut) blocking.push({ code: "plane", message: "beyond the unsafe plane" });
      return { blocking };
    };
    const sample = () => {
      for (;;) {
        const x = factors.map(() => (region === "sphere" ? Math.sqrt(k) : 1) * (2 * rng() - 1));
        if (region === "cube" || Math.hypot(...x) <= Math.sqrt(k)) return x;
      }
    };
    let o;
    try {
      o = findOptimum(target, { region, safety, seed: c });
    } catch (e) {
      // Only allowed when no point of the region is safe: then a dense sample finds none either.
      expect((e as AppError).issues[0]!.path).toBe("safety");
      for (let s = 0; s < 3000; s++) expect(safety(decode(fitted, sample())).blocking.length).toBeGreaterThan(0);
      return;
    }
    expect(safety(o.natural).blocking).toEqual([]);
    expect(o.safety.checked).toBe(true);
    expect(o.method).toBe("safe-search");
    // And no random safe point of the region does better (3000 samples, computed in this test).
    if (target.kind === "response") {
      const sign = target.goal === "maximize" ? 1 : -1;
      let best = -Infinity;
      for (let s = 0; s < 3000; s++) {
        const x = sample();
        if (safety(decode(fitted, x)).blocking.length === 0) best = Math.max(best, sign * predictModelScale(fitted, x));
      }
      expect(sign * o.predicted).toBeGreaterThanOrEqual(best - 1e-9);
    }
  });
});

describe("the canonical analysis in words", () => {
  it("Montgomery Example 11.2: a maximum at 86.95 min and 176.5 °F, inside the studied region", () => {
    // Stationary point x = (0.389, 0.306) (REFERENCE.md §6 [C]) → 85 + 5·0.389 min, 175 + 5·0.306 °F.
    const c = fitResponseSurface({ ...EX112_NATURAL, model: "quadratic" }).output.canonical!;
    expect(c.kind).toBe("maximum");
    expect(c.ridge).toBeNull();
    expect(c.stationaryInside).toBe(true);
    expect(c.description).toMatch(/^The fitted surface has a maximum at time 86\.95 min, temperature 176\.5 °F \(inside the studied region\)/);
    expect(c.directions).toHaveLength(2);
  });
});
