"use client";

/**
 * The vial map of a plan's run sheet on the plan's block (24, 48 or 96 positions; 24 when
 * the plan names no block): components/plans/vial-map.tsx, where each run goes by the one
 * rule of lib/plans/vial-map.ts, with the factors' units and the runs a blocking caution
 * touches ringed.
 */
import type { PlanDocument } from "@/lib/chemistry/plan-document";
import type { RunSheet } from "@/lib/chemistry/run-sheet";
import { VialMap } from "./vial-map";

export function PlanVialMap({ runSheet, document, highlightRuns = [] }: { runSheet: RunSheet | null; document: Pick<PlanDocument, "block" | "factors">; highlightRuns?: readonly number[] }) {
  if (!runSheet) return <p className="text-sm text-ink-soft">No vial map: the amounts cannot be planned.</p>;
  const positions = document.block?.positions ?? 24;
  const factorUnits = Object.fromEntries(document.factors.filter((f) => f.unit).map((f) => [f.name, f.unit!]));
  return (
    <div className="flex flex-col gap-2" data-testid="vial-map">
      <p className="text-sm text-ink-soft">
        {document.block ? `${document.block.name}: ` : ""}one block per set temperature, runs in run order; a dashed ring marks a run a blocking caution touches.
      </p>
      <VialMap runs={runSheet.runs} positions={positions} factorUnits={factorUnits} highlightRuns={highlightRuns} />
    </div>
  );
}
