import { describe, expect, it } from "vitest";
import {
  defaultGenerators,
  fractionalFactorialCoded,
  generateDesign,
  parseGenerators,
  resolutionOf,
  searchGenerators,
  wordLengthPattern,
  TABLED_GENERATORS,
  definingRelation,
  type DesignOutput,
} from "../../../lib/doe";

const factors = (k: number) => Array.from({ length: k }, (_, i) => ({ name: `x${i + 1}`, low: 10 * i, high: 10 * i + 20 }));
const codedMatrix = (d: DesignOutput) => d.runs.map((r) => Object.values(r.coded));

describe("full factorial in Yates order", () => {
  it("puts the first factor fastest (CONTRACT.md standard order; Montgomery §6.3)", () => {
    const d = generateDesign({ factors: factors(3), design: "full-factorial", randomize: false });
    expect(codedMatrix(d)).toEqual([
      [-1, -1, -1], [1, -1, -1], [-1, 1, -1], [1, 1, -1],
      [-1, -1, 1], [1, -1, 1], [-1, 1, 1], [1, 1, 1],
    ]);
    expect(d.runs.map((r) => r.runOrder)).toEqual([1, 2, 3, 4, 5, 6, 7, 8]);
    expect(d.runs[1]!.natural).toEqual({ x1: 20, x2: 10, x3: 20 });
  });
  it("repeats the whole list for replicates, centre points after the factorial part", () => {
    const d = generateDesign({ factors: factors(2), design: "full-factorial", centerPoints: 2, replicates: 2, randomize: false });
    expect(d.runs.length).toBe(12); // (4 + 2) × 2, CONTRACT.md "replicates repeat the whole list"
    expect(d.runs.map((r) => r.kind).slice(0, 6)).toEqual(["factorial", "factorial", "factorial", "factorial", "center", "center"]);
    expect(codedMatrix(d).slice(6)).toEqual(codedMatrix(d).slice(0, 6));
    expect(d.runs.map((r) => r.standardOrder)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10, 11, 12]);
  });
});

describe("fractional factorial generators and resolutions", () => {
  // Montgomery, Design and Analysis of Experiments, table of selected 2^(k−p) designs,
  // as given in REFERENCE.md §6 (tagged [C; as tabulated in Montgomery, M]: from memory).
  const table: [number, number, string[], number][] = [
    [5, 1, ["E=ABCD"], 5],
    [5, 2, ["D=AB", "E=AC"], 3],
    [6, 1, ["F=ABCDE"], 6],
    [6, 2, ["E=ABC", "F=BCD"], 4],
    [6, 3, ["D=AB", "E=AC", "F=BC"], 3],
    [7, 1, ["G=ABCDEF"], 7],
    [7, 2, ["F=ABCD", "G=ABDE"], 4],
    [7, 3, ["E=ABC", "F=BCD", "G=ACD"], 4],
    [7, 4, ["D=AB", "E=AC", "F=BC", "G=ABC"], 3],
  ];
  it.each(table)("2^(%i−%i) with %j has resolution %i and is the default", (k, p, gens, res) => {
    const f = fractionalFactorialCoded(k, parseGenerators(gens, k));
    expect(resolutionOf(f.definingRelation)).toBe(res);
    expect(f.rows.length).toBe(2 ** (k - p));
    // The default choice is at least as good: same resolution (computed in this test).
    expect(resolutionOf(definingRelation(defaultGenerators(k, p)))).toBe(res);
  });
  it("reports resolution and alias chains through the design verb (2^(5−1), I = ABCDE)", () => {
    const d = generateDesign({ factors: factors(5), design: "fractional-factorial", randomize: false });
    expect(d.resolution).toBe("V");
    expect(d.generators).toEqual(["E=ABCD"]);
    expect(d.aliases["A"]).toEqual(["BCDE"]); // CONTRACT.md example; A·ABCDE = BCDE
    expect(d.aliases["AB"]).toEqual(["CDE"]);
  });
  it("keeps a generator's sign: E = −ABCD gives I = −ABCDE and negative aliases", () => {
    const d = generateDesign({ factors: factors(5), design: "fractional-factorial", generators: ["E=-ABCD"], randomize: false });
    expect(d.definingRelation).toEqual(["I=-ABCDE"]);
    expect(d.aliases["A"]).toEqual(["-BCDE"]);
    for (const r of d.runs) {
      const c = Object.values(r.coded);
      expect(c[4]).toBe(-c[0]! * c[1]! * c[2]! * c[3]!);
    }
  });
  it("every two-level column of every default fraction (k ≤ 10) is balanced and orthogonal to the others", () => {
    // Balance: Σ x = 0; orthogonality: Σ xᵢxⱼ = 0 (Montgomery §6.2 properties of 2^k designs).
    let checked = 0;
    for (let k = 3; k <= 10; k++) {
      for (let p = 1; k - p >= 2; p++) {
        if (k > 2 ** (k - p) - 1) continue; // no such fraction
        checked++;
        const rows = fractionalFactorialCoded(k, defaultGenerators(k, p)).rows;
        for (let i = 0; i < k; i++) {
          expect(rows.reduce((s, r) => s + r[i]!, 0)).toBe(0);
          for (let j = i + 1; j < k; j++) expect(rows.reduce((s, r) => s + r[i]! * r[j]!, 0)).toBe(0);
        }
      }
    }
    // every (k, p) with 3 ≤ k ≤ 10 and k ≤ 2^(k−p) − 1, counted by hand: 1+1+2+3+4+4+5+6 for k = 3…10
    expect(checked).toBe(26);
  });
  it("every tabled default has the minimum-aberration word-length pattern found by exhaustive search", () => {
    // Fries & Hunter (1980) minimum aberration, checked by exhaustive search over the last p
    // factors' generators (computed in this test) wherever the search has ≤ 30 000 choices.
    let checked = 0;
    for (const [key, gens] of Object.entries(TABLED_GENERATORS)) {
      const [k, p] = key.split("-").map(Number) as [number, number];
      const cands = 2 ** (k - p) - 1 - (k - p);
      let combos = 1;
      for (let j = 0; j < p; j++) combos = (combos * (cands - j)) / (j + 1);
      if (combos > 30000) continue;
      checked++;
      const tab = wordLengthPattern(definingRelation(parseGenerators(gens, k)), k);
      expect(wordLengthPattern(definingRelation(searchGenerators(k, p, 30000)), k)).toEqual(tab);
    }
    expect(checked).toBeGreaterThanOrEqual(18);
    // Example: 2^(6−2) with E = ABC, F = BCD has I = ABCE = BCDF = ADEF, three words of length 4.
    expect(wordLengthPattern(definingRelation(parseGenerators(["E=ABC", "F=BCD"], 6)), 6)[4]).toBe(3);
  });
  it("2^(10−3) has resolution V and 10 + 45 alias chains of 7 words", () => {
    const d = generateDesign({ factors: factors(10), design: "fractional-factorial", fraction: 3, randomize: false });
    expect(d.runs.length).toBe(128);
    expect(d.resolution).toBe("V"); // Montgomery's table: 2^(10−3)_V
    expect(Object.keys(d.aliases).length).toBe(55);
    expect(d.aliases["A"]!.length).toBe(7);
  });
  it("rejects bad generators with the path of the generator", () => {
    expect(() => generateDesign({ factors: factors(5), design: "fractional-factorial", generators: ["E=ABZ"] })).toThrow(/generators\.0/);
    expect(() => generateDesign({ factors: factors(5), design: "fractional-factorial", generators: ["E=AE"] })).toThrow();
  });
});

describe("central composite designs", () => {
  // NIST/SEMATECH e-Handbook §5.3.3.6.1, rotatable α = F^¼ (REFERENCE.md §6).
  const cases: [number, number | undefined, number][] = [
    [2, undefined, 1.414],
    [3, undefined, 1.682],
    [4, undefined, 2.0],
    [5, 1, 2.0],
    [5, undefined, 2.378],
    [6, 1, 2.378],
    [6, undefined, 2.828],
  ];
  it.each(cases)("k = %i (fraction p = %s): rotatable α = %f and F + 2k + n0 runs", (k, p, alpha) => {
    const d = generateDesign({ factors: factors(k), design: "central-composite", centerPoints: 4, randomize: false, fraction: p });
    expect(d.alpha).toBeCloseTo(alpha, 3);
    const F = 2 ** (k - (p ?? 0));
    expect(d.runs.length).toBe(F + 2 * k + 4); // REFERENCE.md §6: CCD runs = F + 2k + n0
  });
  it("orders axial points −α, +α for the first factor, then the next, then centre points", () => {
    const d = generateDesign({ factors: factors(2), design: "central-composite", centerPoints: 1, randomize: false });
    const a = d.alpha!;
    expect(codedMatrix(d).slice(4)).toEqual([[-a, 0], [a, 0], [0, -a], [0, a], [0, 0]]);
    expect(d.runs.slice(4).map((r) => r.kind)).toEqual(["axial", "axial", "axial", "axial", "center"]);
  });
  it("spherical α = √k, face-centred α = 1, numeric α as given", () => {
    expect(generateDesign({ factors: factors(3), design: "central-composite", alpha: "spherical" }).alpha).toBeCloseTo(Math.sqrt(3), 14);
    expect(generateDesign({ factors: factors(3), design: "central-composite", alpha: "face-centered" }).alpha).toBe(1);
    expect(generateDesign({ factors: factors(3), design: "central-composite", alpha: 1.5 }).alpha).toBe(1.5);
  });
  it("inscribed designs put the axial points at the natural limits (CONTRACT.md)", () => {
    const d = generateDesign({ factors: factors(2), design: "central-composite", placement: "inscribed", randomize: false });
    const axial = d.runs.filter((r) => r.kind === "axial");
    expect(axial[0]!.natural.x1).toBeCloseTo(0, 12); // low of x1
    expect(axial[1]!.natural.x1).toBeCloseTo(20, 12); // high of x1
    const fact = d.runs.filter((r) => r.kind === "factorial");
    expect(Math.abs(fact[0]!.coded.x1!)).toBeCloseTo(1 / Math.SQRT2, 12); // ±1/α
  });
  it("augments an existing 2² factorial with axial and centre runs in block 2", () => {
    const existing = [
      { coded: { x1: -1, x2: -1 } }, { coded: { x1: 1, x2: -1 } }, { coded: { x1: -1, x2: 1 } }, { coded: { x1: 1, x2: 1 } },
      { coded: { x1: 0, x2: 0 } },
    ];
    const d = generateDesign({ factors: factors(2), design: "central-composite", augment: { runs: existing }, centerPoints: 2, seed: 3 });
    expect(d.runs.length).toBe(5 + 4 + 2);
    expect(d.runs.slice(0, 5).every((r) => r.block === 1)).toBe(true);
    expect(d.runs.slice(5).every((r) => r.block === 2)).toBe(true);
    expect(d.runs.slice(0, 5).map((r) => r.runOrder)).toEqual([1, 2, 3, 4, 5]);
    expect(d.alpha).toBeCloseTo(Math.SQRT2, 12); // F = 4 existing factorial points
  });
  it("an augmentation goes through the one augmentation rule: a run that is neither ±1 nor centre is named under augment.", () => {
    const existing = [{ coded: { x1: -1, x2: -1 } }, { coded: { x1: 1, x2: -1 } }, { coded: { x1: 0.5, x2: 1 } }, { coded: { x1: 1, x2: 1 } }];
    try {
      generateDesign({ factors: factors(2), design: "central-composite", augment: { runs: existing }, seed: 3 });
      expect.unreachable("a half-level run is not a factorial point");
    } catch (e) {
      expect((e as { issues: { path: string }[] }).issues.map((i) => i.path)).toEqual(["augment.runs.2"]);
    }
    // Spherical α = √k (PRODUCT.md "Computation") for the augmentation too.
    const sph = generateDesign({ factors: factors(3), design: "central-composite", alpha: "spherical", augment: { runs: [
      { coded: { x1: -1, x2: -1, x3: -1 } }, { coded: { x1: 1, x2: -1, x3: 1 } }, { coded: { x1: -1, x2: 1, x3: 1 } }, { coded: { x1: 1, x2: 1, x3: -1 } },
    ] }, seed: 1 });
    expect(sph.alpha).toBeCloseTo(Math.sqrt(3), 12);
  });
  it("two blocks: factorial part in block 1, axial part in block 2, centre points shared", () => {
    const d = generateDesign({ factors: factors(3), design: "central-composite", blocks: 2, centerPoints: 4, randomize: false });
    expect(d.runs.filter((r) => r.kind === "axial").every((r) => r.block === 2)).toBe(true);
    expect(d.runs.filter((r) => r.kind === "factorial").every((r) => r.block === 1)).toBe(true);
    expect(d.runs.filter((r) => r.kind === "center").map((r) => r.block)).toEqual([1, 2, 1, 2]);
  });
});

describe("Box–Behnken designs", () => {
  // Non-centre runs 12, 24, 40, 48, 56 for k = 3…7 (REFERENCE.md §6, from memory).
  it.each([[3, 12], [4, 24], [5, 40], [6, 48], [7, 56]])("k = %i has %i non-centre runs, three levels, balanced columns", (k, n) => {
    const d = generateDesign({ factors: factors(k), design: "box-behnken", centerPoints: 3, randomize: false });
    expect(d.runs.length).toBe(n + 3);
    const X = codedMatrix(d);
    for (let i = 0; i < k; i++) {
      expect(X.reduce((s, r) => s + r[i]!, 0)).toBe(0);
      expect(new Set(X.map((r) => r[i])).size).toBe(3);
      for (let j = i + 1; j < k; j++) expect(X.reduce((s, r) => s + r[i]! * r[j]!, 0)).toBe(0);
    }
  });
});

describe("blocks and hard-to-change factors", () => {
  it("splits a 2^3 into two blocks confounded with ABC (Montgomery §7.4)", () => {
    const d = generateDesign({ factors: factors(3), design: "full-factorial", blocks: 2, randomize: false });
    expect(d.blockConfounding).toEqual(["ABC"]);
    for (const r of d.runs) {
      const [a, b, c] = Object.values(r.coded);
      expect(r.block).toBe(a! * b! * c! > 0 ? 2 : 1);
    }
  });
  it("a 2^4 in four blocks confounds no main effect or two-factor interaction", () => {
    const d = generateDesign({ factors: factors(4), design: "full-factorial", blocks: 4 });
    expect(new Set(d.runs.map((r) => r.block)).size).toBe(4);
    for (const w of d.blockConfounding) expect(w.length).toBeGreaterThanOrEqual(3);
  });
  it("groups runs by the level of a hard-to-change factor, blocks in order", () => {
    const d = generateDesign({ factors: factors(3), design: "full-factorial", hardToChange: "x1", replicates: 2, blockByReplicate: true, seed: 11 });
    const byOrder = [...d.runs].sort((a, b) => a.runOrder - b.runOrder);
    // Within each block the x1 level changes once only.
    for (const block of [1, 2]) {
      const levels = byOrder.filter((r) => r.block === block).map((r) => r.coded.x1);
      const changes = levels.filter((v, i) => i > 0 && v !== levels[i - 1]).length;
      expect(changes).toBe(1);
    }
    expect(byOrder.slice(0, 8).every((r) => r.block === 1)).toBe(true);
  });
});

describe("log-scale factors in designs", () => {
  it("puts the centre at the geometric mean and axial points at exp(u0 ± α·Δu)", () => {
    const d = generateDesign({ factors: [{ name: "loading", low: 0.5, high: 2, scale: "log" }, { name: "t", low: 0, high: 1 }], design: "central-composite", randomize: false, centerPoints: 1 });
    const centre = d.runs.find((r) => r.kind === "center")!;
    expect(centre.natural.loading).toBeCloseTo(1, 12); // √(0.5·2), computed by hand
    const ax = d.runs.filter((r) => r.kind === "axial")[0]!;
    expect(ax.natural.loading).toBeCloseTo(Math.exp(-Math.SQRT2 * Math.log(2)), 12); // ln-coding, Δ = ln 2
  });
});
