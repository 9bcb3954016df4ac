import "server-only";
import type { Transaction } from "sequelize";
import { evaluateStoredPlan } from "@/lib/plans/server/evaluate-stored-plan";
import type { CsvRunRef } from "../csv-import";
import { vialsOf } from "../vials";
import type { PlanForResults } from "./common";

/**
 * The plan's runs as a results file may name them: by run number, and by vial position
 * (lib/plans/vial-map.ts, over the run sheet's set temperatures) when the plan names a block.
 */
export async function planRunRefs(p: PlanForResults, labId: string, t?: Transaction): Promise<CsvRunRef[]> {
  const positions = p.plan.document.block?.positions;
  let vials = new Map<number, string>();
  if (positions !== undefined) {
    const sheet = (await evaluateStoredPlan({ labId, document: p.plan.document }, t)).runSheet;
    if (sheet) vials = vialsOf(sheet.runs, positions);
  }
  return p.runs.map((r) => ({ run: r.standardOrder, vial: vials.get(r.standardOrder) ?? null }));
}
