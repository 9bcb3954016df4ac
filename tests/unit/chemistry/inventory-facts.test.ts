import { describe, expect, it } from "vitest";
import { applyInventoryFacts, linkedChemicalIds, type InventoryChemicalFacts } from "@/lib/chemistry/inventory-facts";
import { planReport } from "@/lib/chemistry/plan-report";
import { suzukiPlan } from "./fixtures";

// Facts as the inventory records them (invented demo records). THF: class B peroxide
// former, EUH019 (EU CLP Annex III); its container opened 2025-09-15 and never tested, so
// with the 12-month class B interval (Prudent Practices, NRC 2011) its test fell due on
// 2026-09-15 (hand arithmetic) — before the plan's date 2026-12-01.
const THF_ID = "c4e10000-0000-4000-8000-000000000010";
const BASE_ID = "c4e10000-0000-4000-8000-000000000005";
const thf: InventoryChemicalFacts = {
  chemicalId: THF_ID,
  name: "Tetrahydrofuran, anhydrous",
  ghsStatements: ["H225", "H302", "H319", "H335", "H351", "EUH019"],
  pyrophoric: false,
  waterReactive: false,
  peroxideClass: "B",
  physicalState: "liquid",
  formula: "C4H8O",
  molarMassGPerMol: 72.11,
  densityGPerMl: 0.889,
  container: { id: "x", barcode: "KB-001001", openedOn: "2025-09-15", receivedOn: "2025-07-01", peroxideTestedOn: null, expiresOn: "2027-06-01", purityPercent: 99.9, molarityM: null },
};
const base: InventoryChemicalFacts = {
  chemicalId: BASE_ID,
  name: "Potassium phosphate tribasic",
  ghsStatements: ["H315", "H319", "H335"],
  pyrophoric: false,
  waterReactive: false,
  peroxideClass: null,
  physicalState: "solid",
  formula: "K3PO4",
  molarMassGPerMol: 212.27,
  densityGPerMl: null,
  container: { id: "y", barcode: "KB-000501", openedOn: "2026-01-10", receivedOn: "2025-12-01", peroxideTestedOn: null, expiresOn: null, purityPercent: 95, molarityM: null },
};

function linkedPlan() {
  const doc = suzukiPlan({ now: "2026-12-01" });
  const components = doc.recipe.components.map((c) => (c.id === "base" ? { ...c, chemicalId: BASE_ID } : c));
  // The chemist typed a recent opening date and test for the solvent: both are ignored.
  const solvents = [
    { name: "tetrahydrofuran", volumeFraction: 0.8, chemicalId: THF_ID, openedOn: "2026-11-30", peroxideTestedOn: "2026-11-30" },
    { name: "water", volumeFraction: 0.2 },
  ];
  return { ...doc, recipe: { ...doc.recipe, components, solvents } };
}

describe("applyInventoryFacts", () => {
  it("overwrites typed container dates with the inventory's and takes the record's statements", () => {
    const { document } = applyInventoryFacts(linkedPlan(), { [THF_ID]: thf, [BASE_ID]: base });
    const s = document.recipe.solvents[0]!;
    expect(s).toMatchObject({ openedOn: "2025-09-15", peroxideTestedOn: null, receivedOn: "2025-07-01", peroxideClass: "B" });
    expect(s.ghs).toContain("EUH019");
    expect(document.recipe.components.find((c) => c.id === "base")!.hazards!.ghs).toEqual(["H315", "H319", "H335"]);
  });
  it("the plan's cautions follow: the THF container is past its test date (TL-X01 from the inventory's date)", () => {
    const { document } = applyInventoryFacts(linkedPlan(), { [THF_ID]: thf, [BASE_ID]: base });
    const x01 = planReport(document).cautions.find((c) => c.code === "TL-X01");
    expect(x01?.component).toBe("tetrahydrofuran");
    expect(x01?.message).toContain("due its peroxide test on 2026-09-15");
    // Unlinked, the typed dates would have kept it silent (computed: 2026-11-30 + 12 months is in 2027).
    expect(planReport(linkedPlan()).cautions.some((c) => c.code === "TL-X01")).toBe(false);
  });
  it("never lowers a hazard: a typed pyrophoric flag stays, record statements are added to typed ones", () => {
    const doc = linkedPlan();
    doc.recipe.components = doc.recipe.components.map((c) => (c.id === "base" ? { ...c, hazards: { ghs: ["H290"], pyrophoric: true } } : c));
    const c = applyInventoryFacts(doc, { [THF_ID]: thf, [BASE_ID]: base }).document.recipe.components.find((x) => x.id === "base")!;
    expect(c.hazards).toMatchObject({ pyrophoric: true, ghs: ["H315", "H319", "H335", "H290"] });
  });
  it("names what disagrees with the record, at the document's path", () => {
    const { issues } = applyInventoryFacts(linkedPlan(), { [THF_ID]: thf, [BASE_ID]: base });
    // The fixture's K3PO4 is 98 % pure; container KB-000501 is recorded at 95 %.
    expect(issues).toEqual([{ path: "recipe.components.2.form.purityWtPercent", message: "container KB-000501 of Potassium phosphate tribasic is 95 % pure" }]);
    const missing = applyInventoryFacts(linkedPlan(), { [THF_ID]: thf });
    expect(missing.issues.map((i) => i.path)).toContain("recipe.components.2.chemicalId");
  });
  it("a linked component without a usable container has no container dates (the opening date is then not recorded)", () => {
    const { document } = applyInventoryFacts(linkedPlan(), { [THF_ID]: { ...thf, container: null }, [BASE_ID]: base });
    expect(document.recipe.solvents[0]!.openedOn).toBeUndefined();
    expect(planReport(document).cautions.find((c) => c.code === "TL-X03")?.severity).toBe("info");
  });
  it("lists the linked chemical ids once each", () => {
    expect(linkedChemicalIds(linkedPlan()).sort()).toEqual([BASE_ID, THF_ID].sort());
  });
});
