import { describe, expect, it } from "vitest";
import { DEFAULT_EQUIPMENT, DEFAULT_LAB_THRESHOLDS, DEFAULT_VESSELS, equipmentSchema, labThresholdsSchema, vesselTypeSchema } from "@/lib/hazards";

describe("lab thresholds", () => {
  it("default to the values of docs/sources.md (Prudent Practices 2011 intervals; common practice)", () => {
    const t = labThresholdsSchema.parse({});
    expect(t.safetyFactor).toBe(0.5); // §2 "keep the estimate ≤ ~50 % of the rating" [CP]
    expect(t.peroxideTestIntervalMonths.A).toBe(3); // §3 class A, 3 months (Prudent Practices, NRC 2011)
    expect(t.peroxideTestIntervalMonths.B).toBe(12); // §3 class B, 12 months
    expect(t.peroxideTestIntervalMonths.unopened).toBe(18); // §3 unopened, 18 months
    expect(DEFAULT_LAB_THRESHOLDS).toEqual(t);
  });
  it("keep a lab's own values and default the rest", () => {
    const t = labThresholdsSchema.parse({ safetyFactor: 0.4, peroxideTestIntervalMonths: { B: 6 } });
    expect(t.safetyFactor).toBe(0.4);
    expect(t.peroxideTestIntervalMonths.B).toBe(6);
    expect(t.peroxideTestIntervalMonths.A).toBe(3);
  });
  it("reject a safety factor above 1 with its path", () => {
    const r = labThresholdsSchema.safeParse({ safetyFactor: 1.5 });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.path).toEqual(["safetyFactor"]);
  });
  it("equipment limits default to a 150 °C block (§2 [CP]) and −78 °C cooling, and must be ordered", () => {
    expect(DEFAULT_EQUIPMENT).toEqual({ blockMaxC: 150, coolingMinC: -78 });
    expect(equipmentSchema.safeParse({ blockMaxC: -100, coolingMinC: -78 }).success).toBe(false);
  });
});

describe("default vessels (from memory / common practice, docs/sources.md)", () => {
  it("all validate and are flagged 'confirm with your supplier'", () => {
    expect(DEFAULT_VESSELS.length).toBeGreaterThan(3);
    for (const v of DEFAULT_VESSELS) {
      expect(vesselTypeSchema.safeParse(v).success, v.id).toBe(true);
      expect(v.confirmWithSupplier, v.id).toBe(true);
      expect(v.maxFillFraction, v.id).toBeLessThanOrEqual(0.75); // §2 "never above ~75 %" [CP]
    }
  });
  it("rate screw-cap vials at ≈2–3 bar and crimp-cap microwave vials at 20 bar (§2 [M])", () => {
    for (const v of DEFAULT_VESSELS.filter((x) => x.id.includes("screw"))) {
      expect(v.ratedBar).toBeGreaterThanOrEqual(2);
      expect(v.ratedBar).toBeLessThanOrEqual(3);
    }
    expect(DEFAULT_VESSELS.find((x) => x.id.includes("microwave"))?.ratedBar).toBe(20);
  });
  it("reject a working volume above the total volume with its path", () => {
    const v = { ...DEFAULT_VESSELS[0]!, workingMaxMl: 50 };
    const r = vesselTypeSchema.safeParse(v);
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.path).toEqual(["workingMaxMl"]);
  });
});
