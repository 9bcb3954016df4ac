/**
 * `cli plan`: a plan document (lib/chemistry/plan-document.ts) → its run sheet with the
 * stocks to prepare, the per-vial dispense list and the cautions of every run.
 */
import { planReport } from "../../chemistry/plan-report";

export function run(input: unknown): unknown {
  return planReport(input);
}
