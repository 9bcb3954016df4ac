/**
 * `cli plan`: a plan document (lib/chemistry/plan-document.ts) → its run sheet with the
 * stocks to prepare, the per-vial dispense list and the cautions of every run.
 * Components given only by SMILES get their formula from openchemlib first.
 */
import { planReport } from "../../chemistry/plan-report";
import { resolvePlanSmiles } from "../../chemistry/smiles";

export async function run(input: unknown): Promise<unknown> {
  return planReport(await resolvePlanSmiles(input));
}
