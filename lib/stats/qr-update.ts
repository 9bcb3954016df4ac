/**
 * A least-squares fit that loses columns one at a time without touching the n rows
 * again: the triangular factor R (p×p) of X = QR and z = Q'y are kept, and deleting a
 * column restores R to triangular form by Givens rotations applied to R and z (Golub &
 * Van Loan, Matrix Computations, 4th ed., §6.5 "Updating matrix factorizations",
 * deleting a column — section number from memory). The rotated-out component of z
 * joins the residual sum of squares. O(p²) per deletion; the coefficients and their
 * variances then cost one p×p back-substitution.
 */
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
   * Deletes the column at position `pos` (0-based among the current columns): shifts
   * the later columns left, then zeroes the subdiagonal with Givens rotations on rows
   * (j, j+1), j = pos … size−2, applied to z too; z's last entry leaves into the RSS.
   */
  remove(pos: number): void {
    const s = this.size;
    if (!(pos >= 0 && pos < s)) throw new RangeError(`no column at position ${pos}`);
    const { R, z, stride: m } = this;
    for (let i = 0; i < s; i++) for (let j = pos; j < s - 1; j++) R[i * m + j] = R[i * m + j + 1]!;
    for (let i = 0; i < s; i++) R[i * m + s - 1] = 0;
    for (let j = pos; j < s - 1; j++) {
      const a = R[j * m + j]!;
      const b = R[(j + 1) * m + j]!;
      const r = Math.hypot(a, b);
      if (r === 0) continue;
      const c = a / r;
      const sn = b / r;
      for (let k = j; k < s - 1; k++) {
        const u = R[j * m + k]!;
        const v = R[(j + 1) * m + k]!;
        R[j * m + k] = c * u + sn * v;
        R[(j + 1) * m + k] = -sn * u + c * v;
      }
      R[(j + 1) * m + j] = 0;
      const zu = z[j]!;
      const zv = z[j + 1]!;
      z[j] = c * zu + sn * zv;
      z[j + 1] = -sn * zu + c * zv;
    }
    this.rss += z[s - 1]! ** 2;
    z[s - 1] = 0;
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
