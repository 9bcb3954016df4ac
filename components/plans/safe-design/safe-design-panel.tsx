"use client";

/**
 * The safe-design panel of the plan editor (issue 10, "Safe design"): when runs of the
 * plan's design trip a blocking caution or leave the physical limits, it names them and
 * offers the alternatives side by side — face-centred, inscribed, a smaller α, a narrower
 * factor range, and a D-optimal design over the candidates the hazard engine allows —
 * each with its run count, whether anything still blocks, its D-efficiency relative to the
 * plan's design and what it changes; one click applies one (the editor's `onApply`; the
 * chemist still saves). The numbers come from POST /plans/alternatives (lib/plans/safe-design.ts).
 *
 * Mounted in the editor's panel slot (components/plans/editor/editor-panels.tsx) with the
 * slot's props; with nothing blocking it renders nothing, except a note after an applied
 * alternative.
 */
import { useMemo, useState } from "react";
import type { PlanDocumentInput } from "@/lib/chemistry/plan-document";
import { ALTERNATIVE_LABELS } from "@/lib/plans/safe-design-labels";
import type { SafeDesignAlternative } from "@/lib/plans/safe-design";
import { AlternativesTable, type AlternativeRow } from "./alternatives-table";
import { BlockingRuns } from "./blocking-runs";
import { factorUnits } from "./format";
import { useSafeDesign } from "./use-safe-design";
import { SAFETY_NOTICE } from "@/components/shell/safety-notice";

export interface SafeDesignPanelProps {
  labSlug: string;
  /** The plan document as the form holds it, or null while the form has errors the browser found. */
  document: Record<string, unknown> | null;
  /** The editor's preview state: the panel asks once the preview has settled on this document. */
  status?: string;
  stale?: boolean;
  /** Puts a new design section and factor list into the form. */
  onApply: (design: PlanDocumentInput["design"], factors: PlanDocumentInput["factors"]) => void;
}

export function SafeDesignPanel({ labSlug, document, status, stale, onApply }: SafeDesignPanelProps) {
  // Ask when the editor's own preview has settled (the preview names any field errors first).
  const settled = status === undefined || (status === "ready" && !stale);
  const state = useSafeDesign(labSlug, settled ? document : null);
  const [applied, setApplied] = useState<string | null>(null);
  const units = useMemo(() => factorUnits(document), [document]);
  const report = state.report;

  const rows: AlternativeRow[] = useMemo(() => {
    if (!report) return [];
    const out: AlternativeRow[] = [...report.alternatives];
    if (report.notComputed.includes("d-optimal")) out.push(state.dOptimal ?? { kind: "d-optimal", pending: true, failed: state.dOptimalStatus === "error" });
    return out;
  }, [report, state.dOptimal, state.dOptimalStatus]);

  const apply = (alt: SafeDesignAlternative) => {
    const doc = alt.document as { design: PlanDocumentInput["design"]; factors: PlanDocumentInput["factors"] } | null;
    if (!doc) return;
    onApply(doc.design, doc.factors);
    setApplied(`${ALTERNATIVE_LABELS[alt.kind]}${alt.changes.length ? ` (${alt.changes.join("; ")})` : ""}`);
  };

  if (!report || report.blockingRuns.length === 0) {
    if (applied && report && state.status === "ready") {
      return (
        <section className="rounded-lg border border-ok/30 bg-ok-bg px-4 py-3 text-sm text-ok" data-testid="safe-design-panel" aria-label="Safe design">
          Applied {applied}: no run of the design blocks now. Save the plan to keep it.
        </section>
      );
    }
    return null;
  }

  const n = report.blockingRuns.length;
  return (
    <section className="flex flex-col gap-3 rounded-lg border border-blocks/40 bg-paper-card p-4" data-testid="safe-design-panel" aria-label="Safe design">
      <div>
        <h2 className="text-base font-semibold text-blocks">
          Safe design: <span className="num">{n}</span> {n === 1 ? "run" : "runs"} of <span className="num">{report.runCount}</span> {n === 1 ? "blocks" : "block"}
        </h2>
        <p className="text-xs text-ink-soft">
          These runs trip a blocking caution or leave the lab&apos;s limits (block range, stock solubility, vial volume). The alternatives below are checked by the same hazard engine
          {state.status === "computing" ? " — updating…" : "."}
        </p>
      </div>
      <BlockingRuns runs={report.blockingRuns} units={units} />
      {report.note ? (
        <p className="text-sm text-ink-soft">{report.note}</p>
      ) : (
        <>
          <h3 className="text-sm font-semibold text-ink">Alternatives{report.model ? <span className="font-normal text-ink-soft"> · D-efficiency for the {Array.isArray(report.model) ? "chosen terms" : `${report.model} model`}</span> : null}</h3>
          <AlternativesTable rows={rows} originalRuns={report.runCount} onApply={apply} />
        </>
      )}
      <p className="text-xs text-ink-soft" data-testid="safe-design-notice">
        {SAFETY_NOTICE}
      </p>
    </section>
  );
}
