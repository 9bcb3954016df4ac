import { describe, expect, it } from "vitest";
import { fQuantile, fUpperP, tQuantile, tTwoSidedP } from "../../../lib/stats";

describe("t and F quantiles", () => {
  // Student t, two-sided 95 % (t0.975), REFERENCE.md §6 [C, matches standard tables], 3 decimals.
  const t975: [number, number][] = [
    [1, 12.706], [2, 4.303], [3, 3.182], [4, 2.776], [5, 2.571], [6, 2.447], [7, 2.365],
    [8, 2.306], [9, 2.262], [10, 2.228], [15, 2.131], [20, 2.086], [30, 2.042], [60, 2.0],
  ];
  it.each(t975)("t0.975(%i) = %f", (df, v) => {
    expect(tQuantile(0.975, df)).toBeCloseTo(v, 3);
    // The two-sided p at the quantile is 0.05 (consistency, computed in this test).
    expect(tTwoSidedP(tQuantile(0.975, df), df)).toBeCloseTo(0.05, 10);
  });
  // F0.95, REFERENCE.md §6 [C], 3 decimals.
  const f95: [number, number, number][] = [[1, 10, 4.965], [3, 4, 6.591], [5, 5, 5.05], [9, 5, 4.772], [9, 10, 3.02]];
  it.each(f95)("F0.95(%i, %i) = %f", (d1, d2, v) => {
    expect(fQuantile(0.95, d1, d2)).toBeCloseTo(v, 3);
    expect(fUpperP(fQuantile(0.95, d1, d2), d1, d2)).toBeCloseTo(0.05, 10);
  });
  it("F(1, d) = t(d)² (identity, computed in this test)", () => {
    expect(fUpperP(2.228 ** 2, 1, 10)).toBeCloseTo(tTwoSidedP(2.228, 10), 12);
  });
  it("rejects a bad probability or degrees of freedom", () => {
    expect(() => tQuantile(1.2, 3)).toThrow(RangeError);
    expect(() => fQuantile(0.95, 0, 3)).toThrow(RangeError);
  });
});
