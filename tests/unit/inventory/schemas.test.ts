import { describe, expect, it } from "vitest";
import { chemicalFormSchema, chemicalFromForm, chemicalInputSchema, containerInputSchema, reserveInputSchema } from "@/inventory/schemas";

describe("inventory schemas", () => {
  it("a chemical's CAS number is checked by its check digit", () => {
    // CAS check-digit rule: 7732-18-5 is valid, so 7732-18-6 is not.
    const r = chemicalInputSchema.safeParse({ name: "Water", cas: "7732-18-6" });
    expect(r.success).toBe(false);
    expect(r.error?.issues[0]?.path).toEqual(["cas"]);
    expect(chemicalInputSchema.parse({ name: "Water", cas: "" }).cas).toBeNull();
  });

  it("the chemical form splits GHS codes and keeps the low-stock mark with its unit", () => {
    const v = chemicalFormSchema.parse({ name: "THF", cas: "109-99-9", ghs: "h225, EUH019  H319", lowAmount: "1", lowUnit: "L", physicalState: "liquid" });
    expect(chemicalFromForm(v)).toMatchObject({ ghsStatements: ["H225", "EUH019", "H319"], lowStock: { amount: "1", unit: "L" } });
    const bad = chemicalFormSchema.safeParse({ name: "X", ghs: "flammable", lowAmount: "-1", lowUnit: "oz" });
    expect(bad.error?.issues.map((i) => i.path.join(".")).sort()).toEqual(["ghs", "lowAmount", "lowUnit"]);
  });

  it("a solution's amount must be a volume with a concentration unit", () => {
    const r = containerInputSchema.safeParse({ chemicalId: "0b6f0c1e-4a51-4c8e-9d0a-000000000001", barcode: "X", amount: "5", unit: "g", concentration: "2.5" });
    expect(r.error?.issues.map((i) => i.path.join(".")).sort()).toEqual(["concentrationUnit", "unit"]);
  });

  it("reservations need positive amounts in a stock unit", () => {
    const r = reserveInputSchema.safeParse({ planRef: "p", lines: [{ containerId: "0b6f0c1e-4a51-4c8e-9d0a-000000000001", amount: "0", unit: "mmol" }] });
    expect(r.error?.issues.map((i) => i.path.join(".")).sort()).toEqual(["lines.0.amount", "lines.0.unit"]);
  });
});
