/**
 * Hazard engine benchmark (issue 5): cautions for a 1536-vial plan ≤ 100 ms.
 * The plan: 1536 sealed 1 mL vials, 1,4-dioxane/water with the water fraction and the
 * temperature varied over the plate, five components per vial (one pyrophoric, one
 * peroxide former with container dates, one CMR), gas released in a quarter of them.
 */
import type { BenchCase } from "./harness";
import {
  DEFAULT_EQUIPMENT,
  DEFAULT_LAB_THRESHOLDS,
  DEFAULT_VESSELS,
  evaluatePlanCautions,
  type PlanCautionInput,
} from "../lib/hazards";

function plate(n: number): PlanCautionInput {
  const vessel = DEFAULT_VESSELS.find((v) => v.id === "vial-1ml-screw-septum")!;
  const runs: PlanCautionInput["runs"] = [];
  for (let i = 0; i < n; i++) {
    const water = 0.05 + 0.3 * ((i % 8) / 7);
    runs.push({
      run: i + 1,
      temperatureC: 40 + 10 * (i % 13),
      liquidVolumeMl: 0.25,
      solvents: [
        { name: "1,4-dioxane", volumeFraction: 1 - water },
        { name: "water", volumeFraction: water },
      ],
      gasReleasedMmol: i % 4 === 0 ? 0.01 : 0,
      concentratesOrHeatsToDryness: i % 97 === 0,
      components: [
        { name: "aryl bromide", ghs: ["H302"], volumeUl: 20 },
        { name: "heteroaryl boronic acid", ghs: ["H315", "H319"] },
        { name: "Pd precatalyst", ghs: ["H317", "H350"] },
        { name: "K3PO4", ghs: ["H315", "H318"] },
        { name: "diethylzinc 1 M in hexanes", ghs: ["H250", "H260", "H314"], volumeUl: 10 },
        { name: "THF", ghs: ["H225", "EUH019"], peroxideClass: "B", openedOn: "2025-06-01", volumeUl: 5 },
      ],
    });
  }
  return { vessel, thresholds: DEFAULT_LAB_THRESHOLDS, equipment: DEFAULT_EQUIPMENT, now: "2026-12-01", runs };
}

export const cases: BenchCase[] = [
  {
    name: "hazards: cautions for a 1536-vial plan",
    targetMs: 100,
    setup: () => plate(1536),
    run: (state) => evaluatePlanCautions(state as PlanCautionInput),
  },
];
