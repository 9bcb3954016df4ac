/**
 * How the plan screens write numbers and units: the sheets' one rule (lib/reports/format.ts),
 * so a screen and the prep sheet write every amount the same way, plus amounts of substance.
 */
import { significant } from "@/lib/reports/format";

export * from "@/lib/reports/format";

/** An amount of substance with its unit: "0.22 mmol" (three significant digits). */
export function millimoles(v: number): string {
  return `${significant(v, 3)} mmol`;
}
