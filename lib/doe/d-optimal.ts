/**
 * D-optimal designs by candidate exchange: the modified Fedorov exchange of Cook &
 * Nachtsheim ("A comparison of algorithms for constructing exact D-optimal designs",
 * Technometrics 22, 1980), with Fedorov's determinant-ratio formula (Theory of Optimal
 * Experiments, 1972): replacing design point xᵢ by candidate xⱼ multiplies det(X'X) by
 * 1 + Δ with Δ = d(xⱼ) − d(xᵢ) − [d(xᵢ)d(xⱼ) − d(xᵢ,xⱼ)²], d(a,b) = f(a)'(X'X)⁻¹f(b).
 * (X'X)⁻¹ and d(xⱼ) for every candidate are kept current by rank-one
 * (Sherman–Morrison) updates, so one exchange costs O(p² + N·p).
 */
import { AppError } from "../errors/app-error";
import { modelRow, type Term } from "../stats/model-terms";
import { seededRng, type Rng } from "./randomize";

/** Options of the exchange. */
export interface DOptimalOptions {
  /** Number of runs n (≥ number of terms p). */
  runs: number;
  /** Random starts; the best design is kept (default 6). */
  starts?: number;
  /** Seed for the starting designs (default 1). */
  seed?: number | string;
  /** Maximum passes over the design per start (default 50). */
  maxPasses?: number;
}

/** The chosen design. */
export interface DOptimalResult {
  /** Indices into the candidate list, one per run (a candidate may repeat). */
  indices: number[];
  /** ln det(X'X). */
  logDet: number;
  /** D-efficiency in %: 100·det(X'X)^(1/p)/n (coded units). */
  dEfficiency: number;
}

/**
 * Cholesky factor (lower, row-major) of a symmetric positive-definite p×p matrix, or
 * null when it is not positive definite.
 */
export function cholesky(a: Float64Array, p: number): Float64Array | null {
  const l = new Float64Array(p * p);
  for (let j = 0; j < p; j++) {
    let s = a[j * p + j]!;
    for (let k = 0; k < j; k++) s -= l[j * p + k]! * l[j * p + k]!;
    if (!(s > 0)) return null;
    const d = Math.sqrt(s);
    l[j * p + j] = d;
    for (let i = j + 1; i < p; i++) {
      let t = a[i * p + j]!;
      for (let k = 0; k < j; k++) t -= l[i * p + k]! * l[j * p + k]!;
      l[i * p + j] = t / d;
    }
  }
  return l;
}

/** ln det of a symmetric positive-definite matrix (−Infinity when singular). */
export function logDetSpd(a: Float64Array, p: number): number {
  const l = cholesky(a, p);
  if (!l) return -Infinity;
  let s = 0;
  for (let j = 0; j < p; j++) s += 2 * Math.log(l[j * p + j]!);
  return s;
}

/** Inverse of a symmetric positive-definite matrix from its Cholesky factor, or null. */
export function inverseSpd(a: Float64Array, p: number): Float64Array | null {
  const l = cholesky(a, p);
  if (!l) return null;
  // inv(L)
  const li = new Float64Array(p * p);
  for (let j = 0; j < p; j++) {
    li[j * p + j] = 1 / l[j * p + j]!;
    for (let i = j + 1; i < p; i++) {
      let s = 0;
      for (let k = j; k < i; k++) s -= l[i * p + k]! * li[k * p + j]!;
      li[i * p + j] = s / l[i * p + i]!;
    }
  }
  // inv(A) = inv(L)' inv(L)
  const inv = new Float64Array(p * p);
  for (let i = 0; i < p; i++)
    for (let j = 0; j <= i; j++) {
      let s = 0;
      for (let k = i; k < p; k++) s += li[k * p + i]! * li[k * p + j]!;
      inv[i * p + j] = s;
      inv[j * p + i] = s;
    }
  return inv;
}

/** The information matrix X'X of the rows `indices` of the candidate model matrix F (N×p, row-major). */
export function informationMatrix(F: Float64Array, p: number, indices: readonly number[]): Float64Array {
  const m = new Float64Array(p * p);
  for (const r of indices) {
    const o = r * p;
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

function quad(minv: Float64Array, p: number, F: Float64Array, r: number, tmp: Float64Array): number {
  // tmp = Minv f_r; returns f_r' Minv f_r
  const o = r * p;
  let d = 0;
  for (let i = 0; i < p; i++) {
    let s = 0;
    const io = i * p;
    for (let j = 0; j < p; j++) s += minv[io + j]! * F[o + j]!;
    tmp[i] = s;
    d += s * F[o + i]!;
  }
  return d;
}

/** Sherman–Morrison: Minv ← Minv − s·v v'/(1 + s·u'v) for M ← M + s·u u'; also updates every d(xⱼ). */
function rankOne(minv: Float64Array, p: number, F: Float64Array, N: number, u: number, s: 1 | -1, dvec: Float64Array, v: Float64Array): boolean {
  const uv = quad(minv, p, F, u, v);
  const denom = 1 + s * uv;
  if (!(Math.abs(denom) > 1e-12)) return false;
  const c = s / denom;
  for (let i = 0; i < p; i++) {
    const vi = v[i]! * c;
    const io = i * p;
    for (let j = 0; j < p; j++) minv[io + j]! -= vi * v[j]!;
  }
  for (let r = 0; r < N; r++) {
    const o = r * p;
    let t = 0;
    for (let i = 0; i < p; i++) t += F[o + i]! * v[i]!;
    dvec[r]! -= c * t * t;
  }
  return true;
}

function startDesign(F: Float64Array, N: number, p: number, n: number, rng: Rng): number[] {
  // Random points for about half the terms, then greedy (largest d under a ridge).
  const eps = 1e-6;
  const minv = new Float64Array(p * p);
  for (let i = 0; i < p; i++) minv[i * p + i] = 1 / eps;
  const dvec = new Float64Array(N);
  const tmp = new Float64Array(p);
  for (let r = 0; r < N; r++) dvec[r] = quad(minv, p, F, r, tmp);
  const chosen: number[] = [];
  const nRandom = Math.min(n, Math.floor(p / 2));
  for (let t = 0; t < n; t++) {
    let pick: number;
    if (t < nRandom) pick = Math.floor(rng() * N);
    else {
      let best = -Infinity;
      for (let r = 0; r < N; r++) if (dvec[r]! > best) best = dvec[r]!;
      const near: number[] = [];
      for (let r = 0; r < N; r++) if (dvec[r]! >= best * (1 - 1e-9)) near.push(r);
      pick = near[Math.floor(rng() * near.length)]!;
    }
    chosen.push(pick);
    rankOne(minv, p, F, N, pick, 1, dvec, tmp);
  }
  return chosen;
}

/**
 * Finds an n-run D-optimal design from the candidate model matrix F (N×p, row-major)
 * by the modified Fedorov exchange from several seeded starts. Throws an "infeasible"
 * AppError when n < p or when no start gives a non-singular X'X (the candidates cannot
 * support the model).
 */
export function fedorovExchange(F: Float64Array, p: number, options: DOptimalOptions): DOptimalResult {
  const N = F.length / p;
  const n = options.runs;
  if (N === 0) throw new AppError("infeasible", "No candidate point satisfies the constraints.", [{ path: "constraints", message: "removes every candidate point" }]);
  if (n < p) {
    throw new AppError("infeasible", `${n} runs cannot estimate a model of ${p} terms.`, [{ path: "runs", message: `needs at least ${p} runs for this model` }]);
  }
  const rng = seededRng(options.seed ?? 1);
  const starts = options.starts ?? 6;
  const maxPasses = options.maxPasses ?? 50;
  let best: number[] | null = null;
  let bestLogDet = -Infinity;
  const tmp = new Float64Array(p);
  const w = new Float64Array(p);
  const dvec = new Float64Array(N);
  for (let s = 0; s < starts; s++) {
    const design = startDesign(F, N, p, n, rng);
    const M = informationMatrix(F, p, design);
    const minv = inverseSpd(M, p);
    if (!minv) continue;
    for (let r = 0; r < N; r++) dvec[r] = quad(minv, p, F, r, tmp);
    let logDet = logDetSpd(M, p);
    for (let pass = 0; pass < maxPasses; pass++) {
      let improved = false;
      for (let i = 0; i < n; i++) {
        const xi = design[i]!;
        // w = Minv f_i, di = d(x_i)
        const di = quad(minv, p, F, xi, w);
        let bestJ = -1;
        let bestDelta = 1e-9;
        for (let j = 0; j < N; j++) {
          if (j === xi) continue;
          const o = j * p;
          let dij = 0;
          for (let t = 0; t < p; t++) dij += F[o + t]! * w[t]!;
          const dj = dvec[j]!;
          const delta = dj - di - (di * dj - dij * dij);
          if (delta > bestDelta) {
            bestDelta = delta;
            bestJ = j;
          }
        }
        if (bestJ >= 0) {
          if (!rankOne(minv, p, F, N, bestJ, 1, dvec, tmp)) continue;
          if (!rankOne(minv, p, F, N, xi, -1, dvec, tmp)) {
            rankOne(minv, p, F, N, bestJ, -1, dvec, tmp);
            continue;
          }
          design[i] = bestJ;
          logDet += Math.log1p(bestDelta);
          improved = true;
        }
      }
      if (!improved) break;
      // Refresh from scratch each pass to keep rounding in check.
      const Mr = informationMatrix(F, p, design);
      const fresh = inverseSpd(Mr, p);
      if (!fresh) break;
      minv.set(fresh);
      for (let r = 0; r < N; r++) dvec[r] = quad(minv, p, F, r, tmp);
      logDet = logDetSpd(Mr, p);
    }
    logDet = logDetSpd(informationMatrix(F, p, design), p);
    if (logDet > bestLogDet) {
      bestLogDet = logDet;
      best = [...design];
    }
  }
  if (!best || !Number.isFinite(bestLogDet)) {
    throw new AppError("infeasible", "The candidate points cannot support this model (X'X is singular).", [
      { path: "model", message: "not estimable from the candidate points" },
    ]);
  }
  return { indices: best, logDet: bestLogDet, dEfficiency: (100 * Math.exp(bestLogDet / p)) / n };
}

/**
 * The default candidate set in coded units: the full grid of `levels` equally spaced
 * levels from −1 to +1 on each factor (3 levels, 3^k points, for a model with square
 * terms; 2 levels otherwise). When the grid would exceed `maxPoints`, the two-level
 * factorial plus the face centres and the centre instead.
 */
export function gridCandidates(k: number, levels: number, maxPoints = 20000): number[][] {
  if (Math.pow(levels, k) > maxPoints) {
    const out: number[][] = [];
    for (let r = 0; r < 1 << k; r++) out.push(Array.from({ length: k }, (_, i) => ((r >> i) & 1 ? 1 : -1)));
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
