import { describe, expect, it } from "vitest";
import { Matrix } from "ml-matrix";
import { fitModel, leastSquaresQR, ShrinkingQr } from "../../../lib/stats";
import { seededRng } from "../../../lib/doe";
import { F4, RUNS62 } from "./montgomery-data";

// Backward elimination step by step on Montgomery Example 6.2 (2^4 filtration rate,
// REFERENCE.md §6 [V]) from the two-factor-interaction model; the published reduced
// model keeps A, C, D, AC, AD. Every step's p-values are checked against a fresh fit of
// that step's model (an independent QR of the n rows, no updating), computed in this test.
describe("pruning with its steps (Montgomery Example 6.2)", () => {
  const out = fitModel({ factors: F4, runs: RUNS62, model: "interaction", prune: { alpha: 0.05, hierarchy: true } });
  const steps = out.pruning!.steps;
  const all = ["intercept", "A", "B", "C", "D", "A*B", "A*C", "A*D", "B*C", "B*D", "C*D"];

  it("removes one term per step, in the order of `dropped`, and ends with the published model", () => {
    expect(steps.filter((s) => s.removed !== null).map((s) => s.removed)).toEqual(out.dropped);
    expect(steps[steps.length - 1]!.removed).toBeNull();
    expect(out.terms.map((t) => t.term)).toEqual(["intercept", "A", "C", "D", "A*C", "A*D"]);
  });
  it("each removed term had the largest p above α among the terms free to leave, in a fresh fit of that step's model", () => {
    let model = all.slice(1);
    for (const s of steps) {
      const fresh = fitModel({ factors: F4, runs: RUNS62, model });
      const p = Object.fromEntries(fresh.terms.map((t) => [t.term, t.p!]));
      expect(s.dfResidual).toBe(fresh.stats.dfResidual);
      expect(s.rmse!).toBeCloseTo(fresh.stats.rmse!, 10);
      const held = new Set(s.heldByHierarchy.map((h) => h.term));
      // Hierarchy: a held term is contained in every term said to hold it, and those are in the model.
      for (const h of s.heldByHierarchy) {
        expect(h.p).toBeCloseTo(p[h.term]!, 10);
        expect(h.p).toBeGreaterThan(0.05);
        for (const by of h.heldBy) {
          expect(model).toContain(by);
          expect(by.split("*")).toContain(h.term);
        }
      }
      const free = model.filter((t) => !held.has(t) && !model.some((o) => o !== t && o.split("*").includes(t)));
      if (s.removed === null) {
        expect(free.every((t) => p[t]! <= 0.05)).toBe(true);
        break;
      }
      expect(s.p!).toBeCloseTo(p[s.removed]!, 10);
      expect(s.p!).toBeGreaterThan(0.05);
      for (const t of free) expect(p[t]!).toBeLessThanOrEqual(s.p! + 1e-9);
      model = model.filter((t) => t !== s.removed);
    }
  });
  it("says why: B stays while A*B, B*C or B*D is in the model", () => {
    const first = steps[0]!;
    expect(first.heldByHierarchy.find((h) => h.term === "B")?.heldBy).toEqual(["A*B", "B*C", "B*D"]);
    expect(first.reason).toMatch(/largest p-value/);
    expect(steps[steps.length - 1]!.reason).toMatch(/p ≤ α = 0.05/);
  });
  it("without hierarchy B may leave before its interactions, and nothing is held", () => {
    const flat = fitModel({ factors: F4, runs: RUNS62, model: "interaction", prune: { alpha: 0.05, hierarchy: false } });
    expect(flat.pruning!.steps.every((s) => s.heldByHierarchy.length === 0)).toBe(true);
    expect(flat.dropped).toContain("B");
    expect(flat.terms.map((t) => t.term)).toEqual(["intercept", "A", "C", "D", "A*C", "A*D"]);
  });
});

describe("column deletion from the p×p triangle (Golub & Van Loan §6.5)", () => {
  it("matches a fresh least-squares fit of the remaining columns after each deletion (random data, computed in this test)", () => {
    const rng = seededRng(42);
    const n = 60;
    const p = 9;
    const X = new Matrix(n, p);
    for (let i = 0; i < n; i++) for (let j = 0; j < p; j++) X.set(i, j, j === 0 ? 1 : (2 * rng() - 1) * (j + 1) ** 2);
    const y = Array.from({ length: n }, () => 10 * rng());
    const full = leastSquaresQR(X, y);
    const qr = new ShrinkingQr(full);
    let cols = Array.from({ length: p }, (_, j) => j);
    for (const pos of [3, 0, 5, 1, 2]) {
      qr.remove(pos);
      cols = cols.filter((_, i) => i !== pos);
      const fresh = leastSquaresQR(X.subMatrixColumn(cols), y);
      const got = qr.solve();
      expect(qr.columns).toEqual(cols);
      got.coefficients.forEach((b, j) => expect(b).toBeCloseTo(fresh.coefficients[j]!, 9));
      got.covDiagonal.forEach((v, j) => expect(v / fresh.covUnscaled[j]![j]!).toBeCloseTo(1, 10));
      expect(qr.rss / fresh.rss).toBeCloseTo(1, 11);
    }
  });
});
