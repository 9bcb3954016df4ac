/**
 * Ordinary least squares by Householder QR with column scaling (Golub & Van Loan,
 * Matrix Computations, 4th ed., §5.2.2 Householder QR, Algorithm 5.2.1, and §5.3 on
 * least squares; Björck, Numerical Methods for Least Squares Problems, §2.8 on
 * equilibration): each column is divided by its Euclidean norm before the
 * factorisation, and the coefficients are rescaled afterwards. The normal equations
 * are never formed. A column whose scaled R diagonal |r_jj| (its distance from the
 * span of the earlier columns) falls below `tol` is reported as aliased and left out.
 * The factorisation is ml-matrix's QrDecomposition; column-major Float64Array inputs
 * are accepted for the callers that build their model matrix that way.
 */
import { Matrix, QrDecomposition } from "ml-matrix";

/** Default aliasing tolerance on the scaled R diagonal. */
export const ALIAS_TOLERANCE = 1e-10;

/**
 * A Householder QR factorisation of a column-scaled matrix, Xs = X·diag(norms)⁻¹ = Q·R,
 * computed by ml-matrix's QrDecomposition (Q kept implicitly as its reflectors).
 */
export interface ScaledQr {
  n: number;
  p: number;
  /** Scaled X, row-major (n×p). */
  Xs: Float64Array;
  /** R of the scaled matrix, p×p row-major, upper triangular. */
  R: Float64Array;
  norms: number[];
  qr: QrDecomposition;
}

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
  /** The factorisation of the kept columns, for refitting subsets cheaply. */
  qr: ScaledQr;
  /** z = Q'y. */
  z: number[];
}

/**
 * Column-scaled Householder QR of an n×p matrix given column-major (left unchanged):
 * each column divided by its Euclidean norm, then factorised by ml-matrix.
 */
function scaledQrOf(A: Float64Array, n: number, p: number): ScaledQr {
  const norms: number[] = [];
  const scaled = new Matrix(n, p);
  const Xs = new Float64Array(n * p);
  for (let j = 0; j < p; j++) {
    const o = j * n;
    let s = 0;
    for (let i = 0; i < n; i++) s += A[o + i]! ** 2;
    const d = s > 0 ? Math.sqrt(s) : 1;
    norms.push(d);
    for (let i = 0; i < n; i++) {
      const v = A[o + i]! / d;
      scaled.set(i, j, v);
      Xs[i * p + j] = v;
    }
  }
  const qr = new QrDecomposition(scaled);
  const Rm = qr.upperTriangularMatrix;
  const R = new Float64Array(p * p);
  const rows = Math.min(n, p);
  for (let i = 0; i < rows; i++) for (let j = i; j < p; j++) R[i * p + j] = Rm.get(i, j);
  return { n, p, Xs, R, norms, qr };
}

/** Column-scaled Householder QR of X (ml-matrix's QrDecomposition). */
export function scaledQr(X: Matrix): ScaledQr {
  const n = X.rows;
  const p = X.columns;
  const A = new Float64Array(n * p);
  for (let j = 0; j < p; j++) for (let i = 0; i < n; i++) A[j * n + i] = X.get(i, j);
  return scaledQrOf(A, n, p);
}

/** The scaled least-squares solution bs (ml-matrix `solve`: Q'y, then R·bs = (Q'y)[0..p)). */
function solveScaled(f: ScaledQr, y: readonly number[]): number[] {
  return f.qr.solve(Matrix.columnVector([...y])).getColumn(0);
}

function upperInverse(R: Float64Array, p: number): Float64Array {
  const inv = new Float64Array(p * p);
  for (let j = 0; j < p; j++) {
    inv[j * p + j] = 1 / R[j * p + j]!;
    for (let i = j - 1; i >= 0; i--) {
      let s = 0;
      for (let k = i + 1; k <= j; k++) s += R[i * p + k]! * inv[k * p + j]!;
      inv[i * p + j] = -s / R[i * p + i]!;
    }
  }
  return inv;
}

/**
 * Solves the least-squares problem from a factorisation (all columns estimable): the
 * scaled coefficients by applying the Householder reflectors to y and back-substituting.
 */
function solveFactored(f: ScaledQr, y: readonly number[], kept: number[], aliased: number[], diagnostics = true): LeastSquaresFit {
  return finishFit(f, solveScaled(f, y), y, kept, aliased, diagnostics);
}

/**
 * Everything else from the scaled solution bs: z = Q'y as R·bs, (X'X)⁻¹ = D⁻¹R⁻¹R⁻ᵀD⁻¹,
 * fitted values, residuals, and leverages hᵢ = ‖R⁻ᵀxᵢ‖² (xᵢ the scaled row). Without
 * `diagnostics`, only z, the coefficients, the fitted values, the residuals and the RSS
 * (covUnscaled and leverage left empty): what a fit about to be pruned needs.
 */
function finishFit(f: ScaledQr, bs: number[], y: readonly number[], kept: number[], aliased: number[], diagnostics = true): LeastSquaresFit {
  const { n, p, Xs, R, norms } = f;
  const z = new Array<number>(p).fill(0);
  for (let i = 0; i < p; i++) {
    let s = 0;
    for (let j = i; j < p; j++) s += R[i * p + j]! * bs[j]!;
    z[i] = s;
  }
  const coefficients = bs.map((b, i) => b / norms[i]!);
  if (!diagnostics) {
    const fitted = new Array<number>(n);
    const residuals = new Array<number>(n);
    let rss = 0;
    for (let i = 0; i < n; i++) {
      let fv = 0;
      for (let j = 0; j < p; j++) fv += Xs[i * p + j]! * bs[j]!;
      fitted[i] = fv;
      residuals[i] = y[i]! - fv;
      rss += residuals[i]! ** 2;
    }
    return { kept, aliased, coefficients, covUnscaled: [], fitted, residuals, leverage: [], rss, qr: f, z };
  }
  const Rinv = upperInverse(R, p);
  // (X'X)⁻¹ = D⁻¹ R⁻¹ R⁻ᵀ D⁻¹
  const covUnscaled: number[][] = Array.from({ length: p }, () => new Array<number>(p).fill(0));
  for (let i = 0; i < p; i++)
    for (let j = i; j < p; j++) {
      let s = 0;
      for (let k = j; k < p; k++) s += Rinv[i * p + k]! * Rinv[j * p + k]!;
      const v = s / (norms[i]! * norms[j]!);
      covUnscaled[i]![j] = v;
      covUnscaled[j]![i] = v;
    }
  const fitted = new Array<number>(n).fill(0);
  const residuals = new Array<number>(n).fill(0);
  const leverage = new Array<number>(n).fill(0);
  const w = new Float64Array(p);
  let rss = 0;
  for (let i = 0; i < n; i++) {
    const o = i * p;
    let fv = 0;
    let h = 0;
    // w = R⁻ᵀ xᵢ by forward substitution; hᵢ = ‖w‖²
    for (let j = 0; j < p; j++) {
      const xij = Xs[o + j]!;
      fv += xij * bs[j]!;
      let s = xij;
      for (let k = 0; k < j; k++) s -= R[k * p + j]! * w[k]!;
      const wj = s / R[j * p + j]!;
      w[j] = wj;
      h += wj * wj;
    }
    fitted[i] = fv;
    residuals[i] = y[i]! - fv;
    leverage[i] = h;
    rss += residuals[i]! ** 2;
  }
  return { kept, aliased, coefficients, covUnscaled, fitted, residuals, leverage, rss, qr: f, z };
}

/** Splits columns into kept and aliased by the scaled R diagonal of one QR pass. */
export function findAliasedColumns(X: Matrix, tol = ALIAS_TOLERANCE): { kept: number[]; aliased: number[] } {
  const f = scaledQr(X);
  return splitByDiagonal(f, tol);
}

function splitByDiagonal(f: ScaledQr, tol: number): { kept: number[]; aliased: number[] } {
  const kept: number[] = [];
  const aliased: number[] = [];
  for (let j = 0; j < f.p; j++) (Math.abs(f.R[j * f.p + j]!) < tol ? aliased : kept).push(j);
  return { kept, aliased };
}

/**
 * Fits y ≈ Xb by column-scaled Householder QR. Aliased columns (|r_jj| <
 * tol after scaling) are dropped and reported, and the rest refitted. Throws
 * RangeError when X and y disagree in length or X has no estimable column.
 * Example: leastSquaresQR(new Matrix([[1,0],[1,1],[1,2]]), [1,3,5]).coefficients → [1, 2]
 */
export function leastSquaresQR(X: Matrix, y: readonly number[], tol = ALIAS_TOLERANCE): LeastSquaresFit {
  const n = X.rows;
  const p = X.columns;
  const A = new Float64Array(n * p);
  for (let j = 0; j < p; j++) for (let i = 0; i < n; i++) A[j * n + i] = X.get(i, j);
  return leastSquaresColumns(A, n, p, y, tol);
}

/**
 * As `leastSquaresQR`, for an n×p matrix given column-major (left unchanged). With
 * `diagnostics: false` the fit carries no (X'X)⁻¹ and no leverages — for a full model
 * that backward elimination will reduce (fullFitOfSubset then gives them for the
 * model kept). Throws RangeError as `leastSquaresQR`.
 */
export function leastSquaresColumns(A: Float64Array, n: number, p: number, y: readonly number[], tol = ALIAS_TOLERANCE, options: { diagnostics?: boolean } = {}): LeastSquaresFit {
  if (n !== y.length) throw new RangeError(`X has ${n} rows but y has ${y.length} values`);
  if (A.length !== n * p) throw new RangeError(`X should hold ${n}×${p} values`);
  let f = scaledQrOf(A, n, p);
  const { kept, aliased } = splitByDiagonal(f, tol);
  if (kept.length === 0) throw new RangeError("no estimable column");
  if (aliased.length) {
    const sub = new Float64Array(n * kept.length);
    kept.forEach((c, j) => sub.set(A.subarray(c * n, (c + 1) * n), j * n));
    f = scaledQrOf(sub, n, kept.length);
  }
  return solveFactored(f, y, kept, aliased, options.diagnostics ?? true);
}

/** Columns `cols` of the p×p upper-triangular R of the unscaled columns (R·diag(norms)), column-major. */
function unscaledRColumns(f: ScaledQr, cols: readonly number[]): Float64Array {
  const { p, R, norms } = f;
  const A = new Float64Array(p * cols.length);
  cols.forEach((c, j) => {
    for (let i = 0; i <= c; i++) A[j * p + i] = R[i * p + c]! * norms[c]!;
  });
  return A;
}

/**
 * The full fit (fitted values, residuals, leverages) of a column subset S, from the
 * parent factorisation without a new n-row QR: R_S = Q₂R₂ gives X_S = (Q·Q₂)R₂, so R₂
 * (with the column norms of R_S, equal to those of X_S) is the R of X_S. `cols` index
 * the parent fit's kept columns. Throws RangeError when the subset is rank deficient.
 */
export function fullFitOfSubset(fit: LeastSquaresFit, cols: readonly number[], y: readonly number[]): LeastSquaresFit {
  const parent = fit.qr;
  const small = scaledQrOf(unscaledRColumns(parent, cols), parent.p, cols.length);
  const s = cols.length;
  for (let j = 0; j < s; j++) if (Math.abs(small.R[j * s + j]!) < ALIAS_TOLERANCE) throw new RangeError("subset is rank deficient");
  const bs = solveScaled(small, fit.z);
  const { n, p } = parent;
  const Xs = new Float64Array(n * s);
  for (let i = 0; i < n; i++)
    for (let j = 0; j < s; j++) {
      const c = cols[j]!;
      Xs[i * s + j] = (parent.Xs[i * p + c]! * parent.norms[c]!) / small.norms[j]!;
    }
  const f: ScaledQr = { n, p: s, Xs, R: small.R, norms: small.norms, qr: small.qr };
  return finishFit(f, bs, y, cols.map((c) => fit.kept[c]!), []);
}
