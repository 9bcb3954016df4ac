import { describe, expect, it } from "vitest";
import { Matrix, SVD, solve } from "ml-matrix";
import { leastSquaresQR } from "../../../lib/stats";

const EPS = Number.EPSILON / 2; // unit roundoff u

/** Exact data from a known integer polynomial at integer x: every y is an exact integer. */
function problem(xs: number[], coefs: number[]) {
  const X = new Matrix(xs.map((x) => coefs.map((_, j) => x ** j)));
  const y = xs.map((x) => coefs.reduce((s, c, j) => s + c * x ** j, 0));
  expect(y.every(Number.isSafeInteger)).toBe(true); // the data carry no rounding at all
  // Condition number of the column-scaled matrix (ml-matrix SVD), computed in this test.
  const norms = coefs.map((_, j) => Math.sqrt(X.getColumn(j).reduce((s, v) => s + v * v, 0)));
  const S = new Matrix(X.to2DArray().map((r) => r.map((v, j) => v / norms[j]!)));
  const sv = new SVD(S).diagonal;
  const kappa = sv[0]! / sv[sv.length - 1]!;
  // Scaled normwise error ‖D(b̂ − b)‖/‖Db‖.
  const err = (b: number[]) =>
    Math.sqrt(b.reduce((s, v, j) => s + ((v - coefs[j]!) * norms[j]!) ** 2, 0)) /
    Math.sqrt(coefs.reduce((s, c, j) => s + (c * norms[j]!) ** 2, 0));
  return { X, y, kappa, err, m: xs.length, n: coefs.length };
}

describe("least squares on ill-conditioned polynomials", () => {
  it("recovers y = 1 + 2x + 3x² + 4x³ at x = 100…120 (badly scaled x) where the normal equations lose digits", () => {
    // Exact answer: the coefficients themselves (zero residual), derived in this test.
    const { X, y, kappa, err, m, n } = problem(Array.from({ length: 21 }, (_, i) => 100 + i), [1, 2, 3, 4]);
    expect(kappa).toBeGreaterThan(1e4); // genuinely ill-conditioned even after scaling
    const qr = leastSquaresQR(X, y);
    expect(qr.aliased).toEqual([]);
    // Householder QR is backward stable: forward error ≲ m·n·κ·u for a zero-residual problem
    // (Higham, Accuracy and Stability of Numerical Algorithms, ch. 20).
    expect(err(qr.coefficients)).toBeLessThan(m * n * kappa * EPS);
    // Normal equations square the condition number (same problem, computed in this test).
    const ne = solve(X.transpose().mmul(X), X.transpose().mmul(Matrix.columnVector(y))).getColumn(0);
    expect(err(ne)).toBeGreaterThan(1000 * err(qr.coefficients));
    // Every coefficient to at least 5 significant digits.
    qr.coefficients.forEach((b, j) => expect(Math.abs(b - [1, 2, 3, 4][j]!) / [1, 2, 3, 4][j]!).toBeLessThan(1e-5));
  });
  it("recovers Wampler-1-style data y = Σ x^j (j = 0…5), x = 0…20, coefficients all exactly 1", () => {
    // Same construction as NIST StRD Wampler1 (certified values 1 exactly), derived in this test.
    const { X, y, kappa, err, m, n } = problem(Array.from({ length: 21 }, (_, i) => i), [1, 1, 1, 1, 1, 1]);
    const qr = leastSquaresQR(X, y);
    expect(err(qr.coefficients)).toBeLessThan(m * n * kappa * EPS);
    qr.coefficients.forEach((b) => expect(b).toBeCloseTo(1, 8));
  });
  it("reports an exactly dependent column as aliased instead of fitting it", () => {
    const X = new Matrix([[1, 1, 2], [1, 2, 4], [1, 3, 6], [1, 4, 8]]); // column 3 = 2 × column 2
    const fit = leastSquaresQR(X, [1, 2, 3, 5]);
    expect(fit.aliased).toEqual([2]);
    expect(fit.kept).toEqual([0, 1]);
  });
});
