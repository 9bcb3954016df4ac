/**
 * Hazard facts of a plan from the seeded demo inventory (seeders/20261201001000-demo-inventory.cjs):
 * Study B's halogen–lithium exchange with n-butyllithium in THF, where the THF bottle the
 * inventory proposes first (KB-001001, first to expire) was opened long ago.
 */
import { describe, expect, it } from "vitest";
import { QueryTypes } from "sequelize";
import { SEED, db } from "../support/integration";
import { AppError } from "@/lib/errors/app-error";
import { applyInventoryFacts, linkedChemicalIds } from "@/lib/chemistry/inventory-facts";
import { planReport } from "@/lib/chemistry/plan-report";
import type { PlanDocumentInput } from "@/lib/chemistry/plan-document";
import { addCalendarMonths } from "@/lib/hazards/peroxide-due";
import { planHazardFacts } from "@/inventory/server/plan-hazard-facts";

const LAB = SEED.labs.kestrel.id;
const seeded = (n: number) => `c4e10000-0000-4000-8000-${String(n).padStart(12, "0")}`;
const BROMOANISOLE = seeded(8);
const BULI = seeded(9);
const THF = seeded(10);
const HARROW_THF = seeded(19);

function studyB(): PlanDocumentInput {
  return {
    name: "Study B — halogen–lithium exchange",
    recipe: {
      limitingReagent: "arBr",
      scaleMmol: 0.5,
      concentrationM: 0.5,
      temperatureC: -78,
      components: [
        { id: "arBr", name: "3-bromoanisole", role: "reagent", chemicalId: BROMOANISOLE, formula: "C7H7BrO", form: { state: "liquid", densityGPerMl: 1.477, purityWtPercent: 98 } },
        // Typed hazards that the inventory must override: no statements, and an opening date.
        { id: "buli", name: "n-butyllithium 2.5 M in hexanes", role: "reagent", chemicalId: BULI, formula: "C4H9Li", equivalents: 1.1, form: { state: "solution", molarityM: 2.5 }, hazards: { ghs: [], openedOn: "2026-11-30" } },
      ],
      solvents: [{ name: "tetrahydrofuran", volumeFraction: 1, chemicalId: THF, openedOn: "2026-11-30", peroxideTestedOn: "2026-11-30" }],
    },
    design: { runs: [{ standardOrder: 1 }] },
    vessel: "vial-4ml-screw-septum",
  };
}

async function containerDates(barcode: string) {
  const [row] = await db().query<{ opened: string | null; received: string | null }>("SELECT opened_on::text AS opened, received_on::text AS received FROM containers WHERE barcode = :b AND lab_id = :lab", {
    replacements: { b: barcode, lab: LAB },
    type: QueryTypes.SELECT,
  });
  return row!;
}

describe("planHazardFacts on the demo inventory", () => {
  it("takes THF's facts from the container the inventory would propose first (KB-001001, first to expire)", async () => {
    const facts = await planHazardFacts({ labId: LAB, chemicalIds: [THF, BULI] });
    expect(facts[THF]?.container?.barcode).toBe("KB-001001");
    expect(facts[THF]?.peroxideClass).toBe("B");
    expect(facts[THF]?.ghsStatements).toContain("EUH019");
    // n-BuLi: the quarantined bottle KB-000902 is never proposed.
    expect(facts[BULI]?.container?.barcode).toBe("KB-000901");
    expect(facts[BULI]?.pyrophoric).toBe(true);
    expect(facts[BULI]?.container?.molarityM).toBe(2.5);
  });

  it("with a requirement, the proposal's own pick: 1.2 L of THF fits only the sealed 2.5 L bottle KB-001002", async () => {
    const facts = await planHazardFacts({ labId: LAB, chemicalIds: [THF], requirements: [{ chemicalId: THF, amount: "1.2", unit: "L" }] });
    expect(facts[THF]?.container?.barcode).toBe("KB-001002");
    expect(facts[THF]?.container?.openedOn).toBeNull();
  });

  it("is lab-scoped: another lab's chemical is not found", async () => {
    await expect(planHazardFacts({ labId: LAB, chemicalIds: [HARROW_THF] })).rejects.toSatisfy((e: unknown) => e instanceof AppError && e.code === "not_found");
  });

  it("the plan's cautions then use the inventory's dates and statements, not the typed ones", async () => {
    const doc = studyB();
    const facts = await planHazardFacts({ labId: LAB, chemicalIds: linkedChemicalIds(doc) });
    const { document, issues } = applyInventoryFacts(doc, facts);
    expect(issues).toEqual([]);
    const report = planReport({ ...document, now: new Date().toISOString().slice(0, 10) });
    const kb1001 = await containerDates("KB-001001");
    // KB-001001 was opened 430 days before the seed ran: past its class B 12-month interval.
    const x01 = report.cautions.find((c) => c.code === "TL-X01");
    expect(x01?.component).toBe("tetrahydrofuran");
    expect(x01?.message).toContain(`due its peroxide test on ${addCalendarMonths(kb1001.opened!, 12)}`);
    // n-BuLi's statements come from the record (H250, H260, EUH014): pyrophoric and water-reactive.
    expect(report.cautions.some((c) => c.code === "TL-R01" && c.component?.startsWith("n-butyllithium"))).toBe(true);
    expect(report.signOffReasons.some((s) => s.startsWith("TL-S02"))).toBe(true);
  });
});
