/**
 * A least-squares fit that loses columns one at a time without touching the n rows
 * again: the triangular factor R (p×p) of X = QR and z = Q'y are kept, and deleting a
 * column re-triangularises the p×(p−1) remainder (Golub & Van Loan, Matrix
 * Computations, 4th ed., §6.5 "Updating matrix factorizations", deleting a column —
 * section number from memory; the small factorisation is ml-matrix's). The part of z
 * that leaves joins the residual sum of squares. O(p³) per deletion with p ≤ ~30,
 * independent of n; the coefficients and their variances then cost one p×p
 * back-substitution.
 */
import { Matrix, QrDecomposition } from "ml-matrix";
import type { LeastSquaresFit } from "./least-squares";

/** The column-deleting QR of a fit: starts from the fit's scaled R and Q'y. */
export class ShrinkingQr {
  /** Row-major with stride `stride`; the leading size×size block is upper triangular. */
  private readonly R: Float64Array;
  private readonly z: Float64Array;
  private readonly stride: number;
  private readonly norms: number[];
  /** The fit's column (index into fit.kept order) of each current column. */
  readonly columns: number[];
  /** Residual sum of squares of the current columns. */
  rss: number;

  /** Starts from a fit (all its kept columns). */
  constructor(fit: LeastSquaresFit) {
    const p = fit.qr.p;
    this.stride = p;
    this.R = Float64Array.from(fit.qr.R);
    this.z = Float64Array.from(fit.z);
    this.norms = [...fit.qr.norms];
    this.columns = Array.from({ length: p }, (_, j) => j);
    this.rss = fit.rss;
  }

  get size(): number {
    return this.columns.length;
  }

  /**
   * Deletes the column at position `pos` (0-based among the current columns): the
   * s×(s−1) matrix R without that column is factorised again (ml-matrix's
   * QrDecomposition — an s×s problem, never the n rows), which gives the new triangle
   * R₂ and the new head of z; the part of z that R₂'s span no longer reaches joins the
   * RSS.
   */
  remove(pos: number): void {
    const s = this.size;
    if (!(pos >= 0 && pos < s)) throw new RangeError(`no column at position ${pos}`);
    const { R, z, stride: m } = this;
    const M = new Matrix(s, s - 1);
    for (let i = 0; i < s; i++) for (let j = 0; j < s - 1; j++) M.set(i, j, R[i * m + (j < pos ? j : j + 1)]!);
    const zHead = Array.from(z.subarray(0, s));
    const qr = new QrDecomposition(M);
    const b = qr.solve(Matrix.columnVector(zHead)).getColumn(0);
    const R2 = qr.upperTriangularMatrix;
    let lost = 0;
    for (let i = 0; i < s; i++) {
      let mb = 0;
      for (let j = 0; j < s - 1; j++) mb += M.get(i, j) * b[j]!;
      lost += (zHead[i]! - mb) ** 2;
    }
    for (let i = 0; i < s; i++) for (let j = 0; j < s; j++) R[i * m + j] = i < s - 1 && j < s - 1 && j >= i ? R2.get(i, j) : 0;
    for (let i = 0; i < s - 1; i++) {
      let v = 0;
      for (let j = i; j < s - 1; j++) v += R2.get(i, j) * b[j]!;
      z[i] = v;
    }
    z[s - 1] = 0;
    this.rss += lost;
    this.columns.splice(pos, 1);
    this.norms.splice(pos, 1);
  }

  /**
   * The coefficients of the current columns (unscaled) and the diagonal of
   * (X_S'X_S)⁻¹, from R⁻¹ by back-substitution: var_j ∝ ‖row j of R⁻¹‖² / norm_j².
   */
  solve(): { coefficients: number[]; covDiagonal: number[] } {
    const s = this.size;
    const { R, z, stride: m } = this;
    const inv = new Float64Array(s * s);
    for (let j = 0; j < s; j++) {
      inv[j * s + j] = 1 / R[j * m + j]!;
      for (let i = j - 1; i >= 0; i--) {
        let acc = 0;
        for (let k = i + 1; k <= j; k++) acc += R[i * m + k]! * inv[k * s + j]!;
        inv[i * s + j] = -acc / R[i * m + i]!;
      }
    }
    const coefficients = new Array<number>(s);
    const covDiagonal = new Array<number>(s);
    for (let i = 0; i < s; i++) {
      let b = 0;
      let d = 0;
      for (let k = i; k < s; k++) {
        b += inv[i * s + k]! * z[k]!;
        d += inv[i * s + k]! ** 2;
      }
      const nrm = this.norms[i]!;
      coefficients[i] = b / nrm;
      covDiagonal[i] = d / (nrm * nrm);
    }
    return { coefficients, covDiagonal };
  }
}
