/**
 * What a release reserves (issue 11 "Release"), pure: for every component and solvent of
 * the plan document that names a chemical of the lab's inventory (`chemicalId`), the run
 * sheet's total of it (`runSheet.inventory`: stocks as prepared, solids as weighed, liquids
 * as dispensed, top-ups, each with the overage and dead volume) as an inventory
 * requirement. The amount is the run sheet's volume where it has one (liquids, solutions,
 * solvents: what is taken from the bottle), else its mass (solids, purity-corrected), else
 * the amount of substance; the inventory converts it to each container's measure
 * (inventory/conversion.ts). Lines naming the same chemical in the same unit are added.
 */
import type { PlanDocument } from "../chemistry/plan-document";
import type { InventoryLine, RunSheet } from "../chemistry/run-sheet";

export interface PlanRequirement {
  chemicalId: string;
  /** The amount as decimal text (the run sheet's number, unrounded). */
  amount: string;
  unit: "µL" | "mg" | "mmol";
  /** What it is for, e.g. "Potassium phosphate (component base)". */
  label: string;
  /** The run sheet's lines it adds up, for people. */
  lines: Array<{ kind: InventoryLine["kind"]; id: string; name: string }>;
}

/** The quantity of an inventory line a release reserves (see the module comment), or null for nothing. */
export function lineQuantity(line: InventoryLine): { amount: number; unit: PlanRequirement["unit"] } | null {
  if (line.volumeUl !== null && line.volumeUl > 0) return { amount: line.volumeUl, unit: "µL" };
  if (line.massMg !== null && line.massMg > 0) return { amount: line.massMg, unit: "mg" };
  if (line.mmol !== null && line.mmol > 0) return { amount: line.mmol, unit: "mmol" };
  return null;
}

/** A positive finite number as plain decimal text (no exponent), exact to its double value's shortest form. */
export function decimalText(x: number): string {
  const s = String(x);
  if (!/e/i.test(s)) return s;
  // Shortest round-trip digits, written out without an exponent.
  const [mantissa = "0", expPart = "0"] = s.toLowerCase().split("e");
  const exp = Number(expPart);
  const [int = "0", frac = ""] = mantissa.split(".");
  const digits = int + frac;
  const point = int.length + exp;
  if (point <= 0) return `0.${"0".repeat(-point)}${digits}`.replace(/0+$/, "");
  if (point >= digits.length) return digits + "0".repeat(point - digits.length);
  return `${digits.slice(0, point)}.${digits.slice(point)}`;
}

/**
 * The requirements a release of this plan reserves: one per chemical and unit, in the
 * order the run sheet lists them.
 */
export function planRequirements(document: PlanDocument, runSheet: Pick<RunSheet, "inventory">): PlanRequirement[] {
  const componentChemical = new Map(document.recipe.components.filter((c) => c.chemicalId).map((c) => [c.id, c.chemicalId!]));
  const solventChemical = new Map(document.recipe.solvents.filter((s) => s.chemicalId).map((s) => [s.name, s.chemicalId!]));
  const totals = new Map<string, { chemicalId: string; unit: PlanRequirement["unit"]; amount: number; lines: PlanRequirement["lines"] }>();
  for (const line of runSheet.inventory) {
    const chemicalId = line.kind === "component" ? componentChemical.get(line.id) : solventChemical.get(line.id);
    if (!chemicalId) continue;
    const q = lineQuantity(line);
    if (!q) continue;
    const key = `${chemicalId} ${q.unit}`;
    const entry = totals.get(key) ?? { chemicalId, unit: q.unit, amount: 0, lines: [] };
    entry.amount += q.amount;
    entry.lines.push({ kind: line.kind, id: line.id, name: line.name });
    totals.set(key, entry);
  }
  return [...totals.values()].map((e) => ({
    chemicalId: e.chemicalId,
    amount: decimalText(e.amount),
    unit: e.unit,
    label: e.lines.map((l) => `${l.name} (${l.kind} ${l.id})`).join(", ").slice(0, 200),
    lines: e.lines,
  }));
}
