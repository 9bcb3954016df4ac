/**
 * Canonical analysis of a fitted second-order model (Box & Wilson 1951; Myers,
 * Montgomery & Anderson-Cook, Response Surface Methodology, §6.3): writing
 * ŷ = b0 + x'b + x'Bx with B symmetric (B_ii = b_ii, B_ij = b_ij/2), the stationary
 * point is x_s = −½B⁻¹b with ŷ_s = b0 + ½x_s'b, and the eigenvalues of B classify the
 * surface: all negative a maximum, all positive a minimum, mixed signs a saddle; an
 * eigenvalue near zero (|λ| < 0.01·max|λ|, common practice) a ridge.
 */
import { EigenvalueDecomposition, Matrix } from "ml-matrix";
import type { Term } from "../stats/model-terms";

export type SurfaceKind = "maximum" | "minimum" | "saddle" | "ridge";

/** Relative size below which an eigenvalue counts as zero (common practice). */
export const RIDGE_TOLERANCE = 0.01;

/** The result of canonical analysis in coded units. */
export interface CanonicalCoded {
  /** Stationary point in coded units, null when B is singular. */
  stationaryPoint: number[] | null;
  /** ŷ at the stationary point (model scale), null when there is none. */
  predicted: number | null;
  /** Eigenvalues of B, ascending. */
  eigenvalues: number[];
  /** Eigenvectors (columns, matching eigenvalues), each as an array over the factors. */
  eigenvectors: number[][];
  kind: SurfaceKind;
}

/** Splits a second-order model into b0, b and B; null when a term has degree > 2. */
export function quadraticParts(terms: readonly Term[], coefficients: readonly number[], k: number): { b0: number; b: number[]; B: number[][] } | null {
  let b0 = 0;
  const b = new Array<number>(k).fill(0);
  const B: number[][] = Array.from({ length: k }, () => new Array<number>(k).fill(0));
  for (let t = 0; t < terms.length; t++) {
    const e = terms[t]!.exponents;
    const c = coefficients[t]!;
    const idx: number[] = [];
    let deg = 0;
    e.forEach((v, i) => {
      if (v > 0) idx.push(i);
      deg += v;
    });
    if (deg === 0) b0 += c;
    else if (deg === 1) b[idx[0]!]! += c;
    else if (deg === 2 && idx.length === 1) B[idx[0]!]![idx[0]!]! += c;
    else if (deg === 2) {
      B[idx[0]!]![idx[1]!]! += c / 2;
      B[idx[1]!]![idx[0]!]! += c / 2;
    } else return null;
  }
  return { b0, b, B };
}

/**
 * Canonical analysis of the model given by terms and coefficients over k coded
 * factors. Returns null when a term has degree above two. Uses ml-matrix's symmetric
 * eigen decomposition.
 */
export function canonicalAnalysis(terms: readonly Term[], coefficients: readonly number[], k: number): CanonicalCoded | null {
  const parts = quadraticParts(terms, coefficients, k);
  if (!parts) return null;
  const { b0, b, B } = parts;
  const evd = new EigenvalueDecomposition(new Matrix(B), { assumeSymmetric: true });
  const lam = evd.realEigenvalues;
  const V = evd.eigenvectorMatrix;
  const order = lam.map((v, i) => ({ v, i })).sort((a, c) => a.v - c.v);
  const eigenvalues = order.map((o) => o.v);
  const eigenvectors = order.map((o) => V.getColumn(o.i));
  const maxAbs = Math.max(...eigenvalues.map(Math.abs));
  let kind: SurfaceKind;
  if (maxAbs === 0 || eigenvalues.some((v) => Math.abs(v) < RIDGE_TOLERANCE * maxAbs)) kind = "ridge";
  else if (eigenvalues.every((v) => v < 0)) kind = "maximum";
  else if (eigenvalues.every((v) => v > 0)) kind = "minimum";
  else kind = "saddle";
  // x_s = −½ B⁻¹ b = −½ Σ v (v·b)/λ
  let stationaryPoint: number[] | null = null;
  let predicted: number | null = null;
  if (maxAbs > 0 && eigenvalues.every((v) => Math.abs(v) > 1e-12 * maxAbs)) {
    const xs = new Array<number>(k).fill(0);
    order.forEach((o, j) => {
      const v = eigenvectors[j]!;
      const proj = v.reduce((s, vi, i) => s + vi * b[i]!, 0);
      for (let i = 0; i < k; i++) xs[i]! += (-0.5 * v[i]! * proj) / o.v;
    });
    stationaryPoint = xs;
    predicted = b0 + 0.5 * xs.reduce((s, x, i) => s + x * b[i]!, 0);
  }
  return { stationaryPoint, predicted, eigenvalues, eigenvectors, kind };
}
