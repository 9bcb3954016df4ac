"use client";

/**
 * The vial map of a plan's run sheet, on the plan's block (24, 48 or 96 positions).
 *
 * VIAL MAP SPOT: components/plans/vial-map.tsx (the sheets branch) is mounted here once it
 * is on main; until then this says where the map goes.
 */
import type { PlanDocument } from "@/lib/chemistry/plan-document";
import type { RunSheet } from "@/lib/chemistry/run-sheet";

export function PlanVialMap({ runSheet, document }: { runSheet: RunSheet | null; document: Pick<PlanDocument, "block" | "factors">; highlightRuns?: readonly number[] }) {
  if (!runSheet) return <p className="text-sm text-ink-soft">No vial map: the amounts cannot be planned.</p>;
  return (
    <div className="rounded-lg border border-dashed border-ink-line bg-paper-card px-4 py-8 text-center text-sm text-ink-soft" data-testid="vial-map-spot">
      Vial map of {runSheet.runs.length} vials on {document.block ? `${document.block.name} (${document.block.positions} positions)` : "the block"}: coming with the block layout.
    </div>
  );
}
