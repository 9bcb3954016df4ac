/**
 * Maximising a response surface over the experimental region.
 *
 * - Quadratic in the cube [−1, 1]^k: exact, by enumerating the 3^k faces (each factor
 *   at −1, at +1, or free) and solving the stationarity equations on each face: the
 *   maximum of a continuous function on a box is a stationary point of its restriction
 *   to the relative interior of some face (Nocedal & Wright, Numerical Optimization,
 *   ch. 16, active sets).
 * - Quadratic in the ball ‖x‖ ≤ r: exact, as a trust-region subproblem solved through
 *   the eigen decomposition and the secular equation, including the "hard case"
 *   (Moré & Sorensen, "Computing a trust region step", SIAM J. Sci. Stat. Comput. 4,
 *   1983).
 * - Anything else (linear constraints, desirability): projected gradient ascent with
 *   Armijo backtracking from many starts, projecting onto the intersection of the
 *   region and the half-spaces by Dykstra's alternating projections (Boyle & Dykstra,
 *   1986), then a compass search polish for kinks.
 */
import { CholeskyDecomposition, EigenvalueDecomposition, Matrix } from "ml-matrix";
import type { Rng } from "../doe/randomize";

/** f(x) = c + g'x + x'Hx with H symmetric. */
export interface Quadratic {
  c: number;
  g: number[];
  H: number[][];
}

/** The value c + g'x + x'Hx of a quadratic at x. */
export function evalQuadratic(q: Quadratic, x: readonly number[]): number {
  let v = q.c;
  for (let i = 0; i < x.length; i++) {
    v += q.g[i]! * x[i]!;
    let s = 0;
    for (let j = 0; j < x.length; j++) s += q.H[i]![j]! * x[j]!;
    v += x[i]! * s;
  }
  return v;
}

/**
 * Cholesky factorisation of an m×m matrix (ml-matrix's CholeskyDecomposition), or null
 * when it is not safely positive definite (a pivot d ≤ 1e-13, the tolerance the face
 * enumeration below relies on to skip singular faces).
 */
function choleskyOf(A: number[][]): CholeskyDecomposition | null {
  const chol = new CholeskyDecomposition(new Matrix(A));
  if (!chol.isPositiveDefinite()) return null;
  const L = chol.lowerTriangularMatrix;
  for (let j = 0; j < A.length; j++) if (!(L.get(j, j) ** 2 > 1e-13)) return null;
  return chol;
}

function cholSolve(chol: CholeskyDecomposition, b: number[]): number[] {
  return chol.solve(Matrix.columnVector(b)).getColumn(0);
}

/**
 * The exact maximum of a quadratic over the cube [−1, 1]^k by face enumeration. The
 * maximum lies in the relative interior of some face (a vertex counts), where it is a
 * local maximum of f restricted to the face, so there the free block H_FF is negative
 * semidefinite; when H_FF is singular, f is constant along a null direction and the
 * same value is reached on a smaller face. So it suffices, for every free set F with
 * −H_FF positive definite, to solve x_F = −½H_FF⁻¹(g_F + 2H_F,fixed·x_fixed) =
 * a_F + M_F·x_fixed for every sign pattern of the fixed factors (one Cholesky per free
 * set), keep the points inside the box, and take the best. k ≤ 12.
 */
export function maximizeQuadraticInCube(q: Quadratic): { x: number[]; value: number } {
  const k = q.g.length;
  if (k > 12) throw new RangeError("face enumeration is limited to 12 factors");
  let best: number[] = new Array<number>(k).fill(-1);
  let bestV = evalQuadratic(q, best);
  const x = new Array<number>(k).fill(0);
  for (let free = 0; free < 1 << k; free++) {
    const F: number[] = [];
    const X: number[] = [];
    for (let i = 0; i < k; i++) ((free >> i) & 1 ? F : X).push(i);
    const m = F.length;
    let a: Float64Array | null = null;
    let M: Float64Array | null = null; // m × |X|
    if (m > 0) {
      const negH = F.map((r) => F.map((c) => -2 * q.H[r]![c]!));
      const chol = choleskyOf(negH);
      if (!chol) continue;
      // (−2H_FF) x_F = g_F + 2H_F,X x_X  ⇒  a = (−2H_FF)⁻¹ g_F, column j of M = (−2H_FF)⁻¹ 2H_F,X_j
      a = Float64Array.from(cholSolve(chol, F.map((i) => q.g[i]!)));
      M = new Float64Array(m * X.length);
      for (let j = 0; j < X.length; j++) {
        const col = cholSolve(chol, F.map((i) => 2 * q.H[i]![X[j]!]!));
        for (let r = 0; r < m; r++) M[r * X.length + j] = col[r]!;
      }
    }
    const nx = X.length;
    for (let pat = 0; pat < 1 << nx; pat++) {
      for (let j = 0; j < nx; j++) x[X[j]!] = (pat >> j) & 1 ? 1 : -1;
      let inside = true;
      for (let r = 0; r < m && inside; r++) {
        let v = a![r]!;
        for (let j = 0; j < nx; j++) v += M![r * nx + j]! * x[X[j]!]!;
        if (Math.abs(v) > 1 + 1e-12) inside = false;
        x[F[r]!] = Math.max(-1, Math.min(1, v));
      }
      if (!inside) continue;
      const v = evalQuadratic(q, x);
      if (v > bestV) {
        bestV = v;
        best = [...x];
      }
    }
  }
  return { x: best, value: bestV };
}

/**
 * The exact maximum of a quadratic over the ball ‖x‖ ≤ r (trust-region subproblem,
 * Moré & Sorensen 1983), through ml-matrix's symmetric eigen decomposition.
 */
export function maximizeQuadraticInBall(q: Quadratic, r: number): { x: number[]; value: number } {
  const k = q.g.length;
  // minimise ½x'Ax + a'x with A = −2H, a = −g
  const A = q.H.map((row) => row.map((v) => -2 * v));
  const evd = new EigenvalueDecomposition(new Matrix(A), { assumeSymmetric: true });
  const lam = evd.realEigenvalues;
  const V = evd.eigenvectorMatrix;
  const vecs = lam.map((_, i) => V.getColumn(i));
  const alpha = vecs.map((v) => -v.reduce((s, vi, i) => s + vi * q.g[i]!, 0)); // v'a
  const scale = Math.max(1e-300, ...lam.map(Math.abs));
  const lmin = Math.min(...lam);
  const xOf = (mu: number, skip?: (i: number) => boolean) => {
    const x = new Array<number>(k).fill(0);
    lam.forEach((l, i) => {
      if (skip && skip(i)) return;
      const c = -alpha[i]! / (l + mu);
      for (let j = 0; j < k; j++) x[j]! += c * vecs[i]![j]!;
    });
    return x;
  };
  const norm = (x: number[]) => Math.sqrt(x.reduce((s, v) => s + v * v, 0));
  const result = (x: number[]) => ({ x, value: evalQuadratic(q, x) });
  if (lmin > 1e-12 * scale) {
    const x0 = xOf(0);
    if (norm(x0) <= r) return result(x0);
  }
  const tolL = 1e-10 * scale;
  const inMin = (i: number) => lam[i]! - lmin <= tolL;
  const aNorm = Math.sqrt(alpha.reduce((s, v) => s + v * v, 0));
  const minAlpha = Math.sqrt(lam.reduce((s, _, i) => s + (inMin(i) ? alpha[i]! ** 2 : 0), 0));
  const lo0 = Math.max(0, -lmin);
  if (minAlpha <= 1e-12 * (aNorm || 1) && lmin <= tolL) {
    // Hard case: no gradient component along the lowest eigenvector; move along it to the sphere.
    const xp = xOf(lo0, inMin);
    const np = norm(xp);
    if (np <= r) {
      const tau = Math.sqrt(Math.max(0, r * r - np * np));
      const v = vecs[lam.findIndex((_, i) => inMin(i))]!;
      const ra = result(xp.map((xi, j) => xi + tau * v[j]!));
      const rb = result(xp.map((xi, j) => xi - tau * v[j]!));
      return ra.value >= rb.value ? ra : rb;
    }
  }
  let lo = lo0;
  let hi = Math.max(lo0, aNorm / r - lmin) + 1;
  for (let it = 0; it < 300; it++) {
    const mid = (lo + hi) / 2;
    const nx = norm(xOf(mid, (i) => lam[i]! + mid <= 0));
    if (nx > r) lo = mid;
    else hi = mid;
    if (hi - lo <= 1e-15 * Math.max(1, hi)) break;
  }
  const x = xOf(hi);
  const nx = norm(x);
  return result(nx > 0 ? x.map((v) => (v * r) / nx) : x);
}

/** A convex feasible set: the cube or ball, plus half-spaces a'x ≤ b (coded units). */
export interface Region {
  kind: "cube" | "sphere";
  radius: number;
  halfSpaces: { a: number[]; b: number }[];
}

function projectBase(region: Region, x: number[]): number[] {
  if (region.kind === "cube") return x.map((v) => Math.max(-1, Math.min(1, v)));
  const n = Math.sqrt(x.reduce((s, v) => s + v * v, 0));
  return n > region.radius ? x.map((v) => (v * region.radius) / n) : [...x];
}

function projectHalf(h: { a: number[]; b: number }, x: number[]): number[] {
  let ax = 0;
  let aa = 0;
  for (let i = 0; i < x.length; i++) {
    ax += h.a[i]! * x[i]!;
    aa += h.a[i]! ** 2;
  }
  if (ax <= h.b || aa === 0) return [...x];
  const t = (ax - h.b) / aa;
  return x.map((v, i) => v - t * h.a[i]!);
}

/** True when x lies in the region (to 1e-9). */
export function inRegion(region: Region, x: readonly number[], tol = 1e-9): boolean {
  if (region.kind === "cube" && x.some((v) => Math.abs(v) > 1 + tol)) return false;
  if (region.kind === "sphere" && Math.sqrt(x.reduce((s, v) => s + v * v, 0)) > region.radius * (1 + tol)) return false;
  return region.halfSpaces.every((h) => h.a.reduce((s, ai, i) => s + ai * x[i]!, 0) <= h.b + tol * (1 + Math.abs(h.b)));
}

/**
 * Euclidean projection onto the region by Dykstra's algorithm (exact in the limit;
 * stops when an iteration moves less than 1e-13). Returns null when the sets appear
 * not to intersect.
 */
export function projectOntoRegion(region: Region, x0: readonly number[]): number[] | null {
  if (region.halfSpaces.length === 0) return projectBase(region, [...x0]);
  const sets = [(x: number[]) => projectBase(region, x), ...region.halfSpaces.map((h) => (x: number[]) => projectHalf(h, x))];
  const k = x0.length;
  const incr = sets.map(() => new Array<number>(k).fill(0));
  let x = [...x0];
  for (let it = 0; it < 5000; it++) {
    let moved = 0;
    sets.forEach((P, s) => {
      const y = x.map((v, i) => v + incr[s]![i]!);
      const px = P(y);
      for (let i = 0; i < k; i++) {
        incr[s]![i] = y[i]! - px[i]!;
        moved = Math.max(moved, Math.abs(px[i]! - x[i]!));
      }
      x = px;
    });
    if (moved < 1e-13 && inRegion(region, x)) return x;
  }
  return inRegion(region, x, 1e-7) ? x : null;
}

/** A smooth objective to maximise, with an optional analytic gradient. */
export interface Objective {
  f: (x: readonly number[]) => number;
  grad?: (x: readonly number[]) => number[];
}

function numGrad(obj: Objective, x: readonly number[]): number[] {
  if (obj.grad) return obj.grad(x);
  const h = 1e-6;
  return x.map((_, i) => {
    const a = [...x];
    const b = [...x];
    a[i]! += h;
    b[i]! -= h;
    return (obj.f(a) - obj.f(b)) / (2 * h);
  });
}

/** Projected gradient ascent with Armijo backtracking from a feasible start. */
export function projectedGradientAscent(obj: Objective, region: Region, start: readonly number[], maxIter = 400): { x: number[]; value: number } {
  let x = projectOntoRegion(region, start) ?? [...start];
  let fx = obj.f(x);
  let step = 1;
  for (let it = 0; it < maxIter; it++) {
    const g = numGrad(obj, x);
    let accepted = false;
    for (let bt = 0; bt < 40; bt++) {
      const y = projectOntoRegion(region, x.map((v, i) => v + step * g[i]!));
      if (!y) break;
      const d2 = y.reduce((s, v, i) => s + (v - x[i]!) ** 2, 0);
      const fy = obj.f(y);
      if (fy >= fx + (1e-4 / step) * d2 && fy >= fx) {
        const moved = Math.sqrt(d2);
        x = y;
        const gain = fy - fx;
        fx = fy;
        accepted = true;
        step = Math.min(step * 2, 1e3);
        if (moved < 1e-11 || gain < 1e-15 * (1 + Math.abs(fx))) return { x, value: fx };
        break;
      }
      step /= 2;
    }
    if (!accepted) break;
  }
  return { x, value: fx };
}

/**
 * Compass (pattern) search: from `start` (objective `f0`), try ± `step` along each axis,
 * take the first trial point that `admit` turns into a point of the region (or null),
 * that improves the objective and that `accept` (checked last: it may be costly) takes,
 * and halve the step when none does, down to `minStep`.
 */
export function patternSearch(
  obj: Objective,
  start: readonly number[],
  f0: number,
  opts: { admit: (y: number[]) => number[] | null; accept?: (y: readonly number[]) => boolean; initial: number; minStep: number },
): { x: number[]; value: number } {
  const { admit, accept = () => true, initial, minStep } = opts;
  let x = [...start];
  let fx = f0;
  let step = initial;
  const k = x.length;
  while (step > minStep) {
    let improved = false;
    for (let i = 0; i < k && !improved; i++) {
      for (const s of [1, -1]) {
        const y = [...x];
        y[i]! += s * step;
        const py = admit(y);
        if (!py) continue;
        const fy = obj.f(py);
        if (fy > fx + 1e-15 * (1 + Math.abs(fx)) && accept(py)) {
          x = py;
          fx = fy;
          improved = true;
          break;
        }
      }
    }
    if (!improved) step /= 2;
  }
  return { x, value: fx };
}

/** Compass (pattern) search polish inside the region, for non-smooth objectives: trial points are projected onto the region. */
export function compassSearch(obj: Objective, region: Region, start: readonly number[], initial = 0.1, minStep = 1e-9): { x: number[]; value: number } {
  return patternSearch(obj, start, obj.f([...start]), { admit: (y) => projectOntoRegion(region, y), initial, minStep });
}

/**
 * The candidate starts of a multi-start search: the seed points and `samples` random
 * points of the box or ball, each projected onto the region and kept when `accept`
 * allows, ranked by the objective (best first); `starts` are the best of them at least
 * √minDistance2 apart.
 */
export function rankedStarts(
  obj: Objective,
  region: Region,
  seeds: readonly (readonly number[])[],
  rng: Rng,
  o: { samples: number; starts: number; minDistance2: number; accept?: (x: readonly number[]) => boolean },
): { pool: { x: number[]; v: number }[]; starts: number[][] } {
  const k = region.halfSpaces[0]?.a.length ?? seeds[0]?.length ?? 0;
  const pool: { x: number[]; v: number }[] = [];
  const consider = (p: readonly number[]) => {
    const x = projectOntoRegion(region, p);
    if (x && (!o.accept || o.accept(x))) pool.push({ x, v: obj.f(x) });
  };
  seeds.forEach(consider);
  const spread = region.kind === "sphere" ? region.radius : 1;
  for (let i = 0; i < o.samples; i++) consider(Array.from({ length: k }, () => (2 * rng() - 1) * spread));
  pool.sort((a, b) => b.v - a.v);
  const starts: number[][] = [];
  for (const p of pool) {
    if (starts.length >= o.starts) break;
    if (starts.some((st) => st.reduce((acc, v, i) => acc + (v - p.x[i]!) ** 2, 0) < o.minDistance2)) continue;
    starts.push(p.x);
  }
  return { pool, starts };
}

/**
 * Multi-start maximisation over a region: evaluates the objective at the given seed
 * points and at random feasible points, runs projected gradient ascent (then compass
 * search) from the best `nStarts`, and returns the best point found.
 */
export function multiStartMaximize(obj: Objective, region: Region, seeds: readonly (readonly number[])[], rng: Rng, nStarts = 12, nRandom = 300): { x: number[]; value: number } {
  const { pool, starts } = rankedStarts(obj, region, seeds, rng, { samples: nRandom, starts: nStarts, minDistance2: 1e-6 });
  if (pool.length === 0) throw new RangeError("the region is empty");
  let best = { x: pool[0]!.x, value: pool[0]!.v };
  for (const s of starts) {
    const a = projectedGradientAscent(obj, region, s);
    const b = compassSearch(obj, region, a.x, 0.05);
    const r = b.value >= a.value ? b : a;
    if (r.value > best.value) best = r;
  }
  return best;
}
