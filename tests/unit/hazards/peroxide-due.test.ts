import { describe, expect, it } from "vitest";
import { proposeContainers, type ChemicalFacts, type ContainerFacts } from "@/inventory/availability";
import { peroxideTestDue as inventoryDue } from "@/inventory/peroxide";
import { DEFAULT_EQUIPMENT, DEFAULT_LAB_THRESHOLDS, DEFAULT_VESSELS, addCalendarMonths, evaluatePlanCautions, isPeroxideTestDue, type PeroxideClass } from "@/lib/hazards";

// The same-due-date test (issue 9, item 4): the inventory's "test due" date and the
// caution TL-X01 come from one rule. Intervals are the lab defaults (Prudent Practices in
// the Laboratory, NRC 2011, chapter 4): class A 3 months, B 12, unopened 18 months.
// Every expected date is calendar arithmetic done by hand in this file: the same day of
// the month n months later, or that month's last day when it has no such day (April and
// November have 30 days; February 28, or 29 in a leap year: 2024 is one — divisible by
// 4, not by 100 — 2025 and 2027 are not).
const intervals = DEFAULT_LAB_THRESHOLDS.peroxideTestIntervalMonths;

interface Case {
  what: string;
  peroxideClass: PeroxideClass | null;
  ghs?: string[];
  openedOn: string | null;
  receivedOn?: string;
  testedOn?: string;
  expiresOn?: string;
  /** Due date by hand, and the day before it by hand. */
  due: string;
  dayBefore: string;
}

const cases: Case[] = [
  { what: "class A opened 2026-01-31 + 3 months: April has no 31st", peroxideClass: "A", openedOn: "2026-01-31", due: "2026-04-30", dayBefore: "2026-04-29" },
  { what: "class B opened 2024-02-29 + 12 months: 2025 has no 29 February", peroxideClass: "B", openedOn: "2024-02-29", due: "2025-02-28", dayBefore: "2025-02-27" },
  { what: "class A opened 2023-11-30 + 3 months: February 2024 (leap) ends on the 29th", peroxideClass: "A", openedOn: "2023-11-30", due: "2024-02-29", dayBefore: "2024-02-28" },
  { what: "class B unopened, received 2025-08-31 + 18 months: February 2027 ends on the 28th", peroxideClass: "B", openedOn: null, receivedOn: "2025-08-31", due: "2027-02-28", dayBefore: "2027-02-27" },
  { what: "class B opened 2023-02-28 + 12 months keeps the 28th in a leap year", peroxideClass: "B", openedOn: "2023-02-28", due: "2024-02-28", dayBefore: "2024-02-27" },
  { what: "class A opened 2025-06-02, last tested 2025-12-31 + 3 months", peroxideClass: "A", openedOn: "2025-06-02", testedOn: "2025-12-31", due: "2026-03-31", dayBefore: "2026-03-30" },
  { what: "EUH019 without a class: the shortest class interval (3 months) from 2026-05-31", peroxideClass: null, ghs: ["H225", "EUH019"], openedOn: "2026-05-31", due: "2026-08-31", dayBefore: "2026-08-30" },
  { what: "unopened, received 2026-01-15, expiring 2026-06-30 before its 18 months", peroxideClass: "B", openedOn: null, receivedOn: "2026-01-15", expiresOn: "2026-06-30", due: "2026-06-30", dayBefore: "2026-06-29" },
];

const chemical = (c: Case): ChemicalFacts => ({ id: "THF", name: "THF", molarMass: "72.11", density: "0.889", peroxideClass: c.peroxideClass, ghsStatements: c.ghs ?? [], lowStockBase: null, lowStockDimension: null });
const container = (c: Case): ContainerFacts => ({
  id: "bottle",
  barcode: "KB-T1",
  chemicalId: "THF",
  dimension: "volume",
  amountBase: 500_000_000n,
  heldBase: 0n,
  status: "available",
  purityPercent: null,
  concentration: null,
  concentrationUnit: null,
  receivedOn: c.receivedOn ?? null,
  openedOn: c.openedOn,
  expiresOn: c.expiresOn ?? null,
  peroxideTestedOn: c.testedOn ?? null,
});

function inventoryWarns(c: Case, today: string): boolean {
  const p = proposeContainers({ requirements: [{ chemicalId: "THF", amount: "1", unit: "mL" }], chemicals: [chemical(c)], containers: [container(c)], today, peroxideIntervals: intervals });
  return p.warnings.some((w) => w.code === "peroxide_test_due");
}

function cautionFires(c: Case, now: string): boolean {
  const vessel = { ...DEFAULT_VESSELS.find((v) => v.id.includes("microwave"))!, confirmWithSupplier: false };
  const r = evaluatePlanCautions({
    vessel,
    thresholds: DEFAULT_LAB_THRESHOLDS,
    equipment: DEFAULT_EQUIPMENT,
    now,
    runs: [
      {
        run: 1,
        temperatureC: 25,
        liquidVolumeMl: 2,
        solvents: [{ name: "toluene", volumeFraction: 1 }],
        components: [
          {
            name: "THF (container KB-T1)",
            ghs: c.ghs ?? [],
            peroxideClass: c.peroxideClass,
            openedOn: c.openedOn,
            receivedOn: c.receivedOn ?? null,
            peroxideTestedOn: c.testedOn ?? null,
            expiresOn: c.expiresOn ?? null,
          },
        ],
      },
    ],
  });
  return r.cautions.some((x) => x.code === "TL-X01");
}

describe("one peroxide due date for the inventory and the cautions", () => {
  for (const c of cases) {
    it(c.what, () => {
      const due = inventoryDue({ peroxideClass: c.peroxideClass, ghs: c.ghs ?? [], openedOn: c.openedOn, receivedOn: c.receivedOn ?? null, testedOn: c.testedOn ?? null, expiresOn: c.expiresOn ?? null, intervals });
      expect(due).toBe(c.due);
      // The inventory warns and the caution fires on the due date, and neither a day before.
      expect(inventoryWarns(c, c.due)).toBe(true);
      expect(cautionFires(c, c.due)).toBe(true);
      expect(inventoryWarns(c, c.dayBefore)).toBe(false);
      expect(cautionFires(c, c.dayBefore)).toBe(false);
    });
  }
  it("the caution's message names the due date", () => {
    const c = cases[0]!;
    const r = evaluatePlanCautions({
      vessel: { ...DEFAULT_VESSELS.find((v) => v.id.includes("microwave"))!, confirmWithSupplier: false },
      thresholds: DEFAULT_LAB_THRESHOLDS,
      equipment: DEFAULT_EQUIPMENT,
      now: "2026-05-03",
      runs: [{ run: 1, temperatureC: 25, liquidVolumeMl: 2, solvents: [{ name: "toluene", volumeFraction: 1 }], components: [{ name: "diisopropyl ether", ghs: ["EUH019"], peroxideClass: "A", openedOn: c.openedOn }] }],
    });
    // 2026-04-30 → 2026-05-03 is 3 days (by hand).
    expect(r.cautions.find((x) => x.code === "TL-X01")?.message).toMatch(/due its peroxide test on 2026-04-30 \(3 days ago\)/);
  });
});

describe("calendar months", () => {
  it("adds months by the calendar and clamps to the month's end (hand arithmetic)", () => {
    expect(addCalendarMonths("2026-01-31", 1)).toBe("2026-02-28");
    expect(addCalendarMonths("2024-01-31", 1)).toBe("2024-02-29");
    expect(addCalendarMonths("2025-12-15", 18)).toBe("2027-06-15");
    expect(addCalendarMonths("2026-03-31", -1)).toBe("2026-02-28");
  });
  it("refuses a fraction of a month (the lab's intervals are whole months)", () => {
    expect(() => addCalendarMonths("2026-01-31", 1.5)).toThrow(RangeError);
  });
  it("a test is due on its due date and after, not before", () => {
    expect(isPeroxideTestDue("2026-04-30", "2026-04-30")).toBe(true);
    expect(isPeroxideTestDue("2026-04-30", "2026-05-01")).toBe(true);
    expect(isPeroxideTestDue("2026-04-30", "2026-04-29")).toBe(false);
  });
});
