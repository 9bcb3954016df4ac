import "server-only";
import type { Transaction } from "sequelize";
import type { DemoContext } from "./context";

/**
 * Study A of the demo scenario (PRODUCT.md "Demo scenario"; invented): a Suzuki–Miyaura
 * coupling of 4-bromoanisole with pyridin-3-ylboronic acid, XPhos Pd G3 as the Pd
 * precatalyst, K3PO4 as the base, dodecane as the internal standard for assay yield, in
 * 1,4-dioxane/water, 0.2 mmol in 1.0 mL per sealed 4 mL vial on the 24-position block.
 * Every component names the demo inventory's chemical (`chemicalId`), so its hazard facts
 * come from the inventory and release can reserve it. Purities are those of the container
 * the inventory proposes first when the demo is loaded; solubilities are invented demo
 * values (not measured data).
 */
export async function studyARecipe(ctx: DemoContext, t: Transaction, solvents: "dioxane-water" | "thf-water" = "dioxane-water"): Promise<Record<string, unknown>> {
  const id = (name: string) => ctx.chemicalId(name, t);
  const solventList =
    solvents === "dioxane-water"
      ? [
          { name: "1,4-dioxane", volumeFraction: 0.8, chemicalId: await id("1,4-Dioxane") },
          { name: "water", volumeFraction: 0.2, chemicalId: await id("Water, deionised") },
        ]
      : [
          { name: "tetrahydrofuran", volumeFraction: 0.9, chemicalId: await id("Tetrahydrofuran, anhydrous") },
          { name: "water", volumeFraction: 0.1, chemicalId: await id("Water, deionised") },
        ];
  return {
    limitingReagent: "arBr",
    scaleMmol: 0.2,
    concentrationM: 0.2,
    temperatureC: 90,
    timeH: 16,
    stirringRpm: 600,
    components: [
      { id: "arBr", name: "4-Bromoanisole", role: "reagent", chemicalId: await id("4-Bromoanisole"), formula: "C7H7BrO", form: { state: "liquid", densityGPerMl: 1.494, purityWtPercent: 98.5 } },
      {
        id: "boronicAcid",
        name: "Pyridin-3-ylboronic acid",
        role: "reagent",
        chemicalId: await id("Pyridin-3-ylboronic acid"),
        formula: "C5H6BNO2",
        equivalents: 1.3,
        form: { state: "solid", purityWtPercent: 97 },
        solubilityMgPerMl: 80,
      },
      // K3PO4 is weighed into each vial as a solid (a common way to dose the base in a screen):
      // in solution its stock would have to fit into the vial's water share.
      { id: "base", name: "Potassium phosphate tribasic", role: "reagent", chemicalId: await id("Potassium phosphate tribasic"), formula: "K3PO4", equivalents: 2, form: { state: "solid", purityWtPercent: 97 }, dispense: "solid" },
      {
        id: "pd",
        name: "XPhos Pd G3",
        role: "catalyst",
        chemicalId: await id("XPhos Pd G3"),
        formula: "C46H62NO3PPdS",
        loadingMolPercent: 1,
        form: { state: "solid", purityWtPercent: 98 },
        solubilityMgPerMl: 30,
        addOrder: 450,
      },
      { id: "istd", name: "Dodecane (internal standard)", role: "additive", chemicalId: await id("Dodecane (internal standard)"), formula: "C12H26", equivalents: 0.25, form: { state: "liquid", densityGPerMl: 0.75, purityWtPercent: 99 } },
    ],
    solvents: solventList,
  };
}

/** The factors of Study A: temperature and the four recipe quantities of the screen. */
export const STUDY_A_FACTORS = {
  temperature: (low: number, high: number) => ({ name: "temperature", low, high, unit: "degC", binding: { kind: "temperature" } }),
  baseEquiv: { name: "baseEquiv", low: 1.5, high: 3, unit: "equiv", binding: { kind: "equivalents", component: "base" } },
  boronicEquiv: { name: "boronicEquiv", low: 1.1, high: 1.5, unit: "equiv", binding: { kind: "equivalents", component: "boronicAcid" } },
  pdLoading: { name: "pdLoading", low: 0.5, high: 2, unit: "mol%", binding: { kind: "loading", component: "pd" } },
  waterFraction: { name: "waterFraction", low: 0.1, high: 0.3, unit: "fraction", binding: { kind: "solvent-fraction", solvent: "water" } },
} as const;
