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

/** Ridge subtypes (Myers, Montgomery & Anderson-Cook, §6.4, from memory): see `describeCanonical`. */
export type RidgeKind = "stationary" | "rising" | "falling";

/** A direction of the canonical axes in words. */
export interface CanonicalDirection {
  eigenvalue: number;
  /** Unit eigenvector in coded units, by factor name. */
  vector: Record<string, number>;
  /** e.g. "temperature up with time down (0.81 : −0.59 in coded units)". */
  words: string;
}

/** The canonical analysis said in words. */
export interface CanonicalWords {
  kind: SurfaceKind;
  ridge: RidgeKind | null;
  /** Whether the stationary point lies inside the studied region (null when there is none). */
  stationaryInside: boolean | null;
  description: string;
  directions: CanonicalDirection[];
}

/** How a factor's coded loading in a direction reads; loadings under 0.25 of the largest are left out. */
function directionWords(v: readonly number[], names: readonly string[]): string {
  const maxAbs = Math.max(...v.map(Math.abs));
  const sign = v[v.map(Math.abs).indexOf(maxAbs)]! < 0 ? -1 : 1; // the largest loading reads "up"
  const parts: string[] = [];
  const ratios: string[] = [];
  v.forEach((x, i) => {
    const w = sign * x;
    if (Math.abs(w) < 0.25 * maxAbs) return;
    parts.push(`${names[i]!} ${w > 0 ? "up" : "down"}`);
    ratios.push((Math.round(w * 100) / 100).toFixed(2).replace("-", "−"));
  });
  const text = parts.length === 1 ? parts[0]! : `${parts.slice(0, -1).join(", ")} with ${parts[parts.length - 1]!}`;
  return parts.length === 1 ? text : `${text} (${ratios.join(" : ")} in coded units)`;
}

/**
 * The canonical analysis in words for a chemist (Box & Wilson 1951; Myers, Montgomery &
 * Anderson-Cook, Response Surface Methodology, §6.3–6.4 on canonical analysis and ridge
 * systems): a maximum, a minimum or a saddle at the stationary point (given in natural
 * units, said to be inside or outside the studied region), or a ridge when an
 * eigenvalue is near zero — a stationary ridge when the stationary point lies inside
 * the studied region (many conditions along the ridge give about the same response), a
 * rising ridge (the other eigenvalues negative: the response keeps rising along the
 * ridge out of the region) or a falling ridge (the other eigenvalues positive) when it
 * lies outside or does not exist; and along which factors each canonical axis runs.
 * `stationaryNatural` formats the stationary point; `inside` says whether a coded point
 * lies in the studied region.
 */
export function describeCanonical(
  ca: CanonicalCoded,
  names: readonly string[],
  stationaryNatural: (x: readonly number[]) => string,
  inside: (x: readonly number[]) => boolean,
): CanonicalWords {
  const maxAbs = Math.max(...ca.eigenvalues.map(Math.abs));
  const directions: CanonicalDirection[] = ca.eigenvalues.map((lam, j) => ({
    eigenvalue: lam,
    vector: Object.fromEntries(names.map((n, i) => [n, ca.eigenvectors[j]![i]!])),
    words: directionWords(ca.eigenvectors[j]!, names),
  }));
  const sp = ca.stationaryPoint;
  const stationaryInside = sp ? inside(sp) : null;
  const where = sp ? `${stationaryNatural(sp)} (${stationaryInside ? "inside" : "outside"} the studied region)` : "";
  const flat = directions.filter((d) => maxAbs === 0 || Math.abs(d.eigenvalue) < RIDGE_TOLERANCE * maxAbs);
  const up = directions.filter((d) => !flat.includes(d) && d.eigenvalue > 0);
  const down = directions.filter((d) => !flat.includes(d) && d.eigenvalue < 0);
  const list = (ds: CanonicalDirection[]) => ds.map((d) => d.words).join("; and along ");
  let ridge: RidgeKind | null = null;
  let description: string;
  switch (ca.kind) {
    case "maximum":
      description = `The fitted surface has a maximum at ${where}. The response falls away from it fastest along ${down[0]!.words}${down.length > 1 ? ` and slowest along ${down[down.length - 1]!.words}` : ""}.`;
      break;
    case "minimum":
      description = `The fitted surface has a minimum at ${where}. The response rises away from it fastest along ${up[up.length - 1]!.words}${up.length > 1 ? ` and slowest along ${up[0]!.words}` : ""}.`;
      break;
    case "saddle":
      description = `The fitted surface is a saddle (minimax) at ${where}: from there the response rises along ${list(up)}, and falls along ${list(down)}.`;
      break;
    case "ridge": {
      const along = list(flat);
      if (sp && stationaryInside) {
        ridge = "stationary";
        description = `The fitted surface is a stationary ridge through ${where}: along ${along} the response hardly changes, so many conditions along that line give about the same response.`;
      } else if (up.length === 0 && down.length > 0) {
        ridge = "rising";
        description = `The fitted surface is a rising ridge: the response keeps rising along ${along} out of the studied region${sp ? `; its stationary point is at ${where}` : ""}. The best conditions inside the region lie on its boundary, and a further design along that direction may pay.`;
      } else if (down.length === 0 && up.length > 0) {
        ridge = "falling";
        description = `The fitted surface is a falling ridge: the response keeps falling along ${along} out of the studied region${sp ? `; its stationary point is at ${where}` : ""}.`;
      } else {
        description = `The fitted surface is nearly flat along ${along}${up.length ? `, rises along ${list(up)}` : ""}${down.length ? `, falls along ${list(down)}` : ""}.`;
      }
      break;
    }
  }
  return { kind: ca.kind, ridge, stationaryInside, description, directions };
}
