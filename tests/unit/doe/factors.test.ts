import { describe, expect, it } from "vitest";
import { codeValue, decodeValue, factorListSchema, factorSchema } from "../../../lib/doe";
import { seededRng } from "../../../lib/doe";

describe("factor coding x = (u − u0)/Δu", () => {
  const t = factorSchema.parse({ name: "temperature", low: 70, high: 110 });
  it("maps low, centre and high to −1, 0, +1", () => {
    // PRODUCT.md "Computation": u0 = (high+low)/2 = 90, Δu = (high−low)/2 = 20.
    expect(codeValue(t, 70)).toBe(-1);
    expect(codeValue(t, 90)).toBe(0);
    expect(codeValue(t, 110)).toBe(1);
    expect(codeValue(t, 100)).toBe(0.5); // (100 − 90)/20, computed by hand
    expect(decodeValue(t, -1.414)).toBeCloseTo(90 - 1.414 * 20, 12);
  });
  it("round-trips random values on linear and log scales (property, computed in this test)", () => {
    const rng = seededRng(42);
    const log = factorSchema.parse({ name: "loading", low: 0.5, high: 5, scale: "log" });
    for (let i = 0; i < 500; i++) {
      const u = 50 + rng() * 100;
      expect(decodeValue(t, codeValue(t, u))).toBeCloseTo(u, 10);
      const x = -2 + 4 * rng();
      expect(codeValue(t, decodeValue(t, x))).toBeCloseTo(x, 12);
      const v = 0.1 + rng() * 10;
      expect(decodeValue(log, codeValue(log, v))).toBeCloseTo(v, 10);
    }
  });
  it("codes a log-scale factor on ln u: the geometric mean is the centre", () => {
    // ln-coding: x = (ln u − (ln h + ln l)/2)/((ln h − ln l)/2); √(0.5·5) codes to 0.
    const log = factorSchema.parse({ name: "loading", low: 0.5, high: 5, scale: "log" });
    expect(codeValue(log, Math.sqrt(2.5))).toBeCloseTo(0, 14);
    expect(codeValue(log, 0.5)).toBeCloseTo(-1, 14);
    expect(decodeValue(log, 1)).toBeCloseTo(5, 12);
  });
});

describe("factor validation", () => {
  it("rejects low ≥ high, non-finite values, bad and duplicate names with their paths", () => {
    const r1 = factorSchema.safeParse({ name: "t", low: 5, high: 5 });
    expect(r1.success).toBe(false);
    expect(r1.error?.issues[0]?.path).toEqual(["high"]);
    expect(factorSchema.safeParse({ name: "t", low: 0, high: Infinity }).success).toBe(false);
    expect(factorSchema.safeParse({ name: "2t", low: 0, high: 1 }).success).toBe(false);
    expect(factorSchema.safeParse({ name: "a*b", low: 0, high: 1 }).success).toBe(false);
    expect(factorSchema.safeParse({ name: "intercept", low: 0, high: 1 }).success).toBe(false);
    const log = factorSchema.safeParse({ name: "t", low: 0, high: 1, scale: "log" });
    expect(log.error?.issues[0]?.path).toEqual(["low"]);
    const dup = factorListSchema.safeParse([
      { name: "t", low: 0, high: 1 },
      { name: "t", low: 0, high: 2 },
    ]);
    expect(dup.error?.issues[0]?.path).toEqual([1, "name"]);
  });
});
