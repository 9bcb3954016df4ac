import { describe, expect, it } from "vitest";
import { generateDesign, seededRng } from "../../../lib/doe";
import { fitModel, fitParsed, fitInputSchema } from "../../../lib/stats";
import { AppError } from "../../../lib/errors/app-error";

const F3 = [
  { name: "temperature", low: 60, high: 100 },
  { name: "time", low: 1, high: 5 },
  { name: "loading", low: 1, high: 3 },
];

/** A known quadratic in coded units plus seeded noise (computed in this test). */
function synthetic(design: ReturnType<typeof generateDesign>, noise = 0.3, seed = 5) {
  const rng = seededRng(seed);
  return design.runs.map((r) => {
    const [a, b, c] = [r.coded.temperature!, r.coded.time!, r.coded.loading!];
    const y = 70 + 5 * a - 3 * b + 0 * c + 2 * a * b - 4 * a * a - 1.5 * b * b + noise * (rng() + rng() + rng() - 1.5);
    return { natural: r.natural, response: y };
  });
}

describe("fit: structure and diagnostics", () => {
  const design = generateDesign({ factors: F3, design: "box-behnken", centerPoints: 3, seed: 1 });
  const runs = synthetic(design);
  const input = { factors: F3, runs, model: "quadratic" as const };
  const out = fitModel(input);

  it("predicted R² from PRESS equals leave-one-out refits (computed in this test)", () => {
    let press = 0;
    for (let i = 0; i < runs.length; i++) {
      const rest = runs.filter((_, j) => j !== i);
      const { model } = fitParsed(fitInputSchema.parse({ ...input, runs: rest }));
      const x = [runs[i]!.natural.temperature!, runs[i]!.natural.time!, runs[i]!.natural.loading!];
      const xc = [(x[0]! - 80) / 20, (x[1]! - 3) / 2, (x[2]! - 2) / 1];
      const row = model.terms.map((t) => t.exponents.reduce((s, e, k) => s * xc[k]! ** e, 1));
      const pred = row.reduce((s, v, j) => s + v * model.coefficients[j]!, 0);
      press += (runs[i]!.response - pred) ** 2;
    }
    expect(out.stats.press!).toBeCloseTo(press, 8);
    expect(out.stats.predR2!).toBeCloseTo(1 - press / out.anova.total.ss, 10);
  });
  it("leverages sum to p and Cook's distance follows D = r²h/(p(1−h)) (Montgomery §10.7)", () => {
    const sumH = out.diagnostics.reduce((s, d) => s + d.leverage, 0);
    expect(sumH).toBeCloseTo(out.stats.p, 10); // trace of the hat matrix
    const s = out.stats.rmse!;
    for (const d of out.diagnostics) {
      const r = d.residual / (s * Math.sqrt(1 - d.leverage));
      expect(d.studentized!).toBeCloseTo(r, 10);
      expect(d.cooksDistance!).toBeCloseTo((r * r * d.leverage) / (out.stats.p * (1 - d.leverage)), 10);
    }
  });
  it("adjusted R² and RMSE follow their definitions (computed in this test)", () => {
    const { n, p, r2 } = out.stats;
    expect(out.stats.adjR2!).toBeCloseTo(1 - ((1 - r2!) * (n - 1)) / (n - p), 12);
    expect(out.stats.rmse!).toBeCloseTo(Math.sqrt(out.anova.residual.ss / (n - p)), 12);
    // 95 % interval = estimate ± t0.975(df)·SE; t0.975(5) = 2.571 (REFERENCE.md §6).
    const t = out.terms[1]!;
    expect(out.stats.dfResidual).toBe(5);
    expect((t.ci95![1] - t.estimate) / t.stdError!).toBeCloseTo(2.571, 3);
  });
  it("pruning keeps a main effect while its interaction or square stays (hierarchy)", () => {
    const pruned = fitModel({ ...input, prune: { alpha: 0.05, hierarchy: true } });
    const names = pruned.terms.map((t) => t.term);
    for (const t of names) {
      for (const part of t.replace("^2", "").split("*")) if (t !== "intercept") expect(names).toContain(part);
    }
    expect(names).toContain("temperature^2");
    expect(pruned.dropped).toContain("loading^2");
  });
  it("reports the terms a fraction cannot estimate as aliased, by name", () => {
    const frac = generateDesign({
      factors: [...F3, { name: "base", low: 1, high: 2 }],
      design: "fractional-factorial",
      replicates: 2,
      randomize: false,
    }); // 2^(4−1) twice (16 runs ≥ 11 terms), D = ABC: AB = CD, AC = BD, AD = BC
    const rng = seededRng(2);
    const runs4 = frac.runs.map((r) => ({ coded: r.coded, response: 10 + r.coded.temperature! + rng() }));
    const f4 = [...F3, { name: "base", low: 1, high: 2 }];
    const o = fitModel({ factors: f4, runs: runs4, model: "interaction" });
    // D = ABC makes AB = CD, AC = BD, AD = BC (Montgomery ch. 8); in model order the later
    // member of each pair is the one reported.
    expect(o.aliased).toEqual(["time*loading", "time*base", "loading*base"]);
    expect(o.terms.every((t) => Number.isFinite(t.estimate))).toBe(true);
  });
  it("predicts with intervals: at a run, CI half-width = t·s·√h and PI half-width = t·s·√(1 + h) (Montgomery §10.6)", () => {
    const o = fitModel({ ...input, predict: [{ natural: runs[0]!.natural }, { coded: { temperature: 0, time: 0, loading: 0 } }] });
    const pr = o.predictions[0]!;
    const d = o.diagnostics[0]!;
    expect(pr.predicted).toBeCloseTo(d.fitted, 10);
    const t = 2.571; // t0.975(5), REFERENCE.md §6
    const s = o.stats.rmse!;
    expect((pr.ci95![1] - pr.ci95![0]) / 2).toBeCloseTo(t * s * Math.sqrt(d.leverage), 2);
    expect((pr.pi95![1] - pr.pi95![0]) / 2).toBeCloseTo(t * s * Math.sqrt(1 + d.leverage), 2);
    expect(o.predictions[1]!.natural).toEqual({ temperature: 80, time: 3, loading: 2 });
    expect(o.predictions[1]!.predicted).toBeCloseTo(o.terms[0]!.estimate, 10); // centre = intercept
  });
  it("treats too few runs as a clear input error at path runs", () => {
    const few = runs.slice(0, 8);
    try {
      fitModel({ factors: F3, runs: few, model: "quadratic" });
      expect.unreachable();
    } catch (e) {
      expect(e).toBeInstanceOf(AppError);
      expect((e as AppError).issues[0]!.path).toBe("runs");
    }
  });
  it("fits ln y with the ln transform: exact exponential data give exact log-linear coefficients", () => {
    // y = exp(2 + 0.5·a − 0.25·b): ln y is linear, so the fit is exact (derived in this test).
    const d = generateDesign({ factors: F3.slice(0, 2), design: "full-factorial", centerPoints: 1, randomize: false });
    const r = d.runs.map((x) => ({ coded: x.coded, response: Math.exp(2 + 0.5 * x.coded.temperature! - 0.25 * x.coded.time!) }));
    const o = fitModel({ factors: F3.slice(0, 2), runs: r, model: "linear", transform: "ln" });
    expect(o.terms.map((t) => t.estimate)).toEqual([expect.closeTo(2, 12), expect.closeTo(0.5, 12), expect.closeTo(-0.25, 12)]);
  });
  it("curvature test from centre points: SS = nF·nC(ȳF − ȳC)²/(nF + nC) (Montgomery §6.8)", () => {
    const d = generateDesign({ factors: F3.slice(0, 2), design: "full-factorial", centerPoints: 4, randomize: false });
    const ys = [39.3, 40.9, 40.0, 41.5, 42.3, 42.5, 42.7, 42.2]; // invented data, centre raised
    const o = fitModel({ factors: F3.slice(0, 2), runs: d.runs.map((x, i) => ({ coded: x.coded, response: ys[i]! })), model: "interaction" });
    const mF = (39.3 + 40.9 + 40.0 + 41.5) / 4;
    const mC = (42.3 + 42.5 + 42.7 + 42.2) / 4;
    expect(o.curvature!.ss).toBeCloseTo((4 * 4 * (mF - mC) ** 2) / 8, 12);
    // F = SS / MS of the centre points' pure error, on (1, nC − 1) df (computed in this test).
    const msPe = [42.3, 42.5, 42.7, 42.2].reduce((s, v) => s + (v - mC) ** 2, 0) / 3;
    expect(o.curvature!.f!).toBeCloseTo(o.curvature!.ss / msPe, 10);
    expect(o.curvature!.p!).toBeLessThan(0.01);
  });
});
