/**
 * Chemistry engine benchmarks (issue 4): the run sheet of a 96-vial plan with 8
 * components (target ≤ 50 ms) and of a 1536-vial plan (target ≤ 500 ms). Timed work:
 * `buildRunSheet` from the raw plan document (schema parse, stoichiometry, stock and
 * master-mix planning, dispense lists, inventory).
 */
import type { BenchCase } from "./harness";
import { buildRunSheet } from "../lib/chemistry/run-sheet";
import type { PlanDocumentInput } from "../lib/chemistry/plan-document";
import { readFileSync } from "node:fs";
import { pointSafety } from "../lib/chemistry/point-safety";

/**
 * The safety of every point of a 101 × 101 grid over temperature (20–220 °C) and water
 * fraction (0–0.5) of the demo's Suzuki screen (examples/plan-suzuki.json), the other
 * factors at their centre: 10 201 calls of the prepared `pointSafety` check (target
 * ≤ 200 ms, i.e. ≤ 20 µs a point). Preparing the check is not timed.
 */
function safetyGrid() {
  const doc = JSON.parse(readFileSync(new URL("../examples/plan-suzuki.json", import.meta.url), "utf8")) as PlanDocumentInput;
  const at = pointSafety(doc);
  const points: Array<Record<string, number>> = [];
  for (let i = 0; i <= 100; i++) {
    for (let j = 0; j <= 100; j++) {
      points.push({ temperature: 20 + 2 * i, baseEquiv: 2.25, boronicEquiv: 1.3, pdLoading: 1.25, waterFraction: 0.005 * j });
    }
  }
  return { at, points };
}

/** The same check at 10 201 scattered points of the studied box (no value repeats: nothing is shared between points). */
function safetyScatter() {
  const { at } = safetyGrid();
  const rnd = lcg(11);
  const box: Array<[string, number, number]> = [["temperature", 20, 220], ["baseEquiv", 1.5, 3], ["boronicEquiv", 1.1, 1.5], ["pdLoading", 0.5, 2], ["waterFraction", 0, 0.5]];
  const points = Array.from({ length: 10201 }, () => Object.fromEntries(box.map(([k, lo, hi]) => [k, lo + ((hi - lo) * (rnd() + 1)) / 2])));
  return { at, points };
}

const FACTOR_NAMES = ["temperature", "baseEquiv", "boronicEquiv", "pdLoading", "waterFraction"];

/** A deterministic pseudo-random sequence in [−1, 1] (Park–Miller minimal standard). */
function lcg(seed: number): () => number {
  let s = seed;
  return () => {
    s = (s * 48271) % 2147483647;
    return (s / 2147483647) * 2 - 1;
  };
}

/** An 8-component Suzuki–Miyaura plan in 1 mL vials (96-position block) with `n` runs. */
function plan(n: number): PlanDocumentInput {
  const rnd = lcg(7);
  const runs = Array.from({ length: n }, (_, i) => ({
    standardOrder: i + 1,
    coded: Object.fromEntries(FACTOR_NAMES.map((f) => [f, rnd()])),
  }));
  return {
    name: `bench ${n} vials`,
    recipe: {
      limitingReagent: "arBr",
      scaleMmol: 0.05,
      concentrationM: 0.2,
      components: [
        { id: "arBr", name: "aryl bromide", role: "reagent", formula: "C9H11Br", form: { state: "liquid", densityGPerMl: 1.29, purityWtPercent: 98 } },
        { id: "boronicAcid", name: "boronic acid", role: "reagent", formula: "C6H8BNO3", equivalents: 1.3, form: { state: "solid", purityWtPercent: 97 }, solubilityMgPerMl: 150 },
        { id: "base", name: "K3PO4", role: "reagent", formula: "K3PO4", equivalents: 2, form: { state: "solid", purityWtPercent: 98 }, stockSolvent: "water", solubilityMgPerMl: 900 },
        { id: "pd", name: "Pd dimer", role: "catalyst", formula: "(Pd(C3H5)Cl)2", metalAtomsPerFormula: 2, loadingMolPercent: 1, form: { state: "solid" }, solubilityMgPerMl: 20 },
        { id: "ligand", name: "phosphine", role: "ligand", formula: "C26H35O2P", ligandToMetalRatio: 2, form: { state: "solid" }, solubilityMgPerMl: 100 },
        { id: "std", name: "1,3,5-trimethoxybenzene (internal standard)", role: "additive", formula: "C9H12O3", equivalents: 0.25, form: { state: "solid" }, solubilityMgPerMl: 200 },
        { id: "tbab", name: "tetrabutylammonium bromide", role: "additive", formula: "C16H36BrN", equivalents: 0.1, form: { state: "solid" }, stockSolvent: "water", solubilityMgPerMl: 500 },
        { id: "bht", name: "BHT (radical scavenger)", role: "additive", formula: "C15H24O", equivalents: 0.05, form: { state: "solid" }, solubilityMgPerMl: 300 },
      ],
      solvents: [
        { name: "1,4-dioxane", volumeFraction: 0.8 },
        { name: "water", volumeFraction: 0.2 },
      ],
    },
    factors: [
      { name: "temperature", low: 60, high: 100, unit: "degC", binding: { kind: "temperature" } },
      { name: "baseEquiv", low: 1.5, high: 3, unit: "equiv", binding: { kind: "equivalents", component: "base" } },
      { name: "boronicEquiv", low: 1.1, high: 1.5, unit: "equiv", binding: { kind: "equivalents", component: "boronicAcid" } },
      { name: "pdLoading", low: 0.5, high: 2, unit: "mol%", binding: { kind: "loading", component: "pd" } },
      { name: "waterFraction", low: 0.15, high: 0.3, unit: "fraction", binding: { kind: "solvent-fraction", solvent: "water" } },
    ],
    design: { runs },
    vessel: "vial-1ml-screw-septum",
    dispensing: { minPipetteVolumeUl: 5, minWeighMassMg: 8.2 },
  };
}

export const cases: BenchCase[] = [
  {
    name: "chemistry: run sheet, 96 vials × 8 components",
    targetMs: 50,
    // Steady state: enough warm-up runs for the JIT to compile the planner.
    warmup: 10,
    repeat: 31,
    setup: () => plan(96),
    run: (doc) => buildRunSheet(doc),
  },
  {
    name: "chemistry: run sheet, 1536 vials × 8 components",
    targetMs: 500,
    warmup: 5,
    repeat: 15,
    setup: () => plan(1536),
    run: (doc) => buildRunSheet(doc),
  },
  {
    name: "chemistry: pointSafety on a 101 × 101 grid (10 201 points)",
    targetMs: 200,
    warmup: 3,
    repeat: 11,
    setup: safetyGrid,
    run: (state) => {
      const { at, points } = state as ReturnType<typeof safetyGrid>;
      let blocked = 0;
      for (const p of points) if (at(p).blocking.length > 0) blocked++;
      return blocked;
    },
  },
  {
    name: "chemistry: pointSafety at 10 201 scattered points (nothing shared)",
    targetMs: 200,
    warmup: 3,
    repeat: 11,
    setup: safetyScatter,
    run: (state) => {
      const { at, points } = state as ReturnType<typeof safetyScatter>;
      let blocked = 0;
      for (const p of points) if (at(p).blocking.length > 0) blocked++;
      return blocked;
    },
  },
];
