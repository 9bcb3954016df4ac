import { describe, expect, it } from "vitest";
import { seededRng } from "../../../lib/doe";
import {
  evalQuadratic,
  maximizeQuadraticInBall,
  maximizeQuadraticInCube,
  multiStartMaximize,
  projectOntoRegion,
  type Quadratic,
} from "../../../lib/surface";

function randomQuadratic(k: number, rng: () => number): Quadratic {
  const H = Array.from({ length: k }, () => new Array<number>(k).fill(0));
  for (let i = 0; i < k; i++)
    for (let j = i; j < k; j++) {
      const v = 4 * rng() - 2;
      H[i]![j] = v;
      H[j]![i] = v;
    }
  return { c: 0, g: Array.from({ length: k }, () => 4 * rng() - 2), H };
}

/** Brute-force maximum over a grid of the cube (computed in this test). */
function gridMaxCube(q: Quadratic, steps: number): number {
  const k = q.g.length;
  let best = -Infinity;
  const total = (steps + 1) ** k;
  for (let s = 0; s < total; s++) {
    let t = s;
    const x = new Array<number>(k);
    for (let i = 0; i < k; i++) {
      x[i] = -1 + (2 * (t % (steps + 1))) / steps;
      t = Math.floor(t / (steps + 1));
    }
    best = Math.max(best, evalQuadratic(q, x));
  }
  return best;
}

describe("exact optima of quadratics", () => {
  it("face enumeration in the cube is never beaten by a fine grid (random quadratics, k = 2…4)", () => {
    const rng = seededRng(9);
    for (let trial = 0; trial < 30; trial++) {
      const k = 2 + (trial % 3);
      const q = randomQuadratic(k, rng);
      const exact = maximizeQuadraticInCube(q);
      expect(exact.x.every((v) => Math.abs(v) <= 1)).toBe(true);
      const grid = gridMaxCube(q, k === 4 ? 20 : 60);
      expect(exact.value).toBeGreaterThanOrEqual(grid - 1e-12);
      expect(exact.value - grid).toBeLessThan(0.05); // the grid gets close to the true maximum
    }
  });
  it("the trust-region solution on the ball is never beaten by dense sampling (k = 2, 3)", () => {
    const rng = seededRng(4);
    for (let trial = 0; trial < 30; trial++) {
      const k = 2 + (trial % 2);
      const q = randomQuadratic(k, rng);
      const r = 0.5 + 1.5 * rng();
      const exact = maximizeQuadraticInBall(q, r);
      expect(Math.hypot(...exact.x)).toBeLessThanOrEqual(r * (1 + 1e-9));
      let best = -Infinity;
      for (let s = 0; s < 20000; s++) {
        const dir = Array.from({ length: k }, () => 2 * rng() - 1);
        const rad = r * Math.sqrt(rng());
        const n = Math.hypot(...dir);
        best = Math.max(best, evalQuadratic(q, dir.map((v) => (v * rad) / n)));
      }
      expect(exact.value).toBeGreaterThanOrEqual(best - 1e-9);
    }
  });
  it("handles the trust-region hard case (gradient orthogonal to the lowest eigenvector)", () => {
    // maximise x² − y² + 0.5·y on the unit disc: the maximum is at (±√(1−1/16), 1/8)... derived:
    // on the circle f = cos²θ − sin²θ + 0.5 sinθ; with y = sinθ, f = 1 − 2y² + 0.5y, max at y = 1/8.
    const q: Quadratic = { c: 0, g: [0, 0.5], H: [[1, 0], [0, -1]] };
    const r = maximizeQuadraticInBall(q, 1);
    expect(r.x[1]!).toBeCloseTo(0.125, 9);
    expect(Math.abs(r.x[0]!)).toBeCloseTo(Math.sqrt(1 - 1 / 64), 9);
    expect(r.value).toBeCloseTo(1 - 2 / 64 + 0.0625, 9);
  });
  it("projection onto the cube ∩ half-space is the nearest feasible point", () => {
    // Project (1, 1) onto {|x| ≤ 1, x1 + x2 ≤ 0}: the nearest point is (0, 0) (derived by hand).
    const p = projectOntoRegion({ kind: "cube", radius: 1, halfSpaces: [{ a: [1, 1], b: 0 }] }, [1, 1])!;
    expect(p[0]!).toBeCloseTo(0, 9);
    expect(p[1]!).toBeCloseTo(0, 9);
  });
  it("multi-start maximisation under a linear constraint matches the exact answer on the active line", () => {
    // f = −(x1 − 0.8)² − (x2 − 0.8)², x1 + x2 ≤ 0.4: optimum (0.2, 0.2) by symmetry (derived by hand).
    const f = (x: readonly number[]) => -((x[0]! - 0.8) ** 2) - (x[1]! - 0.8) ** 2;
    const r = multiStartMaximize({ f }, { kind: "cube", radius: 1, halfSpaces: [{ a: [1, 1], b: 0.4 }] }, [[0, 0]], seededRng(1));
    expect(r.x[0]!).toBeCloseTo(0.2, 6);
    expect(r.x[1]!).toBeCloseTo(0.2, 6);
  });
});
