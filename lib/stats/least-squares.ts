/**
 * Ordinary least squares by Householder QR with column scaling (Golub & Van Loan,
 * Matrix Computations, §5.3; Björck, Numerical Methods for Least Squares Problems,
 * §2.8 on equilibration): each column is divided by its Euclidean norm before the
 * factorisation and the coefficients are rescaled afterwards. The normal equations
 * are never formed. A column whose scaled R diagonal |r_jj| (its distance from the
 * span of the earlier columns) falls below `tol` is reported as aliased and left out.
 */
import { Matrix, QrDecomposition } from "ml-matrix";

/** The least-squares fit of y on the columns of X that are estimable, in column order. */
export interface LeastSquaresFit {
  /** Column indices used (not aliased), ascending. */
  kept: number[];
  /** Column indices left out as linear combinations of earlier columns. */
  aliased: number[];
  /** Coefficients of the kept columns. */
  coefficients: number[];
  /** (X'X)⁻¹ for the kept columns (kept × kept), from R⁻¹R⁻ᵀ. */
  covUnscaled: number[][];
  fitted: number[];
  residuals: number[];
  /** Diagonal of the hat matrix, hᵢ = ‖Qᵢ‖². */
  leverage: number[];
  rss: number;
}

/** Default aliasing tolerance on the scaled R diagonal. */
export const ALIAS_TOLERANCE = 1e-10;

function upperInverse(R: Matrix): number[][] {
  const n = R.rows;
  const inv: number[][] = Array.from({ length: n }, () => new Array<number>(n).fill(0));
  for (let j = 0; j < n; j++) {
    inv[j]![j] = 1 / R.get(j, j);
    for (let i = j - 1; i >= 0; i--) {
      let s = 0;
      for (let k = i + 1; k <= j; k++) s += R.get(i, k) * inv[k]![j]!;
      inv[i]![j] = -s / R.get(i, i);
    }
  }
  return inv;
}

/** Splits columns into kept and aliased by the scaled R diagonal of one QR pass. */
export function findAliasedColumns(X: Matrix, tol = ALIAS_TOLERANCE): { kept: number[]; aliased: number[] } {
  const { scaled } = scaleColumns(X);
  const qr = new QrDecomposition(scaled);
  const R = qr.upperTriangularMatrix;
  const kept: number[] = [];
  const aliased: number[] = [];
  for (let j = 0; j < X.columns; j++) (Math.abs(R.get(j, j)) < tol ? aliased : kept).push(j);
  return { kept, aliased };
}

function scaleColumns(X: Matrix): { scaled: Matrix; norms: number[] } {
  const norms: number[] = [];
  const scaled = X.clone();
  for (let j = 0; j < X.columns; j++) {
    let s = 0;
    for (let i = 0; i < X.rows; i++) s += X.get(i, j) ** 2;
    const nrm = Math.sqrt(s);
    norms.push(nrm > 0 ? nrm : 1);
    if (nrm > 0) for (let i = 0; i < X.rows; i++) scaled.set(i, j, X.get(i, j) / nrm);
  }
  return { scaled, norms };
}

/**
 * Fits y ≈ Xb by column-scaled Householder QR (ml-matrix). Aliased columns (|r_jj| <
 * tol after scaling) are dropped and reported. Throws RangeError when X and y
 * disagree in length or X has no estimable column.
 * Example: leastSquaresQR(new Matrix([[1,0],[1,1],[1,2]]), [1,3,5]).coefficients → [1, 2]
 */
export function leastSquaresQR(X: Matrix, y: readonly number[], tol = ALIAS_TOLERANCE): LeastSquaresFit {
  if (X.rows !== y.length) throw new RangeError(`X has ${X.rows} rows but y has ${y.length} values`);
  const { kept, aliased } = findAliasedColumns(X, tol);
  if (kept.length === 0) throw new RangeError("no estimable column");
  const Xk = aliased.length ? X.subMatrixColumn(kept) : X;
  const { scaled, norms } = scaleColumns(Xk);
  const qr = new QrDecomposition(scaled);
  const Q = qr.orthogonalMatrix; // n × p (thin)
  const R = qr.upperTriangularMatrix;
  const n = X.rows;
  const p = kept.length;
  // z = Q'y, b_scaled = R⁻¹ z
  const z = new Array<number>(p).fill(0);
  for (let j = 0; j < p; j++) {
    let s = 0;
    for (let i = 0; i < n; i++) s += Q.get(i, j) * y[i]!;
    z[j] = s;
  }
  const Rinv = upperInverse(R);
  const coefficients = new Array<number>(p).fill(0);
  for (let i = 0; i < p; i++) {
    let s = 0;
    for (let j = i; j < p; j++) s += Rinv[i]![j]! * z[j]!;
    coefficients[i] = s / norms[i]!;
  }
  // (X'X)⁻¹ = D⁻¹ R⁻¹ R⁻ᵀ D⁻¹
  const covUnscaled: number[][] = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (let i = 0; i < p; i++)
    for (let j = i; j < p; j++) {
      let s = 0;
      for (let k = j; k < p; k++) s += Rinv[i]![k]! * Rinv[j]![k]!;
      const v = s / (norms[i]! * norms[j]!);
      covUnscaled[i]![j] = v;
      covUnscaled[j]![i] = v;
    }
  const fitted = new Array<number>(n).fill(0);
  const residuals = new Array<number>(n).fill(0);
  const leverage = new Array<number>(n).fill(0);
  let rss = 0;
  for (let i = 0; i < n; i++) {
    let f = 0;
    let h = 0;
    for (let j = 0; j < p; j++) {
      const q = Q.get(i, j);
      f += q * z[j]!;
      h += q * q;
    }
    fitted[i] = f;
    residuals[i] = y[i]! - f;
    leverage[i] = h;
    rss += residuals[i]! ** 2;
  }
  return { kept, aliased, coefficients, covUnscaled, fitted, residuals, leverage, rss };
}

/**
 * The reduced least-squares problem of a fit: R (p×p, unscaled columns) and z = Q'y,
 * so that for any subset S of columns ‖y − X_S b‖² = ‖z − R_S b‖² + rss_full.
 * Lets backward elimination refit p-column subproblems instead of n-row ones.
 */
export interface ReducedProblem {
  R: Matrix;
  z: number[];
  rssFull: number;
}

/** Builds the reduced problem from X (full column rank) and y by column-scaled QR. */
export function reduceProblem(X: Matrix, y: readonly number[]): ReducedProblem {
  const { scaled, norms } = scaleColumns(X);
  const qr = new QrDecomposition(scaled);
  const Q = qr.orthogonalMatrix;
  const Rs = qr.upperTriangularMatrix;
  const p = X.columns;
  const n = X.rows;
  const z = new Array<number>(p).fill(0);
  for (let j = 0; j < p; j++) {
    let s = 0;
    for (let i = 0; i < n; i++) s += Q.get(i, j) * y[i]!;
    z[j] = s;
  }
  // Unscale R's columns: X = Q R_s D ⇒ R = R_s D.
  const R = new Matrix(p, p);
  for (let i = 0; i < p; i++) for (let j = i; j < p; j++) R.set(i, j, Rs.get(i, j) * norms[j]!);
  // rss_full from the residual itself (not ‖y‖² − ‖z‖², which cancels digits).
  let rss = 0;
  for (let i = 0; i < n; i++) {
    let f = 0;
    for (let j = 0; j < p; j++) f += Q.get(i, j) * z[j]!;
    rss += (y[i]! - f) ** 2;
  }
  return { R, z, rssFull: rss };
}

/** Fits a column subset on the reduced problem: coefficients, (X_S'X_S)⁻¹ and the RSS. */
export function fitReducedSubset(rp: ReducedProblem, cols: readonly number[]): { coefficients: number[]; covUnscaled: number[][]; rss: number } {
  const A = rp.R.subMatrixColumn([...cols]);
  const sub = leastSquaresQR(A, rp.z);
  if (sub.aliased.length) throw new RangeError("subset is rank deficient");
  return { coefficients: sub.coefficients, covUnscaled: sub.covUnscaled, rss: rp.rssFull + sub.rss };
}
