import { describe, expect, it } from "vitest";
import { casCheckDigit, casProblem, isValidCas } from "@/inventory/cas";
import { ceil, div, parseDecimal, rational, toDecimalString } from "@/inventory/decimal";
import { formatAmount, toBase, unitInfo } from "@/inventory/units";

describe("CAS check digit", () => {
  it("accepts the worked example of the CAS check-digit rule (water 7732-18-5)", () => {
    // Source: CAS "check digit verification" example: 8·1 + 1·2 + 2·3 + 3·4 + 7·5 + 7·6 = 105 → 5.
    expect(casCheckDigit("7732-18-5")).toBe(5);
    expect(isValidCas("7732-18-5")).toBe(true);
  });
  it("accepts CAS numbers of the demo reagents", () => {
    // CAS numbers from memory [M]: THF, 1,4-dioxane, n-butyllithium, triisopropyl borate, K3PO4.
    for (const cas of ["109-99-9", "123-91-1", "109-72-8", "5419-55-6", "7778-53-2"]) expect(casProblem(cas)).toBeNull();
  });
  it("rejects a wrong check digit and names the right one", () => {
    // computed in this test from the rule: 7732-18-x must end in 5
    expect(casProblem("7732-18-4")).toBe("check digit should be 5, not 4");
  });
  it("rejects malformed numbers", () => {
    expect(isValidCas("7732185")).toBe(false);
    expect(isValidCas("1-18-5")).toBe(false);
    expect(isValidCas("12345678-18-5")).toBe(false);
  });
});

describe("exact decimals", () => {
  it("adds decimals without binary drift (0.1 + 0.2 = 0.3 exactly)", () => {
    // computed in this test: 1/10 + 2/10 = 3/10
    const a = parseDecimal("0.1");
    const b = parseDecimal("0.2");
    expect(toDecimalString(rational(a.n * b.d + b.n * a.d, a.d * b.d), 12)).toBe("0.3");
  });
  it("parses exponent notation", () => {
    expect(parseDecimal("1e-7")).toEqual(rational(1n, 10_000_000n));
    expect(parseDecimal(2.5e3)).toEqual(rational(2500n));
  });
  it("rounds up with ceil, including exact integers unchanged", () => {
    expect(ceil(div(rational(10n), rational(3n)))).toBe(4n);
    expect(ceil(rational(9n, 3n))).toBe(3n);
    expect(ceil(rational(-7n, 2n))).toBe(-3n);
  });
  it("rejects text that is not a number", () => {
    expect(() => parseDecimal("12,5")).toThrow(RangeError);
    expect(() => parseDecimal("")).toThrow(RangeError);
  });
});

describe("stock units", () => {
  it("has exact integer factors to µg and nL (from convert-units)", () => {
    // SI prefixes: 1 kg = 10^9 µg; 1 L = 10^9 nL; 1 µL = 10^3 nL.
    expect(unitInfo("kg")?.factor).toBe(1_000_000_000n);
    expect(unitInfo("L")?.factor).toBe(1_000_000_000n);
    expect(unitInfo("µL")?.factor).toBe(1000n);
    expect(unitInfo("uL")?.label).toBe("µL");
    expect(unitInfo("oz")).toBeNull();
  });
  it("converts 12.345 g to 12 345 000 µg exactly", () => {
    // computed in this test: 12.345 × 10^6
    expect(toBase("12.345", "g")).toEqual({ base: 12_345_000n, dimension: "mass" });
  });
  it("sums many small amounts to the exact total (1000 × 0.001 g = 1 g)", () => {
    let total = 0n;
    for (let i = 0; i < 1000; i++) total += toBase("0.001", "g").base;
    expect(total).toBe(toBase(1, "g").base);
  });
  it("formats with the unit next to the number", () => {
    expect(formatAmount(2_500_000n, "volume")).toBe("2.5 mL");
    expect(formatAmount(150n, "mass", "mg")).toBe("0.15 mg");
  });
});

describe("parseDecimal refuses unbounded work", () => {
  it("an exponent beyond 1000 is a RangeError at once, not a ten-million-digit BigInt", () => {
    // Issue 9: "1e10000000" blocked the event loop for seconds before the bound.
    expect(() => parseDecimal("1e10000000")).toThrow(RangeError);
    expect(() => parseDecimal("1e-10000000")).toThrow(RangeError);
    expect(parseDecimal("1e3")).toEqual(rational(1000n));
  });
});
