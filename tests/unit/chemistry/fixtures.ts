/**
 * Plan documents for the chemistry tests: an invented Suzuki–Miyaura screen (the demo
 * scenario of the README) whose numbers are chosen for easy hand arithmetic.
 */
import type { PlanDocumentInput } from "@/lib/chemistry/plan-document";

/** A plan with the given factors and explicit runs (natural values), 4 mL vials. */
export function suzukiPlan(overrides: Partial<PlanDocumentInput> = {}): PlanDocumentInput {
  return {
    name: "test Suzuki screen",
    recipe: {
      limitingReagent: "arBr",
      scaleMmol: 0.25,
      concentrationM: 0.25,
      temperatureC: 80,
      timeH: 16,
      components: [
        {
          id: "arBr",
          name: "aryl bromide",
          role: "reagent",
          formula: "C9H11Br",
          form: { state: "liquid", densityGPerMl: 1.29, purityWtPercent: 98 },
        },
        {
          id: "boronicAcid",
          name: "heteroaryl boronic acid",
          role: "reagent",
          formula: "C6H8BNO3",
          equivalents: 1.5,
          form: { state: "solid", purityWtPercent: 97 },
          solubilityMgPerMl: 200,
        },
        {
          id: "base",
          name: "K3PO4",
          role: "reagent",
          formula: "K3PO4",
          equivalents: 2,
          form: { state: "solid", purityWtPercent: 98 },
          stockSolvent: "water",
          solubilityMgPerMl: 900,
        },
        {
          id: "pd",
          name: "allylpalladium chloride dimer",
          role: "catalyst",
          formula: "(Pd(C3H5)Cl)2",
          metalAtomsPerFormula: 2,
          loadingMolPercent: 1,
          form: { state: "solid", purityWtPercent: 98 },
          solubilityMgPerMl: 20,
          addSeparately: true,
        },
        {
          id: "ligand",
          name: "phosphine ligand",
          role: "ligand",
          formula: "C26H35O2P",
          ligandToMetalRatio: 2,
          form: { state: "solid", purityWtPercent: 100 },
          solubilityMgPerMl: 100,
          addSeparately: true,
        },
        {
          id: "additive",
          name: "TBAF 1.0 M in THF",
          role: "additive",
          formula: "C16H36FN",
          equivalents: 0.1,
          form: { state: "solution", molarityM: 1.0, solvent: "tetrahydrofuran" },
          dispense: "neat",
        },
      ],
      solvents: [
        { name: "1,4-dioxane", volumeFraction: 0.8 },
        { name: "water", volumeFraction: 0.2 },
      ],
    },
    factors: [],
    design: { runs: [{ standardOrder: 1 }] },
    vessel: "vial-4ml-screw-septum",
    dispensing: { minPipetteVolumeUl: 10, overagePercent: 10, deadVolumeUl: 50, minWeighMassMg: 8.2, maxStockVolumeMl: 25 },
    ...overrides,
  };
}

/** The four factors of the screen bound to the recipe, and a 2^(4-1) + 2 centre design written out. */
export function screeningPlan(): PlanDocumentInput {
  const factors: PlanDocumentInput["factors"] = [
    { name: "temperature", low: 60, high: 100, unit: "degC", binding: { kind: "temperature" } },
    { name: "baseEquiv", low: 1.5, high: 3, unit: "equiv", binding: { kind: "equivalents", component: "base" } },
    { name: "pdLoading", low: 0.5, high: 2, unit: "mol%", binding: { kind: "loading", component: "pd" } },
    { name: "waterFraction", low: 10, high: 30, unit: "vol%", binding: { kind: "solvent-fraction", solvent: "water" } },
  ];
  // 2^(4−1) with D = ABC (Montgomery §8.2), coded, in Yates order; then two centre points.
  const coded: number[][] = [];
  for (let i = 0; i < 8; i++) {
    const a = i & 1 ? 1 : -1;
    const b = i & 2 ? 1 : -1;
    const c = i & 4 ? 1 : -1;
    coded.push([a, b, c, a * b * c]);
  }
  coded.push([0, 0, 0, 0], [0, 0, 0, 0]);
  const names = factors!.map((f) => f.name);
  const runs = coded.map((x, i) => ({
    standardOrder: i + 1,
    runOrder: ((i * 7) % 10) + 1,
    kind: i < 8 ? "factorial" : "center",
    coded: Object.fromEntries(names.map((n, j) => [n, x[j]!])),
  }));
  return suzukiPlan({ factors, design: { runs } });
}
