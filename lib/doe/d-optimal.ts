/**
 * Exact D-optimal designs by candidate exchange.
 *
 * The search (`fedorovExchange`): from each of several seeded starting designs, the
 * modified Fedorov exchange of Cook & Nachtsheim ("A comparison of algorithms for
 * constructing exact D-optimal designs", Technometrics 22, 1980) to a local optimum,
 * then a tabu search over the same exchanges (Glover, "Tabu search — Part I", ORSA
 * Journal on Computing 1, 1989) to leave that optimum, then Fedorov again from the best
 * design seen; the best design of all starts is kept. Plain multi-start Fedorov stalls
 * at about 0.96–0.98 of the best known D-criterion on a 6-factor quadratic (bench/doe);
 * the tabu phase is what reaches it.
 *
 * Fedorov's determinant formula (Theory of Optimal Experiments, 1972): replacing the
 * design point xᵢ by the candidate xⱼ multiplies det(X'X) by
 *     1 + Δ(xᵢ, xⱼ),  Δ = d(xⱼ) − d(xᵢ) − [d(xᵢ)·d(xⱼ) − d(xᵢ, xⱼ)²],
 * with d(a, b) = f(a)'(X'X)⁻¹f(b) and d(a) = d(a, a). (X'X)⁻¹, d(xⱼ) for every
 * candidate and the table d(xᵢ, xⱼ) for every design point and candidate are kept
 * current by Sherman–Morrison rank-one updates, so all n·N exchanges are scored in
 * O(n·N) and one exchange costs O(p² + N·p + n·N).
 *
 * The work is bounded (issue 9: a 30-factor request exhausted memory): a request whose
 * table or single exchange pass would exceed `D_OPTIMAL_LIMITS` is refused before any
 * work, and the search stops once `workBudget` multiply-adds are spent. Work is
 * counted, not timed, so a seed gives the same design on any machine.
 */
import { CholeskyDecomposition, Matrix } from "ml-matrix";
import { AppError } from "../errors/app-error";
import { modelRow, type Term } from "../stats/model-terms";
import { seededRng, type Rng } from "./randomize";

/** The bounds of a D-optimal search; `dOptimalWorkCheck` applies them. */
export const D_OPTIMAL_LIMITS = {
  /** Candidate points N (a given list, or the default grid, before constraints). */
  candidates: 20_000,
  /** Model terms p. */
  terms: 120,
  /** Runs n. */
  runs: 1_000,
  /** Entries n·N of the table d(xᵢ, xⱼ) (8 bytes each: 32 MB). */
  table: 4e6,
  /** Multiply-adds of one exchange pass (about 0.2 s on one core of this machine). */
  workPerPass: 3e8,
  /** Multiply-adds of the whole search, all starts (one to two seconds on one core). */
  workBudget: 2e9,
} as const;

/** Default number of seeded starts. */
export const DEFAULT_STARTS = 3;
/** Default limit of exchange passes per descent (a descent stops earlier when no exchange improves). */
export const DEFAULT_MAX_PASSES = 100;
/** Default tabu steps per start. */
export const DEFAULT_TABU_STEPS = 1600;

/** Options of the search. */
export interface DOptimalOptions {
  /** Number of runs n (≥ number of terms p). */
  runs: number;
  /** Seeded starts; the best design is kept (default DEFAULT_STARTS). */
  starts?: number;
  /** Seed of the starting designs and of tie-breaking (default 1). */
  seed?: number | string;
  /** Maximum passes per Fedorov descent (default DEFAULT_MAX_PASSES). */
  maxPasses?: number;
  /** Tabu steps per start (default DEFAULT_TABU_STEPS; 0 gives plain multi-start modified Fedorov). */
  tabuSteps?: number;
  /** Steps a removed candidate stays tabu (default 2n, at most N/4). */
  tabuTenure?: number;
  /** Multiply-adds the whole search may spend (default D_OPTIMAL_LIMITS.workBudget). */
  workBudget?: number;
}

/** The chosen design. */
export interface DOptimalResult {
  /** Indices into the candidate list, one per run (a candidate may repeat). */
  indices: number[];
  /** ln det(X'X). */
  logDet: number;
  /** D-efficiency in %: 100·det(X'X)^(1/p)/n (coded units). */
  dEfficiency: number;
  /** Starts that ran (fewer than asked when the work budget ran out). */
  starts: number;
  /** Multiply-adds spent. */
  work: number;
  /** True when the work budget stopped the search early. */
  stoppedByBudget: boolean;
}

/**
 * Cholesky factorisation (ml-matrix's CholeskyDecomposition) of a symmetric p×p matrix
 * given row-major, or null when it is not positive definite.
 */
export function cholesky(a: Float64Array, p: number): CholeskyDecomposition | null {
  const m = new Matrix(p, p);
  for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) m.set(i, j, a[i * p + j]!);
  const chol = new CholeskyDecomposition(m);
  return chol.isPositiveDefinite() ? chol : null;
}

/** ln det of a symmetric positive-definite matrix (−Infinity when singular): 2 Σ ln L_jj. */
export function logDetSpd(a: Float64Array, p: number): number {
  const chol = cholesky(a, p);
  if (!chol) return -Infinity;
  const L = chol.lowerTriangularMatrix;
  let s = 0;
  for (let j = 0; j < p; j++) s += 2 * Math.log(L.get(j, j));
  return s;
}

/** Inverse of a symmetric positive-definite matrix (row-major) through its Cholesky factorisation, or null. */
export function inverseSpd(a: Float64Array, p: number): Float64Array | null {
  const chol = cholesky(a, p);
  if (!chol) return null;
  const inv = chol.solve(Matrix.eye(p, p));
  const out = new Float64Array(p * p);
  for (let i = 0; i < p; i++)
    for (let j = 0; j <= i; j++) {
      const v = (inv.get(i, j) + inv.get(j, i)) / 2;
      out[i * p + j] = v;
      out[j * p + i] = v;
    }
  return out;
}

/** The information matrix X'X of the rows `indices` of the candidate model matrix F (N×p, row-major). */
export function informationMatrix(F: Float64Array, p: number, indices: ArrayLike<number>): Float64Array {
  const m = new Float64Array(p * p);
  for (let t = 0; t < indices.length; t++) {
    const o = indices[t]! * p;
    for (let i = 0; i < p; i++) {
      const fi = F[o + i]!;
      if (fi === 0) continue;
      for (let j = 0; j <= i; j++) m[i * p + j]! += fi * F[o + j]!;
    }
  }
  for (let i = 0; i < p; i++) for (let j = 0; j < i; j++) m[j * p + i] = m[i * p + j]!;
  return m;
}

/** The candidate model matrix F (N×p, row-major) for coded candidate points. */
export function candidateMatrix(terms: readonly Term[], points: readonly (readonly number[])[]): Float64Array {
  const p = terms.length;
  const F = new Float64Array(points.length * p);
  const row = new Float64Array(p);
  points.forEach((x, r) => {
    modelRow(terms, x, row);
    F.set(row, r * p);
  });
  return F;
}

/**
 * The working state of an exchange over the candidate model matrix F (N×p, row-major):
 * the design (n candidate indices), (X'X)⁻¹, d(xⱼ) for every candidate and the table
 * D[i·N + j] = d(design[i], xⱼ). Every rank-one change of X'X updates all three
 * (Sherman–Morrison), so the Δ of all n·N possible exchanges is read off in O(n·N) and
 * making one exchange costs about 3·N·p + 2·n·N.
 */
class ExchangeState {
  readonly design: Int32Array;
  readonly minv: Float64Array;
  readonly d: Float64Array;
  readonly D: Float64Array;
  private readonly v: Float64Array;
  private readonly v1: Float64Array;
  private readonly v2: Float64Array;
  private readonly b1: Float64Array;
  private readonly b2: Float64Array;
  /** A rank-two update of D left for the next tabu scan to apply: D[q][r] −= pa1[q]·b1[r] + pa2[q]·b2[r]. */
  private readonly pa1: Float64Array;
  private readonly pa2: Float64Array;
  private deferred = false;
  /** Multiply-adds spent so far (the work budget counts these). */
  work = 0;

  constructor(
    readonly F: Float64Array,
    readonly N: number,
    readonly p: number,
    readonly n: number,
  ) {
    this.design = new Int32Array(n);
    this.minv = new Float64Array(p * p);
    this.d = new Float64Array(N);
    this.D = new Float64Array(n * N);
    this.v = new Float64Array(p);
    this.v1 = new Float64Array(p);
    this.v2 = new Float64Array(p);
    this.b1 = new Float64Array(N);
    this.b2 = new Float64Array(N);
    this.pa1 = new Float64Array(n);
    this.pa2 = new Float64Array(n);
  }

  loadCost(): number {
    return loadCost(this.N, this.p, this.n);
  }

  exchangeCost(): number {
    return exchangeCost(this.N, this.p, this.n);
  }

  /** out = (X'X)⁻¹·f_r; returns d(x_r) = f_r'(X'X)⁻¹f_r. */
  private solve(r: number, out: Float64Array): number {
    const { minv, F, p } = this;
    const o = r * p;
    let q = 0;
    for (let i = 0; i < p; i++) {
      let s = 0;
      const io = i * p;
      for (let j = 0; j < p; j++) s += minv[io + j]! * F[o + j]!;
      out[i] = s;
      q += s * F[o + i]!;
    }
    return q;
  }

  /** D[i·N + ·] = d(x_u, ·) for every candidate, from v = (X'X)⁻¹f_u. */
  private fillRow(i: number, u: number): void {
    const { F, N, p, D, v } = this;
    this.solve(u, v);
    const row = i * N;
    for (let r = 0; r < N; r++) {
      const o = r * p;
      let t = 0;
      for (let q = 0; q < p; q++) t += F[o + q]! * v[q]!;
      D[row + r] = t;
    }
  }

  /** Loads a design and recomputes everything from scratch; false when its X'X is singular. */
  load(design: ArrayLike<number>): boolean {
    const { F, N, p, n } = this;
    for (let i = 0; i < n; i++) this.design[i] = design[i]!;
    this.deferred = false;
    this.work += this.loadCost();
    const inv = inverseSpd(informationMatrix(F, p, this.design), p);
    if (!inv) return false;
    this.minv.set(inv);
    for (let r = 0; r < N; r++) this.d[r] = this.solve(r, this.v);
    for (let i = 0; i < n; i++) this.fillRow(i, this.design[i]!);
    return true;
  }

  /** ln det(X'X) of the current design, computed afresh. */
  logDet(): number {
    return logDetSpd(informationMatrix(this.F, this.p, this.design), this.p);
  }

  /**
   * Replaces design point i by candidate j: X'X ← X'X + f_j f_j' − f_k f_k' (k the old
   * point) as two Sherman–Morrison steps done in one sweep. With v₁ = (X'X)⁻¹f_j,
   * c₁ = 1/(1 + d(x_j)), v₂ = (X'X)⁻¹f_k − c₁·v₁·(v₁'f_k) and c₂ = −1/(1 − f_k'v₂):
   * (X'X)⁻¹ ← (X'X)⁻¹ − c₁v₁v₁' − c₂v₂v₂', d(x_r) ← d(x_r) − c₁(f_r'v₁)² − c₂(f_r'v₂)²,
   * D[q][r] ← D[q][r] − c₁(f_q'v₁)(f_r'v₁) − c₂(f_q'v₂)(f_r'v₂), and the new row i is
   * d(x_j, x_r) = (1 − c₁d(x_j))(f_r'v₁) − c₂(v₂'f_j)(f_r'v₂). Returns false, with
   * nothing changed, when the exchange would make X'X singular (1 + Δ not safely
   * positive).
   */
  exchange(i: number, j: number, defer = false): boolean {
    if (this.deferred) this.flush();
    const { minv, F, p, N, n, d, D, design, v1, v2, b1, b2, pa1, pa2 } = this;
    const k = design[i]!;
    this.work += this.exchangeCost();
    const oj = j * p;
    const ok = k * p;
    let dj = 0;
    let djk = 0;
    let dk = 0;
    for (let a = 0; a < p; a++) {
      let s1 = 0;
      let s2 = 0;
      const ao = a * p;
      for (let c = 0; c < p; c++) {
        const m = minv[ao + c]!;
        s1 += m * F[oj + c]!;
        s2 += m * F[ok + c]!;
      }
      v1[a] = s1;
      v2[a] = s2;
      dj += s1 * F[oj + a]!;
      dk += s2 * F[ok + a]!;
      djk += s1 * F[ok + a]!;
    }
    const c1 = 1 / (1 + dj);
    // d(x_k) after adding x_j; removing x_k then needs 1 − that > 0, i.e. 1 + Δ > 0.
    const dk1 = dk - c1 * djk * djk;
    const denom = 1 - dk1;
    if (!(denom > 1e-10)) return false;
    const c2 = -1 / denom;
    let v2fj = 0;
    for (let a = 0; a < p; a++) {
      v2[a] = v2[a]! - c1 * v1[a]! * djk;
      v2fj += v2[a]! * F[oj + a]!;
    }
    for (let a = 0; a < p; a++) {
      const x1 = c1 * v1[a]!;
      const x2 = c2 * v2[a]!;
      const ao = a * p;
      for (let c = 0; c < p; c++) minv[ao + c]! -= x1 * v1[c]! + x2 * v2[c]!;
    }
    for (let r = 0; r < N; r++) {
      const o = r * p;
      let t1 = 0;
      let t2 = 0;
      for (let q = 0; q < p; q++) {
        const f = F[o + q]!;
        t1 += f * v1[q]!;
        t2 += f * v2[q]!;
      }
      b1[r] = t1;
      b2[r] = t2;
      d[r]! -= c1 * t1 * t1 + c2 * t2 * t2;
    }
    for (let q = 0; q < n; q++) {
      pa1[q] = q === i ? 0 : c1 * b1[design[q]!]!;
      pa2[q] = q === i ? 0 : c2 * b2[design[q]!]!;
    }
    this.deferred = true;
    if (!defer) this.flush();
    const e1 = 1 - c1 * dj;
    const e2 = c2 * v2fj;
    const row = i * N;
    for (let r = 0; r < N; r++) D[row + r] = e1 * b1[r]! - e2 * b2[r]!;
    design[i] = j;
    return true;
  }

  /** Applies the deferred rank-two update of D. */
  private flush(): void {
    const { N, n, D, b1, b2, pa1, pa2 } = this;
    this.deferred = false;
    for (let q = 0; q < n; q++) {
      const a1 = pa1[q]!;
      const a2 = pa2[q]!;
      if (a1 === 0 && a2 === 0) continue;
      const row = q * N;
      for (let r = 0; r < N; r++) D[row + r] = D[row + r]! - a1 * b1[r]! - a2 * b2[r]!;
    }
  }

  /**
   * Modified Fedorov passes (Cook & Nachtsheim 1980): each design point in turn is
   * replaced by the candidate with the largest Δ when Δ > 1e-9; the state is reloaded
   * from scratch after each pass. Ends when a pass gains less than a relative 1e-9,
   * after `maxPasses`, or when the next pass would exceed `budget`. Returns false when
   * the budget stopped it.
   */
  descend(maxPasses: number, budget: number): boolean {
    const { N, n, d, D, design } = this;
    const cost = passCost(N, this.p, n);
    for (let pass = 0; pass < maxPasses; pass++) {
      if (this.work + cost > budget) return false;
      let gain = 0;
      for (let i = 0; i < n; i++) {
        const di = d[design[i]!]!;
        const row = i * N;
        let bestJ = -1;
        let best = CONVERGED;
        for (let j = 0; j < N; j++) {
          const dj = d[j]!;
          const dij = D[row + j]!;
          const delta = dj - di - di * dj + dij * dij;
          if (delta > best) {
            best = delta;
            bestJ = j;
          }
        }
        this.work += 3 * N;
        if (bestJ >= 0 && bestJ !== design[i] && this.exchange(i, bestJ)) gain += Math.log1p(best);
      }
      if (!this.load(design)) return true;
      if (gain < CONVERGED) break;
    }
    return true;
  }

  /**
   * Tabu search over exchanges (Glover, "Tabu search — Part I", ORSA Journal on
   * Computing 1, 1989): each step makes the best exchange over all n·N pairs even when
   * it lowers det(X'X), except that a candidate removed from the design may not come
   * back for `tenure` steps unless it would give a design better than any seen
   * (aspiration). Ties are broken at random. Ends the design at the best one seen.
   * Returns false when the budget stopped it.
   */
  tabu(steps: number, tenure: number, rng: Rng, budget: number): boolean {
    const { N, n, d, D, design } = this;
    const tieBreaker = new TieBreaker(Math.floor(rng() * 4294967296));
    const pick = new Int32Array(2);
    const stepCost = 3 * n * N + this.exchangeCost();
    const refreshEvery = 200;
    const tabuUntil = new Int32Array(N);
    let logDet = this.logDet();
    let best = logDet;
    const bestDesign = Int32Array.from(design);
    let finished = true;
    for (let step = 1; step <= steps; step++) {
      if (this.work + stepCost + this.loadCost() > budget) {
        finished = false;
        break;
      }
      // A tabu candidate is allowed when its exchange beats the best design seen.
      const aspiration = Math.expm1(best - logDet) + CONVERGED;
      const deferred = this.deferred;
      this.deferred = false;
      const bd = scanExchanges(n, N, design, d, D, this.b1, this.b2, deferred ? this.pa1 : null, this.pa2, tabuUntil, step, aspiration, tieBreaker, pick);
      const bi = pick[0]!;
      const bj = pick[1]!;
      this.work += 3 * n * N;
      if (bi < 0 || !(1 + bd > 1e-6)) break;
      const xi = design[bi]!;
      if (!this.exchange(bi, bj, true)) {
        tabuUntil[bj] = step + tenure;
        continue;
      }
      tabuUntil[xi] = step + tenure;
      logDet += Math.log1p(bd);
      if (step % refreshEvery === 0) {
        if (!this.load(design)) break;
        logDet = this.logDet();
      }
      if (logDet > best + CONVERGED) {
        best = logDet;
        bestDesign.set(design);
      }
    }
    this.load(bestDesign);
    return finished;
  }
}

/**
 * One tabu step's scan of all n·N exchanges: the largest Δ(design[i], j) over the
 * exchanges allowed (j not tabu at `step`, unless Δ > `aspiration`), ties broken
 * uniformly at random; the chosen i and j in `pick`, Δ returned (−Infinity when none).
 * When `pa1` is given, the scan first applies the deferred rank-two update
 * D[i][j] −= pa1[i]·b1[j] + pa2[i]·b2[j] (one pass over D instead of two). A function
 * of its own so that the engine optimises this loop by itself.
 */
function scanExchanges(
  n: number,
  N: number,
  design: Int32Array,
  d: Float64Array,
  D: Float64Array,
  b1: Float64Array,
  b2: Float64Array,
  pa1: Float64Array | null,
  pa2: Float64Array,
  tabuUntil: Int32Array,
  step: number,
  aspiration: number,
  tieBreaker: TieBreaker,
  pick: Int32Array,
): number {
  let bi = -1;
  let bj = -1;
  let bd = -Infinity;
  let ties = 0;
  for (let i = 0; i < n; i++) {
    const xi = design[i]!;
    const di = d[xi]!;
    const row = i * N;
    const x1 = pa1 === null ? 0 : pa1[i]!;
    const x2 = pa1 === null ? 0 : pa2[i]!;
    for (let j = 0; j < N; j++) {
      const dij = D[row + j]! - x1 * b1[j]! - x2 * b2[j]!;
      D[row + j] = dij;
      if (j === xi) continue;
      const dj = d[j]!;
      const delta = dj - di - di * dj + dij * dij;
      if (delta < bd - TIE) continue;
      if (tabuUntil[j]! > step && !(delta > aspiration)) continue;
      if (delta > bd + TIE) {
        bd = delta;
        bi = i;
        bj = j;
        ties = 1;
      } else if (tieBreaker.next() * ++ties < 1) {
        bi = i;
        bj = j;
      }
    }
  }
  pick[0] = bi;
  pick[1] = bj;
  return bd;
}

/**
 * Breaks ties among equally good exchanges (reservoir sampling needs one uniform number
 * per tie, and a symmetric candidate grid has thousands): Marsaglia's xorshift32
 * ("Xorshift RNGs", Journal of Statistical Software 8, 2003), seeded from the search's
 * seeded generator, its state in a typed array so that no number is boxed.
 */
class TieBreaker {
  private readonly state = new Uint32Array(1);

  constructor(seed: number) {
    this.state[0] = seed >>> 0 || 0x9e3779b9;
  }

  /** A uniform number in [0, 1). */
  next(): number {
    let x = this.state[0]!;
    x ^= x << 13;
    x ^= x >>> 17;
    x ^= x << 5;
    this.state[0] = x;
    return this.state[0]! / 4294967296;
  }
}

/** Relative gain below which an exchange or a pass does not count as an improvement. */
const CONVERGED = 1e-9;
/** Two Δ closer than this are a tie. */
const TIE = 1e-12;

/**
 * A starting design (Atkinson, Donev & Tobias, Optimum Experimental Designs, with SAS,
 * 2007, from memory): a random number q < p of candidates chosen at random, then
 * points added one at a time where the prediction variance d(x) is largest (ties
 * broken at random), from a small ridge εI so that the first p points are well defined.
 */
function startDesign(F: Float64Array, N: number, p: number, n: number, rng: Rng): number[] {
  const eps = 1e-6;
  const minv = new Float64Array(p * p);
  for (let i = 0; i < p; i++) minv[i * p + i] = 1 / eps;
  const d = new Float64Array(N);
  for (let r = 0; r < N; r++) {
    let s = 0;
    for (let j = 0; j < p; j++) s += F[r * p + j]! * F[r * p + j]!;
    d[r] = s / eps;
  }
  const v = new Float64Array(p);
  const chosen: number[] = [];
  const nRandom = Math.min(n, Math.floor(rng() * p));
  for (let t = 0; t < n; t++) {
    let pick: number;
    if (t < nRandom) pick = Math.floor(rng() * N);
    else {
      let best = -Infinity;
      for (let r = 0; r < N; r++) if (d[r]! > best) best = d[r]!;
      const near: number[] = [];
      for (let r = 0; r < N; r++) if (d[r]! >= best * (1 - 1e-9)) near.push(r);
      pick = near[Math.floor(rng() * near.length)]!;
    }
    chosen.push(pick);
    // Sherman–Morrison for adding f_pick.
    const o = pick * p;
    let du = 0;
    for (let i = 0; i < p; i++) {
      let s = 0;
      for (let j = 0; j < p; j++) s += minv[i * p + j]! * F[o + j]!;
      v[i] = s;
      du += s * F[o + i]!;
    }
    const c = 1 / (1 + du);
    for (let i = 0; i < p; i++) for (let j = 0; j < p; j++) minv[i * p + j]! -= c * v[i]! * v[j]!;
    for (let r = 0; r < N; r++) {
      let t2 = 0;
      for (let q = 0; q < p; q++) t2 += F[r * p + q]! * v[q]!;
      d[r]! -= c * t2 * t2;
    }
  }
  return chosen;
}

/** Multiply-adds of `ExchangeState.load`: X'X, its inverse, d for every candidate, the table. */
function loadCost(N: number, p: number, n: number): number {
  return n * p * p + p * p * p + N * p * p + n * N * p;
}

/** Multiply-adds of one exchange. */
function exchangeCost(N: number, p: number, n: number): number {
  return 5 * p * p + 2 * N * p + 2 * n * N;
}

/** Multiply-adds of one Fedorov pass at most: n scans, n exchanges and a reload. */
function passCost(N: number, p: number, n: number): number {
  return 3 * n * N + n * exchangeCost(N, p, n) + loadCost(N, p, n);
}

/** Multiply-adds of a starting design. */
function startCost(N: number, p: number, n: number): number {
  return n * (2 * p * p + N * p);
}

/**
 * Finds an n-run D-optimal design from the candidate model matrix F (N×p, row-major):
 * from each of `starts` seeded starting designs, modified Fedorov passes (Cook &
 * Nachtsheim 1980) to a local optimum, then `tabuSteps` steps of tabu search over the
 * same exchanges to leave it, then Fedorov passes again from the best design seen;
 * the best design over all starts is kept. Deterministic for a given seed (work is
 * counted, not timed). Throws an "infeasible" AppError when there is no candidate,
 * when n < p, or when no start gives a non-singular X'X (the candidates cannot
 * support the model); an invalid-input AppError naming `runs` when one pass would
 * exceed the work limits.
 * Example: fedorovExchange(candidateMatrix(terms, gridCandidates(3, 3)), terms.length, { runs: 14, seed: 5 })
 */
export function fedorovExchange(F: Float64Array, p: number, options: DOptimalOptions): DOptimalResult {
  const N = F.length / p;
  const n = options.runs;
  if (N === 0) throw new AppError("infeasible", "No candidate point is left.", [{ path: "constraints", message: "removes every candidate point" }]);
  if (n < p) {
    throw new AppError("infeasible", `${n} runs cannot estimate a model of ${p} terms.`, [{ path: "runs", message: `needs at least ${p} runs for this model` }]);
  }
  const check = dOptimalWorkCheck(N, p, n);
  if (check) throw AppError.field("runs", check);
  const rng = seededRng(options.seed ?? 1);
  const starts = options.starts ?? DEFAULT_STARTS;
  const maxPasses = options.maxPasses ?? DEFAULT_MAX_PASSES;
  const tabuSteps = options.tabuSteps ?? DEFAULT_TABU_STEPS;
  const tenure = options.tabuTenure ?? defaultTenure(N, n);
  const budget = options.workBudget ?? D_OPTIMAL_LIMITS.workBudget;
  const st = new ExchangeState(F, N, p, n);
  let best: Int32Array | null = null;
  let bestLogDet = -Infinity;
  let startsRun = 0;
  let stopped = false;
  for (let s = 0; s < starts && !stopped; s++) {
    if (startsRun > 0 && st.work + startCost(N, p, n) + st.loadCost() > budget) {
      stopped = true;
      break;
    }
    startsRun++;
    st.work += startCost(N, p, n);
    if (!st.load(startDesign(F, N, p, n, rng))) continue;
    stopped = !st.descend(maxPasses, budget);
    if (!stopped && tabuSteps > 0) {
      stopped = !st.tabu(tabuSteps, tenure, rng, budget);
      if (!stopped) stopped = !st.descend(maxPasses, budget);
    }
    const logDet = st.logDet();
    if (logDet > bestLogDet) {
      bestLogDet = logDet;
      best = Int32Array.from(st.design);
    }
  }
  if (!best || !Number.isFinite(bestLogDet)) {
    throw new AppError("infeasible", "The candidate points cannot support this model (X'X is singular).", [
      { path: "model", message: "not estimable from the candidate points" },
    ]);
  }
  return {
    indices: Array.from(best),
    logDet: bestLogDet,
    dEfficiency: (100 * Math.exp(bestLogDet / p)) / n,
    starts: startsRun,
    work: st.work,
    stoppedByBudget: stopped,
  };
}

/**
 * Why an exchange over N candidates, p terms and n runs is refused (null when it is
 * within `D_OPTIMAL_LIMITS`): the table of n·N exchanges must fit in memory and one
 * pass must stay within the per-pass work.
 */
export function dOptimalWorkCheck(N: number, p: number, n: number): string | null {
  const L = D_OPTIMAL_LIMITS;
  if (n * N > L.table) return `${n} runs × ${N} candidates exceeds ${L.table.toExponential(0)} exchanges per pass; use fewer runs or fewer candidates`;
  if (passCost(N, p, n) > L.workPerPass) return `${n} runs, ${N} candidates and ${p} model terms are too much work for one exchange pass; use fewer runs, fewer candidates or a smaller model`;
  return null;
}

/** Default tabu tenure: twice the runs, at most a quarter of the candidates, at least 1. */
function defaultTenure(N: number, n: number): number {
  return Math.max(1, Math.min(2 * n, Math.floor(N / 4)));
}

/**
 * The number of points of the default candidate set `gridCandidates(k, levels)` would
 * return, computed without building it: levels^k, or 2^k + 2k + 1 for the fallback.
 */
export function gridCandidateCount(k: number, levels: number, maxPoints: number = D_OPTIMAL_LIMITS.candidates): number {
  const full = Math.pow(levels, k);
  return full > maxPoints ? Math.pow(2, k) + 2 * k + 1 : full;
}

/**
 * The default candidate set in coded units: the full grid of `levels` equally spaced
 * levels from −1 to +1 on each factor (3 levels, 3^k points, for a model with square
 * terms; 2 levels otherwise). When the grid would exceed `maxPoints`, the two-level
 * factorial plus the face centres and the centre instead. Throws an invalid-input
 * AppError (path `factors`) when even that exceeds `maxPoints`.
 */
export function gridCandidates(k: number, levels: number, maxPoints: number = D_OPTIMAL_LIMITS.candidates): number[][] {
  const count = gridCandidateCount(k, levels, maxPoints);
  if (count > maxPoints) {
    throw AppError.field("factors", `the default candidate set for ${k} factors has ${count} points (at most ${maxPoints}); use fewer factors or give the candidates`);
  }
  if (Math.pow(levels, k) > maxPoints) {
    const out: number[][] = [];
    for (let r = 0; r < 2 ** k; r++) out.push(Array.from({ length: k }, (_, i) => (Math.floor(r / 2 ** i) % 2 ? 1 : -1)));
    for (let i = 0; i < k; i++)
      for (const s of [-1, 1]) {
        const x = new Array<number>(k).fill(0);
        x[i] = s;
        out.push(x);
      }
    out.push(new Array<number>(k).fill(0));
    return out;
  }
  const vals = Array.from({ length: levels }, (_, j) => (levels === 1 ? 0 : -1 + (2 * j) / (levels - 1)));
  const total = Math.pow(levels, k);
  const out: number[][] = new Array(total);
  for (let r = 0; r < total; r++) {
    const x = new Array<number>(k);
    let q = r;
    for (let i = 0; i < k; i++) {
      x[i] = vals[q % levels]!;
      q = Math.floor(q / levels);
    }
    out[r] = x;
  }
  return out;
}
