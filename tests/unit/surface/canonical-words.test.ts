import { describe, expect, it } from "vitest";
import { buildTerms } from "../../../lib/stats";
import { canonicalAnalysis, describeCanonical } from "../../../lib/surface";

// Invented second-order models ŷ = b0 + b'x + x'Bx in two coded factors a, b, chosen so that
// the kind follows from the eigenvalues of B by hand (Myers, Montgomery & Anderson-Cook §6.3–6.4).
const terms = buildTerms("quadratic", ["a", "b"]); // intercept, a, b, a*b, a^2, b^2
const say = (coef: number[], inside = (x: readonly number[]) => x.every((v) => Math.abs(v) <= 1)) =>
  describeCanonical(canonicalAnalysis(terms, coef, 2)!, ["a", "b"], (x) => `a ${x[0]!.toFixed(2)}, b ${x[1]!.toFixed(2)}`, inside);

describe("canonical analysis in words", () => {
  it("a maximum: where, and the axis along which the response falls fastest (λ = −3 along b)", () => {
    const w = say([10, 0.2, 0.6, 0, -1, -3]); // x_s = (0.1, 0.1)
    expect(w.kind).toBe("maximum");
    expect(w.description).toBe("The fitted surface has a maximum at a 0.10, b 0.10 (inside the studied region). The response falls away from it fastest along b up and slowest along a up.");
  });
  it("a minimum outside the studied region says so", () => {
    const w = say([0, -6, 0, 0, 1, 2]); // x_s = (3, 0)
    expect(w.kind).toBe("minimum");
    expect(w.stationaryInside).toBe(false);
    expect(w.description).toMatch(/minimum at a 3\.00, b 0\.00 \(outside the studied region\)/);
  });
  it("a saddle: rises along one canonical axis and falls along the other", () => {
    const w = say([0, 0, 0, 0, 1, -1]);
    expect(w.kind).toBe("saddle");
    expect(w.description).toBe("The fitted surface is a saddle (minimax) at a 0.00, b 0.00 (inside the studied region): from there the response rises along a up, and falls along b up.");
  });
  it("a rising ridge: B singular along a, the gradient along a, the other eigenvalue negative", () => {
    const w = say([0, 1, 0, 0, 0, -1]);
    expect(w.kind).toBe("ridge");
    expect(w.ridge).toBe("rising");
    expect(w.description).toMatch(/^The fitted surface is a rising ridge: the response keeps rising along a up out of the studied region/);
  });
  it("a stationary ridge through the centre (|λ| < 1 % of the largest): along a the response hardly changes", () => {
    const w = say([0, 0, 0, 0, -0.001, -1]);
    expect(w.ridge).toBe("stationary");
    expect(w.description).toMatch(/stationary ridge through a 0\.00, b 0\.00 \(inside the studied region\): along a up the response hardly changes/);
  });
  it("names a diagonal direction by both factors with their loadings", () => {
    // B = [[−1, −0.9], [−0.9, −1]]: eigenvalues −1.9 along (1, 1)/√2 and −0.1 along (1, −1)/√2.
    const w = say([0, 0, 0, -1.8, -1, -1]);
    expect(w.directions.map((d) => d.words)).toEqual(["a up with b up (0.71 : 0.71 in coded units)", "a up with b down (0.71 : −0.71 in coded units)"]);
  });
});
