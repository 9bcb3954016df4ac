import { describe, expect, it } from "vitest";
import { fitModel } from "../../../lib/stats";

// A replicated 2^3 whose responses are symmetric under swapping B and C (invented in this
// test): y(a, b, c, r) = y(a, c, b, r). In exact arithmetic B and C then have equal
// estimates, standard errors and p-values, so backward elimination must break the tie
// by its documented rule (the later term in model order leaves first), not by rounding.
function symmetricRuns(order: ("A" | "B" | "C")[]) {
  const runs = [];
  for (const r of [1, -1])
    for (let i = 0; i < 8; i++) {
      const x = { A: i & 1 ? 1 : -1, B: i & 2 ? 1 : -1, C: i & 4 ? 1 : -1 };
      const y = 50 + 10 * x.A + 0.3 * (x.B + x.C) + 0.8 * r * (1 + 0.5 * x.B * x.C + 0.3 * x.A);
      runs.push({ coded: Object.fromEntries(order.map((f) => [f, x[f]])), response: y });
    }
  return runs;
}
const factorsIn = (order: string[]) => order.map((name) => ({ name, low: -1, high: 1 }));

describe("backward elimination: exact ties in p", () => {
  it("the two symmetric terms have the same p-value (to 1e-12) and both exceed α", () => {
    const out = fitModel({ factors: factorsIn(["A", "B", "C"]), runs: symmetricRuns(["A", "B", "C"]), model: "linear" });
    const p = (t: string) => out.terms.find((x) => x.term === t)!.p!;
    expect(Math.abs(p("B") - p("C"))).toBeLessThan(1e-12);
    expect(p("B")).toBeGreaterThan(0.05);
    expect(p("A")).toBeLessThan(1e-6);
  });
  it("the later term in model order leaves first: C when the factors are A, B, C", () => {
    const out = fitModel({ factors: factorsIn(["A", "B", "C"]), runs: symmetricRuns(["A", "B", "C"]), model: "linear", prune: { alpha: 0.05, hierarchy: true } });
    expect(out.dropped[0]).toBe("C");
  });
  it("and B when the factors are listed A, C, B (the same data): the rule follows model order", () => {
    const out = fitModel({ factors: factorsIn(["A", "C", "B"]), runs: symmetricRuns(["A", "C", "B"]), model: "linear", prune: { alpha: 0.05, hierarchy: true } });
    expect(out.dropped[0]).toBe("B");
  });
  it("ties between interactions follow the same rule (A*B and A*C tie; A*C is later)", () => {
    const out = fitModel({ factors: factorsIn(["A", "B", "C"]), runs: symmetricRuns(["A", "B", "C"]), model: ["A", "B", "C", "A*B", "A*C"], prune: { alpha: 0.05, hierarchy: true } });
    const full = fitModel({ factors: factorsIn(["A", "B", "C"]), runs: symmetricRuns(["A", "B", "C"]), model: ["A", "B", "C", "A*B", "A*C"] });
    const p = (t: string) => full.terms.find((x) => x.term === t)!.p!;
    expect(Math.abs(p("A*B") - p("A*C"))).toBeLessThan(1e-12);
    expect(out.dropped[0]).toBe("A*C");
  });
});
