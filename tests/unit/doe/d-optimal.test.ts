import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import {
  candidateMatrix,
  dEfficiency,
  designLogDet,
  fedorovExchange,
  generateDesign,
  gridCandidates,
  informationMatrix,
  logDetSpd,
  relativeDEfficiency,
  relativeDEfficiencyOfRuns,
} from "../../../lib/doe";
import { buildTerms } from "../../../lib/stats";

const names = (k: number) => Array.from({ length: k }, (_, i) => `x${i + 1}`);
const box = (k: number) => names(k).map((name) => ({ name, low: -1, high: 1 }));
const key = (r: { coded: Record<string, number> }) => Object.values(r.coded).join(",");

describe("D-optimal designs where the optimum is known", () => {
  it.each([2, 3, 4])("a first-order design of 2^%i runs on {−1, 1}^k reaches the D-optimum, X'X = nI", (k) => {
    // Atkinson, Donev & Tobias, Optimum Experimental Designs, with SAS (2007), from memory:
    // with entries ±1, |X'X| ≤ n^p (Hadamard's bound), reached by X'X = nI, e.g. by the 2^k
    // factorial, so that design is D-optimal with D-efficiency 100 % (others, such as a
    // replicated resolution III fraction, reach the bound too).
    const n = 2 ** k;
    const d = generateDesign({ factors: box(k), design: "d-optimal", runs: n, model: "linear", levels: 2, seed: k, randomize: false });
    expect(d.dOptimal!.dEfficiency).toBeCloseTo(100, 9);
    for (const r of d.runs) for (const v of Object.values(r.coded)) expect(Math.abs(v)).toBe(1);
  });

  it.each([2, 3, 4])("with all two-factor interactions, the 2^%i factorial itself (every vertex once)", (k) => {
    // Same bound; a fraction or a repeated point would alias an interaction with another
    // term, so only the full factorial gives X'X = nI here.
    const n = 2 ** k;
    const d = generateDesign({ factors: box(k), design: "d-optimal", runs: n, model: "interaction", levels: 2, seed: k, randomize: false });
    expect(d.dOptimal!.dEfficiency).toBeCloseTo(100, 9);
    expect(new Set(d.runs.map(key)).size).toBe(n);
  });

  it("the D-optimal 3-run design for a quadratic in one factor on [−1, 1] is {−1, 0, 1}", () => {
    // Atkinson, Donev & Tobias (2007), quadratic regression on [−1, 1] (from memory): the
    // D-optimal design puts equal weight on −1, 0 and 1. Candidates: 11 levels, step 0.2.
    const d = generateDesign({ factors: box(1), design: "d-optimal", runs: 3, model: "quadratic", levels: 11, seed: 3, randomize: false });
    expect(d.runs.map((r) => r.coded.x1).sort((a, b) => a! - b!)).toEqual([-1, 0, 1]);
    // By hand: X'X = [[3, 0, 2], [0, 2, 0], [2, 0, 2]], |X'X| = 3·4 − 2·4 = 4.
    expect(d.dOptimal!.logDet).toBeCloseTo(Math.log(4), 12);
  });

  it("6 runs for the same quadratic replicate {−1, 0, 1} twice", () => {
    // The exact D-optimal n-run design for n a multiple of the support size repeats the
    // support (Atkinson, Donev & Tobias 2007, from memory): |X'X| = 4·2³ = 32.
    const d = generateDesign({ factors: box(1), design: "d-optimal", runs: 6, model: "quadratic", levels: 11, seed: 1, randomize: false });
    expect(d.runs.map((r) => r.coded.x1).sort((a, b) => a! - b!)).toEqual([-1, -1, 0, 0, 1, 1]);
    expect(d.dOptimal!.logDet).toBeCloseTo(Math.log(32), 12);
  });
});

describe("D-efficiency (formulas checked by hand)", () => {
  const linear2 = buildTerms("linear", ["a", "b"]);
  const factorial = [[-1, -1], [1, -1], [-1, 1], [1, 1]];
  it("100·|X'X|^(1/p)/n", () => {
    // 2² factorial, intercept + a + b: X'X = 4I, |X'X| = 64, 64^(1/3)/4 = 1 → 100 %.
    expect(dEfficiency(linear2, factorial)).toBeCloseTo(100, 12);
    // {−1, 0, 1}, quadratic: |X'X| = 4 (by hand above), 4^(1/3)/3 = 0.529134…
    expect(dEfficiency(buildTerms("quadratic", ["a"]), [[-1], [0], [1]])).toBeCloseTo((100 * Math.cbrt(4)) / 3, 12);
    expect(dEfficiency(linear2, [[1, 1], [1, 1], [1, 1]])).toBe(0); // singular
  });
  it("relative efficiency is the ratio of information per run", () => {
    // A = factorial + centre: X'X = diag(5, 4, 4), |·| = 80; B = factorial: 64.
    // (80/5³ ÷ 64/4³)^(1/3) = 0.64^(1/3) = 0.861774…
    const a = [...factorial, [0, 0]];
    expect(relativeDEfficiency(linear2, a, factorial)).toBeCloseTo(Math.cbrt(0.64), 12);
    expect(relativeDEfficiency(linear2, factorial, factorial)).toBeCloseTo(1, 12);
    expect(relativeDEfficiency(linear2, factorial, [[1, 1], [1, 1], [1, 1]])).toBeNull();
    expect(relativeDEfficiency(linear2, [[1, 1], [1, 1], [1, 1]], factorial)).toBe(0);
  });
  it("in natural units both designs are coded with the same factors", () => {
    // Halving both ranges about the centre halves every coded value: for intercept + a + b,
    // |X'X| falls by 2⁴ (two columns scaled by ½), so the efficiency is (1/16)^(1/3).
    const factors = [
      { name: "temperature", low: 60, high: 100, scale: "linear" as const },
      { name: "time", low: 1, high: 3, scale: "linear" as const },
    ];
    const wide = factorial.map(([a, b]) => ({ natural: { temperature: 80 + 20 * a!, time: 2 + b! } }));
    const narrow = factorial.map(([a, b]) => ({ natural: { temperature: 80 + 10 * a!, time: 2 + 0.5 * b! } }));
    expect(relativeDEfficiencyOfRuns(factors, "linear", narrow, wide)).toBeCloseTo(Math.cbrt(1 / 16), 12);
  });
});

describe("the exchange search", () => {
  const terms = buildTerms("quadratic", names(3));
  const grid = gridCandidates(3, 3);
  const F = candidateMatrix(terms, grid);
  const p = terms.length;

  it("keeps ln det current through its rank-one updates (recomputed from the indices)", () => {
    for (const seed of [1, 2, 3]) {
      const r = fedorovExchange(F, p, { runs: 15, seed });
      expect(r.logDet).toBeCloseTo(logDetSpd(informationMatrix(F, p, r.indices), p), 9);
      expect(r.logDet).toBeCloseTo(designLogDet(terms, r.indices.map((i) => grid[i]!)), 9);
    }
  });

  it("the tabu phase never ends below the Fedorov local optimum it starts from", () => {
    for (const seed of [1, 2, 3, 4]) {
      const plain = fedorovExchange(F, p, { runs: 14, seed, starts: 1, tabuSteps: 0 });
      const tabu = fedorovExchange(F, p, { runs: 14, seed, starts: 1 });
      expect(tabu.logDet).toBeGreaterThanOrEqual(plain.logDet - 1e-9);
    }
  });

  it("is deterministic for a seed, also when the work budget stops it", () => {
    const a = fedorovExchange(F, p, { runs: 14, seed: 9, workBudget: 2e6 });
    const b = fedorovExchange(F, p, { runs: 14, seed: 9, workBudget: 2e6 });
    expect(a.stoppedByBudget).toBe(true);
    expect(a.indices).toEqual(b.indices);
    expect(Number.isFinite(a.logDet)).toBe(true);
    expect(a.work).toBeLessThanOrEqual(2e6 + 1e5);
  });

  it("reaches ≥ 0.99 of the reference D-criterion on the bench case with default settings", () => {
    // Reference: bench/fixtures/d-optimal-reference.json, a 200-start plain modified Fedorov
    // search (how it was made is recorded in the file); its ln det is recomputed here from
    // the stored runs. Ratio (|X'X|/|X_ref'X_ref|)^(1/p), as in the bench.
    const ref = JSON.parse(readFileSync(new URL("../../../bench/fixtures/d-optimal-reference.json", import.meta.url), "utf8")) as { logDet: number; runs: number[][] };
    const six = buildTerms("quadratic", names(6));
    const refLogDet = designLogDet(six, ref.runs);
    expect(refLogDet).toBeCloseTo(ref.logDet, 9);
    const factors = names(6).map((name) => ({ name, low: 0, high: 10 }));
    for (const seed of [1, 2]) {
      const d = generateDesign({ factors, design: "d-optimal", runs: 40, model: "quadratic", levels: 3, seed });
      expect(Math.exp((d.dOptimal!.logDet - refLogDet) / six.length)).toBeGreaterThanOrEqual(0.99);
    }
  }, 60_000);
});
