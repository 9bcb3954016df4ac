import { describe, expect, it } from "vitest";
import { augmentToCentralComposite, fullFactorialCoded, generateDesign, orthogonalBlockingAlpha, seededRng } from "../../../lib/doe";
import { fitModel } from "../../../lib/stats";
import { AppError } from "../../../lib/errors/app-error";

const F3 = [
  { name: "temperature", low: 100, high: 140, unit: "degC", scale: "linear" as const },
  { name: "base", low: 1, high: 2, unit: "equiv", scale: "linear" as const },
  { name: "time", low: 2, high: 6, unit: "h", scale: "linear" as const },
];
const centres = (n: number) => Array.from({ length: n }, () => [0, 0, 0]);
const factorial = [...fullFactorialCoded(3), ...centres(4)]; // the 2^3 plan with 4 centre runs

describe("augmenting a 2^3 factorial to a central composite design", () => {
  it("gives the axial and centre runs of a rotatable CCD (α = 1.682, REFERENCE.md §6) in a second block", () => {
    const a = augmentToCentralComposite(F3, { runs: factorial, centerPoints: 2 });
    expect(a.alpha).toBeCloseTo(1.682, 3);
    expect(a.rotatable).toBe(true);
    expect(a.runs.map((r) => r.kind)).toEqual(["axial", "axial", "axial", "axial", "axial", "axial", "center", "center"]);
    expect(a.runs.every((r) => r.block === 2)).toBe(true);
    // The same axial points as the project's CCD generator for k = 3 (standard order: −α, +α per factor).
    const ccd = generateDesign({ factors: F3, design: "central-composite", alpha: "rotatable", centerPoints: 0, randomize: false });
    // Axial runs: exactly one factor away from the centre (not read from the run's kind field).
    const axial = ccd.runs.filter((r) => F3.filter((f) => r.coded[f.name] !== 0).length === 1);
    expect(axial).toHaveLength(6);
    a.runs.slice(0, 6).forEach((r, i) => {
      for (const f of F3) expect(r.coded[f.name]).toBeCloseTo(axial[i]!.coded[f.name]!, 12);
      for (const f of F3) expect(r.natural[f.name]).toBeCloseTo(axial[i]!.natural[f.name]!, 10);
    });
    expect(a.runs[6]!.natural).toEqual({ temperature: 120, base: 1.5, time: 4 });
    expect(a.notes.join(" ")).toMatch(/not orthogonal/);
  });
  it("blocks orthogonally with α = √(F(2k + n_ca)/(2(F + n_cf))) = 1.633 for F = 8, 4 + 2 centre runs (Montgomery's table, from memory)", () => {
    expect(orthogonalBlockingAlpha(3, 8, 4, 2)).toBeCloseTo(1.633, 3);
    expect(orthogonalBlockingAlpha(2, 4, 3, 3)).toBeCloseTo(Math.SQRT2, 12); // k = 2: rotatable and orthogonal together
    const a = augmentToCentralComposite(F3, { runs: factorial, centerPoints: 2, alpha: "orthogonal" });
    expect(a.orthogonallyBlocked).toBe(true);
    expect(a.rotatable).toBe(false);
    // What orthogonal blocking means (computed in this test): with any responses, adding the block
    // term leaves every coefficient but the intercept unchanged. Not so at the rotatable α.
    const rng = seededRng(11);
    const check = (alpha: "orthogonal" | "rotatable") => {
      const aug = augmentToCentralComposite(F3, { runs: factorial, centerPoints: 2, alpha });
      const coded = [...factorial.map((x) => Object.fromEntries(F3.map((f, i) => [f.name, x[i]!]))), ...aug.runs.map((r) => r.coded)];
      const ys = coded.map(() => 50 + 10 * rng());
      const blocks = coded.map((_, i) => (i < factorial.length ? "first plan" : "augmentation"));
      const withB = fitModel({ factors: F3, runs: coded.map((c, i) => ({ coded: c, response: ys[i]!, block: blocks[i]! })), model: "quadratic" });
      const without = fitModel({ factors: F3, runs: coded.map((c, i) => ({ coded: c, response: ys[i]! })), model: "quadratic" });
      return Math.max(...withB.terms.slice(1).map((t, j) => Math.abs(t.estimate - without.terms[j + 1]!.estimate)));
    };
    expect(check("orthogonal")).toBeLessThan(1e-10);
    expect(check("rotatable")).toBeGreaterThan(1e-4);
  });
  it("stays within a factor's limit: α cut to 1.5 when the block holds at most 150 °C, and says rotatability was given up", () => {
    const a = augmentToCentralComposite(F3, { runs: factorial, centerPoints: 2, limits: { temperature: { max: 150 } } });
    expect(a.alpha).toBeCloseTo(1.5, 12); // (150 − 120)/20
    expect(a.runs[1]!.natural.temperature).toBe(150);
    expect(a.rotatable).toBe(false);
    expect(a.notes[0]).toMatch(/α reduced from 1\.682 to 1\.5: temperature at \+α would be 153\.6 degC, above its upper limit of 150 degC/);
    expect(a.notes[1]).toMatch(/^Rotatability given up/);
  });
  it("stays inside the safe envelope: the largest α at which no axial point is blocked (to 0.001)", () => {
    const asked: number[] = [];
    const safety = (p: Record<string, number>) => {
      asked.push(p.temperature!);
      return { blocking: p.temperature! > 145 ? [{ code: "vessel.overpressure", message: "above the vial's rating" }] : [] };
    };
    const a = augmentToCentralComposite(F3, { runs: factorial, centerPoints: 2, safety });
    expect(a.alpha).toBeGreaterThan(1.249);
    expect(a.alpha).toBeLessThanOrEqual(1.25); // 145 °C = 120 + 1.25·20
    expect(a.runs.every((r) => safety(r.natural).blocking.length === 0)).toBe(true);
    expect(a.limitedBy.join(" ")).toMatch(/vessel\.overpressure/);
    expect(a.notes.join(" ")).toMatch(/Rotatability given up/);
  });
  it("refuses runs that are not factorial or centre points, and an envelope that blocks even α = 1", () => {
    try {
      augmentToCentralComposite(F3, { runs: [...factorial, [0.5, 0, 0]] });
      expect.unreachable();
    } catch (e) {
      expect((e as AppError).issues[0]!.path).toBe("runs.12");
    }
    try {
      augmentToCentralComposite(F3, { runs: factorial, safety: (p) => ({ blocking: p.temperature! > 135 ? [{ code: "x", message: "too hot" }] : [] }) });
      expect.unreachable();
    } catch (e) {
      expect((e as AppError).code).toBe("infeasible");
      expect((e as AppError).issues[0]!.path).toBe("safety");
    }
  });
});
