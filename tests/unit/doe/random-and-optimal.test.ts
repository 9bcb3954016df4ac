import { describe, expect, it } from "vitest";
import {
  candidateMatrix,
  fedorovExchange,
  generateDesign,
  gridCandidates,
  informationMatrix,
  logDetSpd,
  seededRng,
  shuffle,
} from "../../../lib/doe";
import { buildTerms } from "../../../lib/stats";

const F3 = [
  { name: "temperature", low: 60, high: 120 },
  { name: "time", low: 1, high: 8 },
  { name: "equiv", low: 1, high: 2 },
];

describe("seeded randomisation (property, computed in this test)", () => {
  it("is reproducible for a seed and a permutation of 1…N", () => {
    for (const seed of [1, 7, 12345]) {
      const a = generateDesign({ factors: F3, design: "central-composite", seed, replicates: 2 });
      const b = generateDesign({ factors: F3, design: "central-composite", seed, replicates: 2 });
      expect(a.runs.map((r) => r.runOrder)).toEqual(b.runs.map((r) => r.runOrder));
      const order = a.runs.map((r) => r.runOrder).sort((x, y) => x - y);
      expect(order).toEqual(Array.from({ length: a.runs.length }, (_, i) => i + 1));
      expect(a.seed).toBe(seed);
    }
    const c = generateDesign({ factors: F3, design: "central-composite", seed: 8 });
    const d = generateDesign({ factors: F3, design: "central-composite", seed: 9 });
    expect(c.runs.map((r) => r.runOrder)).not.toEqual(d.runs.map((r) => r.runOrder));
  });
  it("shuffle returns every item once", () => {
    const rng = seededRng("x");
    for (let n = 0; n < 50; n++) {
      const items = Array.from({ length: n }, (_, i) => i);
      expect(shuffle(items, rng).sort((a, b) => a - b)).toEqual(items);
    }
  });
  it("without randomisation the run order is the standard order", () => {
    const d = generateDesign({ factors: F3, design: "box-behnken", randomize: false });
    expect(d.runs.map((r) => r.runOrder)).toEqual(d.runs.map((r) => r.standardOrder));
    expect(d.seed).toBeNull();
  });
});

describe("D-optimal designs by Fedorov exchange", () => {
  const constraints = [{ expr: "temperature + 10*time <= 150" }, { expr: "temperature - 5*equiv >= 55" }];
  it("never returns a point removed by the constraints", () => {
    const d = generateDesign({ factors: F3, design: "d-optimal", runs: 14, model: "quadratic", constraints, seed: 3 });
    expect(d.runs.length).toBe(14);
    for (const r of d.runs) {
      expect(r.natural.temperature! + 10 * r.natural.time!).toBeLessThanOrEqual(150 + 1e-9);
      expect(r.natural.temperature! - 5 * r.natural.equiv!).toBeGreaterThanOrEqual(55 - 1e-9);
      expect(r.kind).toBe("optimal");
    }
    expect(d.dOptimal!.candidatesRemoved).toBeGreaterThan(0);
    expect(d.dOptimal!.candidates + d.dOptimal!.candidatesRemoved).toBe(27); // 3^3 grid
  });
  it("has a log-determinant no worse than any of 200 random designs of equal size (computed in this test)", () => {
    const terms = buildTerms("quadratic", ["a", "b", "c"]);
    const cands = gridCandidates(3, 3);
    const F = candidateMatrix(terms, cands);
    const p = terms.length;
    const n = 14;
    const best = fedorovExchange(F, p, { runs: n, seed: 5 });
    expect(best.logDet).toBeCloseTo(logDetSpd(informationMatrix(F, p, best.indices), p), 8);
    const rng = seededRng(77);
    for (let t = 0; t < 200; t++) {
      const idx = Array.from({ length: n }, () => Math.floor(rng() * cands.length));
      expect(best.logDet).toBeGreaterThanOrEqual(logDetSpd(informationMatrix(F, p, idx), p));
    }
  });
  it("finds the 2^2 factorial as the D-optimal 4-run design for the interaction model (Atkinson & Donev)", () => {
    // For a + b + ab on [−1, 1]², the 2² factorial has X'X = 4I, the largest determinant any
    // ±1 matrix can have (Hadamard's bound): D-optimal, D-efficiency 100 %.
    const d = generateDesign({ factors: F3.slice(0, 2), design: "d-optimal", runs: 4, model: "interaction", seed: 2 });
    expect(d.dOptimal!.dEfficiency).toBeCloseTo(100, 9);
    const pts = d.runs.map((r) => `${r.coded.temperature},${r.coded.time}`).sort();
    expect(pts).toEqual(["-1,-1", "-1,1", "1,-1", "1,1"]);
  });
  it("is reproducible for a seed", () => {
    const a = generateDesign({ factors: F3, design: "d-optimal", runs: 12, seed: 4, randomize: false });
    const b = generateDesign({ factors: F3, design: "d-optimal", runs: 12, seed: 4, randomize: false });
    expect(a.runs).toEqual(b.runs);
  });
  it("refuses centre points that the constraints exclude", () => {
    // centre: temperature 90, time 4.5 → 90 + 45 = 135 > 120
    expect(() => generateDesign({ factors: F3, design: "d-optimal", runs: 12, centerPoints: 1, constraints: [{ expr: "temperature + 10*time <= 120" }] })).toThrow(/centerPoints/);
  });
  it("fails as infeasible when the constraints leave too few levels for the model", () => {
    // equiv ≥ 1.2 leaves two levels of equiv on the 3-level grid: equiv² is not estimable.
    expect(() => generateDesign({ factors: F3, design: "d-optimal", runs: 14, constraints: [{ expr: "equiv >= 1.2" }] })).toThrow(/singular/);
  });
  it("fails as infeasible when the constraints remove every candidate", () => {
    expect(() => generateDesign({ factors: F3, design: "d-optimal", runs: 12, constraints: [{ expr: "temperature <= 10" }] })).toThrow(/No candidate/);
  });
});
