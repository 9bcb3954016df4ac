import { readFileSync } from "node:fs";
import seedrandom from "seedrandom";
import { describe, expect, it } from "vitest";
import { AppError } from "@/lib/errors/app-error";
import { planReport } from "@/lib/chemistry/plan-report";
import { pointSafety, type PointSafetyResult } from "@/lib/chemistry/point-safety";

// pointSafety must say exactly what the full pipeline (validation, run sheet with
// planDispensing, caution rules) says about a one-run design at the same point: the
// property is checked on random points of a box much wider than the studied ranges of
// the demo's Suzuki screen (factors temperature, baseEquiv, boronicEquiv, pdLoading,
// waterFraction), and on the same plan with a pyrophoric reagent (n-BuLi as supplied).
type Doc = Record<string, unknown> & { recipe: { components: Array<Record<string, unknown>> }; design: unknown };
const example = (): Doc => JSON.parse(readFileSync("examples/plan-suzuki.json", "utf8")) as Doc;
function withBuLi(): Doc {
  const d = example();
  d.recipe.components.push({
    id: "buli",
    name: "n-butyllithium 2.5 M in hexanes",
    role: "additive",
    formula: "C4H9Li",
    equivalents: 0.05,
    form: { state: "solution", molarityM: 2.5, solvent: "n-hexane" },
    hazards: { ghs: ["H225", "H250", "H261", "H314"] }, // typical statements (from memory)
  });
  return d;
}

const BOX: Record<string, [number, number]> = {
  temperature: [-120, 340],
  baseEquiv: [-0.5, 6],
  boronicEquiv: [-0.2, 3],
  pdLoading: [-0.3, 5],
  waterFraction: [-0.1, 1.1],
};

type Outcome = { kind: "limit"; codes: string[] } | { kind: "report"; blocking: string[]; limits: string[] };

/** The full pipeline on a one-run design at `natural`. */
function pipeline(doc: Doc, natural: Record<string, number>): Outcome {
  try {
    const r = planReport({ ...doc, design: { runs: [{ standardOrder: 1, natural }] } });
    const limits = new Set<string>();
    for (const c of r.cautions) if (c.code === "TL-T01" || c.code === "TL-T02") limits.add(c.code);
    if (r.notes.some((n) => n.code === "solid_per_vial_solubility")) limits.add("stock_solubility");
    return {
      kind: "report",
      blocking: r.cautions.filter((c) => c.severity === "blocking").map((c) => `${c.code}|${c.component ?? ""}`).sort(),
      limits: [...limits].sort(),
    };
  } catch (e) {
    if (!(e instanceof AppError)) throw e;
    if (e.code === "invalid_input") return { kind: "limit", codes: ["amount_not_positive", "fraction_out_of_range", "temperature_not_accepted"] };
    if (/does not suit the vessel/.test(e.message)) return { kind: "limit", codes: ["vessel_volume_above", "vessel_volume_below"] };
    if (/as supplied/.test(e.message)) return { kind: "limit", codes: ["neat_over_volume"] };
    if (/do not fit into the vials/.test(e.message)) return { kind: "limit", codes: ["stock_solubility"] };
    throw e;
  }
}

function compare(doc: Doc, at: (n: Record<string, number>) => PointSafetyResult, natural: Record<string, number>): void {
  const want = pipeline(doc, natural);
  const got = at(natural);
  const where = JSON.stringify(natural);
  if (want.kind === "limit") {
    expect(got.limits.some((l) => want.codes.includes(l.code)), `${where}: ${JSON.stringify(got.limits)} should include one of ${want.codes.join(", ")}`).toBe(true);
    return;
  }
  expect(got.blocking.map((b) => `${b.code}|${b.component ?? ""}`).sort(), where).toEqual(want.blocking);
  const limits = [...new Set(got.limits.map((l) => l.code))].sort();
  expect(limits, where).toEqual(want.limits);
}

function points(seed: string, n: number, box: Record<string, [number, number]> = BOX): Array<Record<string, number>> {
  const rng = seedrandom(seed);
  return Array.from({ length: n }, () => Object.fromEntries(Object.entries(box).map(([k, [lo, hi]]) => [k, lo + (hi - lo) * rng()])));
}

/** The screen with concentration as a sixth factor (the volume follows): vessel volume limits come into play. */
function withConcentration(): Doc {
  const d = example() as Doc & { factors: Array<Record<string, unknown>> };
  d.factors.push({ name: "conc", low: 0.1, high: 0.4, unit: "M", binding: { kind: "concentration", hold: "scale" } });
  return d;
}

describe("pointSafety agrees with the full pipeline on a one-run design", { timeout: 120_000 }, () => {
  it("on 200 random points of the Suzuki screen's wider box", () => {
    const doc = example();
    const at = pointSafety(doc);
    for (const p of points("tareline-point-safety-1", 200)) compare(doc, at, p);
  });
  it("on 150 random points with a pyrophoric reagent, and at no water at all", () => {
    const doc = withBuLi();
    const at = pointSafety(doc);
    for (const p of points("tareline-point-safety-2", 150)) compare(doc, at, p);
    // With water in the vial n-BuLi meets an aqueous partner (TL-R04, blocking); without it, not.
    const wet = { temperature: 25, baseEquiv: 2, boronicEquiv: 1.3, pdLoading: 1, waterFraction: 0.2 };
    compare(doc, at, wet);
    compare(doc, at, { ...wet, waterFraction: 0 });
    expect(at(wet).blocking.some((b) => b.code === "TL-R04")).toBe(true);
    expect(at({ ...wet, waterFraction: 0 }).blocking.some((b) => b.code === "TL-R04")).toBe(false);
  });
  it("on 150 random points with concentration as a factor (the 4 mL vial's 0.5–2 mL range; 0.2 mmol needs 0.1–0.4 M)", () => {
    const doc = withConcentration();
    const at = pointSafety(doc);
    const box = { ...BOX, conc: [0.02, 0.8] as [number, number] };
    let volumeLimits = 0;
    for (const p of points("tareline-point-safety-3", 150, box)) {
      compare(doc, at, p);
      if (at(p).limits.some((l) => l.code.startsWith("vessel_volume"))) volumeLimits++;
    }
    // 0.2 mmol / 0.02–0.8 M = 10–0.25 mL (hand arithmetic): both sides of 0.5–2 mL occur.
    expect(volumeLimits).toBeGreaterThan(0);
  });
  it("on a grid (the same recipe at many temperatures, the same vial at many base amounts), point by point", () => {
    // A grid repeats values along its axes, and pointSafety computes each repeated part
    // once: every point must still agree with the pipeline run on that point alone.
    const doc = withBuLi();
    const at = pointSafety(doc);
    for (const temperature of [-90, 25, 100, 129, 131, 160, 330]) {
      for (const waterFraction of [0, 0.1, 0.3]) {
        for (const baseEquiv of [0.5, 3]) compare(doc, at, { temperature, baseEquiv, boronicEquiv: 1.3, pdLoading: 1, waterFraction });
      }
    }
  });
  it("finds the autoignition and pressure limits of the hazard engine, not a hand-written bound", () => {
    // 1,4-dioxane autoignition 180 °C (from memory) − the lab's 50 °C margin = 130 °C.
    const at = pointSafety(example());
    const base = { baseEquiv: 2, boronicEquiv: 1.3, pdLoading: 1, waterFraction: 0.2 };
    expect(at({ ...base, temperature: 129.9 }).blocking.some((b) => b.code === "TL-F02")).toBe(false);
    expect(at({ ...base, temperature: 130 }).blocking.some((b) => b.code === "TL-F02")).toBe(true);
    expect(at({ ...base, temperature: 151 }).limits.map((l) => l.code)).toContain("TL-T01");
  });
});
