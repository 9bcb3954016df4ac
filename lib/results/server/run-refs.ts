import "server-only";
import type { Transaction } from "sequelize";
import type { CsvRunRef } from "../csv-import";
import type { PlanForResults } from "./common";

/**
 * The plan's runs as a results file may name them: by run number, and by vial position
 * once the plan has a vial map (lib/plans/vial-map.ts).
 */
export async function planRunRefs(p: PlanForResults, _labId: string, _t?: Transaction): Promise<CsvRunRef[]> {
  return p.runs.map((r) => ({ run: r.standardOrder, vial: null }));
}
