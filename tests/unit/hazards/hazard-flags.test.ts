import { describe, expect, it } from "vitest";
import { componentInfos } from "@/lib/chemistry/stoichiometry";
import { planDocumentSchema } from "@/lib/chemistry/plan-document";
import { chemicalInputSchema, containerUpdateSchema } from "@/inventory/schemas";
import { DEFAULT_EQUIPMENT, DEFAULT_LAB_THRESHOLDS, DEFAULT_VESSELS, evaluatePlanCautions, impliedHazards, isoDateSchema, statementsWithStem } from "@/lib/hazards";
import { planCautionInputSchema } from "@/lib/hazards/plan-cautions";
import { suzukiPlan } from "../chemistry/fixtures";

// Statement texts: UN GHS Rev. 10 (2023) Annex 3 (H250 catches fire spontaneously if
// exposed to air; H260/H261 releases flammable gas in contact with water; H340/H350/H360
// category 1 CMR) and EU CLP Regulation (EC) No 1272/2008 Annex III (EUH014 reacts
// violently with water; EUH019 may form explosive peroxides).
describe("GHS statements → hazard flags (one mapping)", () => {
  it("H250 pyrophoric; H260, H261 and EUH014 water-reactive; EUH019 an unclassified peroxide former", () => {
    expect(impliedHazards({ ghs: ["H250"] })).toMatchObject({ pyrophoric: true, waterReactive: false, peroxideClass: null });
    for (const code of ["H260", "H261", "EUH014"]) expect(impliedHazards({ ghs: [code] }).waterReactive).toBe(true);
    expect(impliedHazards({ ghs: ["EUH019"] }).peroxideClass).toBe("unclassified");
    expect(impliedHazards({ ghs: ["EUH019"], peroxideClass: "B" }).peroxideClass).toBe("B");
  });
  it("matches statements by their stem (H350i, H360FD) but not a longer number (H3500 is no H350)", () => {
    expect(statementsWithStem(["H350i", "H360FD", "H351", "h340"], ["H340", "H350", "H360"])).toEqual(["H350i", "H360FD", "H340"]);
    expect(statementsWithStem(["H3500"], ["H350"])).toEqual([]);
  });
  it("a flag adds a hazard but never removes one a statement implies", () => {
    expect(impliedHazards({ ghs: ["H250"], pyrophoric: false }).pyrophoric).toBe(true);
    expect(impliedHazards({ ghs: [], waterReactive: true }).waterReactive).toBe(true);
  });
  it("EUH014 alone makes a reagent water-reactive for dispensing and for the cautions alike", () => {
    const doc = planDocumentSchema.parse(
      suzukiPlan({
        recipe: {
          ...suzukiPlan().recipe,
          components: [
            ...suzukiPlan().recipe.components,
            { id: "tms", name: "chlorotrimethylsilane", role: "additive", formula: "C3H9ClSi", equivalents: 0.1, form: { state: "liquid", densityGPerMl: 0.856 }, hazards: { ghs: ["H225", "EUH014"] } },
          ],
        },
      }),
    );
    expect(componentInfos(doc).find((i) => i.component.id === "tms")?.waterReactive).toBe(true);
    const r = evaluatePlanCautions({
      vessel: DEFAULT_VESSELS[2]!,
      thresholds: DEFAULT_LAB_THRESHOLDS,
      equipment: DEFAULT_EQUIPMENT,
      now: "2026-12-01",
      runs: [{ run: 1, temperatureC: 25, liquidVolumeMl: 1, solvents: [{ name: "THF", volumeFraction: 1 }], components: [{ name: "chlorotrimethylsilane", ghs: ["H225", "EUH014"] }] }],
    });
    expect(r.cautions.find((c) => c.code === "TL-R02")?.message).toMatch(/reacts violently with water \(EUH014\)/);
  });
});

describe("one ISO-date schema (plan document, caution input, inventory)", () => {
  // Hand check: February 2026 has 28 days, 2025 is no leap year, 2024 is; there is no year
  // 0000 (PostgreSQL refuses it), and Tareline accepts the years 1900–2200.
  const bad = ["2026-02-30", "0000-01-01", "1899-12-31", "2201-01-01", "2025-02-29", "2026-13-01", "2026-1-01", "2026-01-01T00:00"];
  const good = ["2024-02-29", "2026-12-31", "1900-01-01", "2000-02-29"];
  it("rejects dates that do not exist and accepts real ones", () => {
    for (const d of bad) expect(isoDateSchema.safeParse(d).success, d).toBe(false);
    for (const d of good) expect(isoDateSchema.safeParse(d).success, d).toBe(true);
  });
  it("the plan document, the caution input and the inventory all refuse 2026-02-30", () => {
    const doc = suzukiPlan();
    const withDate = { ...doc, recipe: { ...doc.recipe, solvents: [{ name: "1,4-dioxane", volumeFraction: 0.8, openedOn: "2026-02-30" }, { name: "water", volumeFraction: 0.2 }] } };
    expect(planDocumentSchema.safeParse(withDate).error?.issues[0]?.path.join(".")).toBe("recipe.solvents.0.openedOn");
    const caution = planCautionInputSchema.safeParse({ vessel: DEFAULT_VESSELS[2], runs: [{ run: 1, temperatureC: 25, liquidVolumeMl: 1, solvents: [], components: [{ name: "THF", openedOn: "2026-02-30" }] }] });
    expect(caution.error?.issues[0]?.path.join(".")).toBe("runs.0.components.0.openedOn");
    expect(containerUpdateSchema.safeParse({ openedOn: "2026-02-30" }).success).toBe(false);
    expect(containerUpdateSchema.safeParse({ openedOn: "0000-01-01" }).success).toBe(false);
    expect(chemicalInputSchema.safeParse({ name: "THF", ghsStatements: ["h225", "EUH019"] }).data?.ghsStatements).toEqual(["H225", "EUH019"]);
  });
});
