import { describe, expect, it } from "vitest";
import { perBaseUnit } from "@/inventory/conversion";
import { ceil, div, mul, rational, parseDecimal } from "@/inventory/decimal";
import { proposeContainers, type ChemicalFacts, type ContainerFacts } from "@/inventory/availability";
import { peroxideTestDue } from "@/inventory/peroxide";
import { addCalendarMonths as addMonths } from "@/lib/hazards/peroxide-due";

const intervals = { A: 3, B: 12, C: 12, D: 12, unopened: 18 }; // lib/hazards/thresholds.ts defaults (Prudent Practices in the Laboratory, NRC 2011)

const chem = (over: Partial<ChemicalFacts> & { id: string }): ChemicalFacts => ({
  name: over.id,
  molarMass: null,
  density: null,
  peroxideClass: null,
  lowStockBase: null,
  lowStockDimension: null,
  ...over,
});
const box = (over: Partial<ContainerFacts> & { id: string; chemicalId: string; amountBase: bigint }): ContainerFacts => ({
  barcode: over.id,
  heldBase: 0n,
  status: "available",
  dimension: "mass",
  purityPercent: null,
  concentration: null,
  concentrationUnit: null,
  receivedOn: null,
  openedOn: null,
  expiresOn: null,
  peroxideTestedOn: null,
  ...over,
});

describe("conversion per base unit", () => {
  it("a 2.5 M solution gives 10 mmol in 4 mL", () => {
    // computed in this test from n = c·V: 10 mmol / 2.5 mol/L = 4 mL = 4 000 000 nL
    const per = perBaseUnit("mmol", { dimension: "volume", purityPercent: null, concentration: "2.5", concentrationUnit: "M" }, { molarMass: "64.06", density: null });
    expect(per.ok).toBe(true);
    if (per.ok) expect(ceil(div(rational(10n), per.value))).toBe(4_000_000n);
  });
  it("a neat liquid by volume: mmol through density, molar mass and purity", () => {
    // computed in this test from V = n·M / (ρ·p): 1 mmol × 187.04 g/mol / (1.494 g/mL × 0.98) = 127.7490… µL
    const per = perBaseUnit("mmol", { dimension: "volume", purityPercent: "98", concentration: null, concentrationUnit: null }, { molarMass: "187.04", density: "1.494" });
    if (!per.ok) throw new Error(per.reason);
    const nl = ceil(div(rational(1n), per.value));
    const expected = ceil(div(mul(parseDecimal("187.04"), rational(1_000_000n, 1000n)), mul(parseDecimal("1.494"), parseDecimal("0.98"))));
    expect(nl).toBe(expected);
    expect(nl).toBe(127_750n); // 127 749.1… nL, rounded up to whole nL
  });
  it("says what is missing when it cannot convert", () => {
    const per = perBaseUnit("volume", { dimension: "mass", purityPercent: null, concentration: null, concentrationUnit: null }, { molarMass: "212.27", density: null });
    expect(per).toEqual({ ok: false, reason: "needs the chemical's density" });
  });
});

describe("peroxide test dates", () => {
  it("class A opened: 3 months after opening", () => {
    expect(peroxideTestDue({ peroxideClass: "A", openedOn: "2026-01-31", receivedOn: null, testedOn: null, intervals })).toBe("2026-04-30");
  });
  it("counts from the latest test when it is after opening", () => {
    expect(peroxideTestDue({ peroxideClass: "B", openedOn: "2025-01-10", receivedOn: null, testedOn: "2025-06-01", intervals })).toBe("2026-06-01");
  });
  it("unopened: 18 months after receipt", () => {
    expect(addMonths("2025-12-15", 18)).toBe("2027-06-15");
  });
});

describe("proposeContainers", () => {
  const today = "2026-12-01";
  const bromide = chem({ id: "ArBr", molarMass: "187.04" });

  it("takes the first-to-expire container that covers the whole need, opened before sealed", () => {
    const containers = [
      box({ id: "late", chemicalId: "ArBr", amountBase: 10_000_000n, expiresOn: "2028-01-01", openedOn: "2026-01-01" }),
      box({ id: "soon-sealed", chemicalId: "ArBr", amountBase: 10_000_000n, expiresOn: "2027-01-01" }),
      box({ id: "soon-opened", chemicalId: "ArBr", amountBase: 10_000_000n, expiresOn: "2027-01-01", openedOn: "2026-05-01" }),
    ];
    const p = proposeContainers({ requirements: [{ chemicalId: "ArBr", amount: "500", unit: "mg" }], chemicals: [bromide], containers, today, peroxideIntervals: intervals });
    expect(p.lines[0]?.picks.map((x) => [x.containerId, x.amountBase])).toEqual([["soon-opened", 500_000n]]);
    expect(p.shortfalls).toEqual([]);
  });

  it("prefers one container that covers it over splitting across an earlier, smaller one", () => {
    const containers = [
      box({ id: "small-early", chemicalId: "ArBr", amountBase: 200_000n, expiresOn: "2027-01-01" }),
      box({ id: "big-later", chemicalId: "ArBr", amountBase: 5_000_000n, expiresOn: "2027-06-01" }),
    ];
    const p = proposeContainers({ requirements: [{ chemicalId: "ArBr", amount: "1", unit: "g" }], chemicals: [bromide], containers, today, peroxideIntervals: intervals });
    expect(p.lines[0]?.picks.map((x) => x.containerId)).toEqual(["big-later"]);
  });

  it("splits across containers when none suffices, and reports the shortfall in the requirement's unit", () => {
    // computed in this test: need 5 mmol × 187.04 mg/mmol = 935.2 mg; have 300 + 400 mg (100 mg held) → 600 mg;
    // short 335.2 mg = 1.792129… mmol
    const containers = [
      box({ id: "a", chemicalId: "ArBr", amountBase: 300_000n, expiresOn: "2027-01-01" }),
      box({ id: "b", chemicalId: "ArBr", amountBase: 400_000n, heldBase: 100_000n, expiresOn: "2027-02-01" }),
    ];
    const p = proposeContainers({ requirements: [{ chemicalId: "ArBr", amount: 5, unit: "mmol" }], chemicals: [bromide], containers, today, peroxideIntervals: intervals });
    expect(p.lines[0]?.picks.map((x) => [x.containerId, x.amountBase])).toEqual([["a", 300_000n], ["b", 300_000n]]);
    expect(p.shortfalls).toHaveLength(1);
    expect(p.shortfalls[0]?.unit).toBe("mmol");
    expect(p.shortfalls[0]?.amount).toBeCloseTo(335.2 / 187.04, 9);
  });

  it("does not offer the same amount to two requirements", () => {
    const containers = [box({ id: "only", chemicalId: "ArBr", amountBase: 1_000_000n })];
    const p = proposeContainers({
      requirements: [
        { chemicalId: "ArBr", amount: "700", unit: "mg" },
        { chemicalId: "ArBr", amount: "700", unit: "mg" },
      ],
      chemicals: [bromide],
      containers,
      today,
      peroxideIntervals: intervals,
    });
    expect(p.lines[1]?.picks[0]?.amountBase).toBe(300_000n);
    expect(p.shortfalls[0]?.amount).toBe(400);
  });

  it("leaves out expired containers and warns; warns on peroxide test due and low stock", () => {
    const thf = chem({ id: "THF", density: "0.889", molarMass: "72.11", peroxideClass: "B", lowStockBase: 500_000_000n, lowStockDimension: "volume" });
    const containers = [
      box({ id: "old", chemicalId: "THF", dimension: "volume", amountBase: 900_000_000n, expiresOn: "2026-11-01" }),
      box({ id: "opened-long-ago", chemicalId: "THF", dimension: "volume", amountBase: 600_000_000n, openedOn: "2025-03-01", expiresOn: "2027-12-01" }),
    ];
    const p = proposeContainers({ requirements: [{ chemicalId: "THF", amount: "200", unit: "mL" }], chemicals: [thf], containers, today, peroxideIntervals: intervals });
    expect(p.lines[0]?.picks.map((x) => x.containerId)).toEqual(["opened-long-ago"]);
    expect(p.warnings.map((w) => w.code).sort()).toEqual(["expired", "low_stock", "peroxide_test_due"]);
  });
});
