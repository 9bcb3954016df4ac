import { describe, expect, it } from "vitest";
import { AppError } from "../../../lib/errors/app-error";
import { generateDesign, isRemoved, removalReason, seededRng, type PointVerdict, type SafetyCheck } from "../../../lib/doe";

// Issue 10 item 5: the D-optimal alternative is searched over the candidate set less every
// candidate the hazard engine blocks. The search must never use a removed candidate.

const F3 = [
  { name: "temperature", low: 60, high: 120 },
  { name: "time", low: 1, high: 8 },
  { name: "equiv", low: 1, high: 2 },
];

function errorOf(fn: () => unknown): AppError {
  try {
    fn();
  } catch (e) {
    if (e instanceof AppError) return e;
    throw e;
  }
  throw new Error("expected an AppError");
}

describe("candidate filter of the d-optimal design", () => {
  it("true, a reason or a blocking caution removes a point; false, an empty reason or no caution keeps it", () => {
    expect([true, "boils", false, ""].map(isRemoved)).toEqual([true, true, false, false]);
    const caution = { code: "TEST-1", message: "above the vial's rating" };
    expect(isRemoved({ blocking: [] })).toBe(false);
    expect(removalReason({ blocking: [caution, { ...caution, message: "needs sign-off" }] })).toBe("above the vial's rating; needs sign-off");
  });

  it("takes the safe envelope's SafetyCheck as it is (the hazard engine's point safety)", () => {
    const check: SafetyCheck = (x) => ({ blocking: x.temperature! > 100 ? [{ code: "TEST-1", message: "above the vial's rating" }] : [] });
    const d = generateDesign({ factors: F3, design: "d-optimal", runs: 14, levels: 5, seed: 4 }, { exclude: check });
    for (const r of d.runs) expect(r.natural.temperature).toBeLessThanOrEqual(100);
    expect(d.dOptimal!.candidatesExcluded).toBe(50);
  });

  it("removes every candidate the caller's test blocks, and counts them", () => {
    const hot: PointVerdict = (x) => (x.temperature! > 100 ? "above the vial's rating" : false);
    const d = generateDesign({ factors: F3, design: "d-optimal", runs: 14, levels: 5, seed: 2 }, { exclude: hot });
    for (const r of d.runs) expect(r.natural.temperature).toBeLessThanOrEqual(100);
    // 5^3 grid, temperature levels 60, 75, 90, 105, 120: the 2 × 25 points above 100 go.
    expect(d.dOptimal!.candidatesExcluded).toBe(50);
    expect(d.dOptimal!.candidates).toBe(75);
  });

  it("property: over random boxes, blocked regions and seeds, no run is ever a blocked point", { timeout: 120_000 }, () => {
    const rng = seededRng("filter-property");
    let designed = 0;
    for (let trial = 0; trial < 25; trial++) {
      const k = 2 + Math.floor(rng() * 3);
      const factors = Array.from({ length: k }, (_, i) => {
        const low = Math.round(rng() * 100);
        return { name: `f${i}`, low, high: low + 1 + Math.round(rng() * 50) };
      });
      // A random ball in natural units around a random point of the box.
      const centre = factors.map((f) => f.low + rng() * (f.high - f.low));
      const radius = 0.2 + rng() * 0.6;
      const blocked: PointVerdict = (x) =>
        Math.hypot(...factors.map((f, i) => (x[f.name]! - centre[i]!) / (f.high - f.low))) < radius;
      const model = rng() < 0.5 ? "quadratic" : "interaction";
      const p = model === "quadratic" ? ((k + 1) * (k + 2)) / 2 : 1 + k + (k * (k - 1)) / 2;
      try {
        const d = generateDesign({ factors, design: "d-optimal", runs: p + 2, model, levels: 5, seed: trial, starts: 2, tabuSteps: 100 }, { exclude: blocked });
        for (const r of d.runs) expect(blocked(r.natural)).toBe(false);
        expect(d.dOptimal!.candidatesExcluded).toBeGreaterThan(0);
        designed++;
      } catch (e) {
        // Allowed only as an honest refusal: the unblocked points cannot support the model.
        expect(e).toBeInstanceOf(AppError);
        expect((e as AppError).code).toBe("infeasible");
      }
    }
    expect(designed).toBeGreaterThanOrEqual(20); // the property was exercised, not skipped
  });

  it("excludeCandidates (natural units) removes the listed points", () => {
    const vertices = [60, 120].flatMap((temperature) => [1, 8].flatMap((time) => [1, 2].map((equiv) => ({ temperature, time, equiv }))));
    const d = generateDesign({ factors: F3, design: "d-optimal", runs: 12, model: "interaction", levels: 3, excludeCandidates: vertices, seed: 5 });
    const key = (x: Record<string, number>) => `${x.temperature},${x.time},${x.equiv}`;
    const banned = new Set(vertices.map(key));
    for (const r of d.runs) expect(banned.has(key(r.natural))).toBe(false);
    expect(d.dOptimal!.candidatesExcluded).toBe(8);
  });

  it("refuses centre points the filter blocks, naming centerPoints and the reason", () => {
    const e = errorOf(() => generateDesign({ factors: F3, design: "d-optimal", runs: 12, centerPoints: 2 }, { exclude: (x) => (x.temperature === 90 ? "sits at the solvent's boiling point" : false) }));
    expect(e.issues[0]!.path).toBe("centerPoints");
    expect(e.issues[0]!.message).toMatch(/boiling point/);
  });

  it("is infeasible, naming factors, when the filter removes every candidate", () => {
    const e = errorOf(() => generateDesign({ factors: F3, design: "d-optimal", runs: 12 }, { exclude: () => true }));
    expect(e.code).toBe("infeasible");
    expect(e.issues[0]!.path).toBe("factors");
  });
});
