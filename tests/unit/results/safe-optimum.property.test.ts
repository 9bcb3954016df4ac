import { readFileSync } from "node:fs";
import fc from "fast-check";
import { describe, expect, it } from "vitest";
import { resolveRuns } from "@/lib/chemistry/design-runs";
import { planDocumentSchema } from "@/lib/chemistry/plan-document";
import { pointSafety } from "@/lib/chemistry/point-safety";
import { analyzeSources } from "@/lib/results/analysis";
import { ENVELOPE_LIMITS } from "@/lib/results/envelope-codes";
import { cellKey, type ResultCell } from "@/lib/results/entries";
import { analysisQuerySchema } from "@/lib/results/schemas";
import type { StudyResponse } from "@/lib/studies/schemas";

/**
 * Property (issue 13): the optimum an analysis reports never lies where the hazard engine
 * blocks, nor outside the lab's limits — over random plans (the demo's Suzuki–Miyaura recipe
 * with a random solvent, vessel rating, scale, concentration, heating block and temperature
 * range) and random fitted models (a random quadratic with noise on the plan's own
 * central composite or Box–Behnken runs, fitted by the `fit` verb's function), with the
 * goal, the region and a second response through desirability drawn at random. The verdict
 * checked is pointSafety's own, at the reported natural values. When no optimum is
 * reported, a sample of the region finds no safe point either.
 */
const example = () => JSON.parse(readFileSync("examples/plan-suzuki.json", "utf8")) as Record<string, unknown> & { recipe: { solvents: unknown[]; scaleMmol: number; concentrationM: number }; factors: Array<Record<string, unknown>>; vessel: Record<string, unknown>; equipment: Record<string, unknown> };
const SOLVENTS = ["1,4-dioxane", "tetrahydrofuran", "toluene", "acetonitrile", "2-methyltetrahydrofuran", "ethanol"] as const;

const planArb = fc.record({
  solvent: fc.constantFrom(...SOLVENTS),
  waterFraction: fc.double({ min: 0.05, max: 0.4, noNaN: true }),
  ratedBar: fc.double({ min: 4, max: 20, noNaN: true }),
  scaleMmol: fc.double({ min: 0.1, max: 0.4, noNaN: true }),
  /** The final volume (mL) inside the vial's working range of 0.5–2 mL; the concentration follows. */
  volumeMl: fc.double({ min: 0.6, max: 1.6, noNaN: true }),
  /** The heating block's maximum, from the middle of the temperature range to 60 °C above it. */
  blockAbove: fc.integer({ min: -10, max: 60 }),
  tLow: fc.integer({ min: 40, max: 120 }),
  tWidth: fc.integer({ min: 15, max: 50 }),
  design: fc.constantFrom("central-composite", "box-behnken"),
});
const modelArb = fc.record({
  coef: fc.array(fc.double({ min: -6, max: 6, noNaN: true }), { minLength: 10, maxLength: 10 }),
  noise: fc.array(fc.double({ min: -0.5, max: 0.5, noNaN: true }), { minLength: 30, maxLength: 30 }),
  goal: fc.constantFrom("maximize", "minimize") as fc.Arbitrary<"maximize" | "minimize">,
  region: fc.constantFrom("cube", "sphere") as fc.Arbitrary<"cube" | "sphere">,
  combine: fc.boolean(),
});

describe("property: the reported optimum is never where the hazard engine blocks", () => {
  it("over random plans and fitted models (fast-check, 40 cases)", { timeout: 240_000 }, () => {
    let found = 0;
    let none = 0;
    let steered = 0;
    fc.assert(
      fc.property(planArb, modelArb, (p, m) => {
        const doc = example();
        doc.recipe.solvents = [{ name: p.solvent, volumeFraction: 1 - p.waterFraction }, { name: "water", volumeFraction: p.waterFraction }];
        doc.recipe.scaleMmol = p.scaleMmol;
        doc.recipe.concentrationM = p.scaleMmol / p.volumeMl;
        doc.vessel = { ...doc.vessel, ratedBar: p.ratedBar };
        doc.equipment = { ...doc.equipment, blockMaxC: p.tLow + p.tWidth / 2 + 10 + p.blockAbove };
        doc.factors = [{ ...doc.factors[0], low: p.tLow, high: p.tLow + p.tWidth }, doc.factors[1]!, doc.factors[3]!];
        doc.design = p.design === "box-behnken" ? { design: "box-behnken", centerPoints: 3, randomize: false } : { design: "central-composite", alpha: "rotatable", centerPoints: 3, randomize: false };
        const parsed = planDocumentSchema.parse(doc);
        const runs = resolveRuns(parsed);
        const results = new Map<string, ResultCell>();
        runs.forEach((r, i) => {
          const [a, b, c] = ["temperature", "baseEquiv", "pdLoading"].map((n) => (r.coded as Record<string, number>)[n]!);
          const k = m.coef;
          const y = 60 + k[0]! * a! + k[1]! * b! + k[2]! * c! + k[3]! * a! * a! + k[4]! * b! * b! + k[5]! * c! * c! + k[6]! * a! * b! + k[7]! * a! * c! + k[8]! * b! * c! + m.noise[i % 30]!;
          results.set(cellKey(r.standardOrder, "yield"), { run: r.standardOrder, response: "yield", value: y, failed: false, reason: null });
          results.set(cellKey(r.standardOrder, "impurity"), { run: r.standardOrder, response: "impurity", value: 2 + 0.1 * k[9]! * a! + 0.3 * m.noise[(i + 7) % 30]!, failed: false, reason: null });
        });
        const source = { id: "p", name: "random plan", factors: parsed.factors.map((f) => ({ name: f.name, low: f.low, high: f.high, unit: f.unit })), runs: runs.map((r) => ({ run: r.standardOrder, runOrder: r.runOrder, natural: r.natural })), results, exclusions: [] };
        const responses: StudyResponse[] = [{ name: "yield", unit: "%", goal: m.goal }, { name: "impurity", unit: "area %", goal: "minimize" }];
        const query = analysisQuerySchema.parse({ model: "quadratic", region: m.region, ...(m.combine ? { combine: "impurity" } : {}) });
        const a = analyzeSources([source], responses, query, { plan: { id: "p", name: "random plan" }, document: doc });
        const at = pointSafety(doc);
        if (a.optimum) {
          found++;
          if (a.optimum.safety.blockedWithoutEnvelope.length > 0) steered++;
          const verdict = at(a.optimum.natural);
          expect(verdict.blocking.map((c) => c.code)).toEqual([]);
          expect(verdict.limits.filter((l) => Object.hasOwn(ENVELOPE_LIMITS, l.code)).map((l) => l.code)).toEqual([]);
        } else {
          none++;
          // No optimum: then (the note says so) no sampled point of the cube is inside the envelope.
          expect(a.analysis.optimumNote).toMatch(/blocking cautions|no point/i);
          const f = parsed.factors;
          for (let s = 0; s < 300; s++) {
            const natural = Object.fromEntries(f.map((x, i) => [x.name, x.low + ((x.high - x.low) * ((s * (i + 3) * 0.618) % 1))]));
            const v = at(natural);
            expect(v.blocking.length + v.limits.filter((l) => Object.hasOwn(ENVELOPE_LIMITS, l.code)).length).toBeGreaterThan(0);
          }
        }
      }),
      { numRuns: 40, seed: 20261208 },
    );
    // The cases exercise both: an optimum the envelope had to move, and none left at all or a free one.
    console.log(`safe-optimum property: ${found} optima (${steered} moved by the envelope), ${none} plans with no safe point`);
    expect(found).toBeGreaterThan(10);
    expect(steered).toBeGreaterThan(0);
    expect(found + none).toBe(40);
  });
});
