import "server-only";
import { resolveRuns } from "@/lib/chemistry/design-runs";
import type { PlanView } from "@/lib/plans/view";
import { vialsOf } from "../vials";

/** A run as the results grid shows it: number, run order, kind, vial position, natural factor values. */
export interface GridRunRow {
  run: number;
  runOrder: number;
  kind: string;
  vial: string | null;
  natural: Record<string, number>;
}

/** The plan's runs for the results grid: from the run sheet when there is one, else from the design. */
export function resultsGridRuns(plan: PlanView): GridRunRow[] {
  const vials = plan.runSheet ? vialsOf(plan.runSheet.runs, plan.document.block?.positions) : new Map<number, string>();
  const runs = plan.runSheet?.runs ?? resolveRuns(plan.document).map((r) => ({ ...r, run: r.standardOrder }));
  return runs.map((r) => ({ run: r.run, runOrder: r.runOrder, kind: r.kind, vial: vials.get(r.run) ?? null, natural: r.natural }));
}
