"use client";

/**
 * The editor's live preview: its state (computing, up to date, waiting for fields to be
 * fixed, refused, unreachable), then in tabs the design table, the run sheet per vial, the
 * stocks and master mixes, the cautions worst first (with the planning-aid notice), the
 * vial map and the values the plan is computed with. A failed or waiting preview keeps
 * showing the last answer, marked as not up to date; typed input is never touched.
 */
import dynamic from "next/dynamic";
import { useState } from "react";
import type { PlanPreviewState } from "@/lib/hooks/use-plan-preview";
import type { DesignFactor } from "../design-table";

// The panes load when the first preview arrives, not with the page (the editor's first-load JavaScript stays small).
const loading = () => <p className="text-sm text-ink-soft">Loading…</p>;
const CautionsList = dynamic(() => import("../cautions-list").then((m) => m.CautionsList), { loading });
const DesignTable = dynamic(() => import("../design-table").then((m) => m.DesignTable), { loading });
const RunSheetTable = dynamic(() => import("../run-sheet-table").then((m) => m.RunSheetTable), { loading });
const StocksTable = dynamic(() => import("../stocks-table").then((m) => m.StocksTable), { loading });
const ValuesUsed = dynamic(() => import("../values-used").then((m) => m.ValuesUsed), { loading });
const PlanVialMap = dynamic(() => import("../plan-vial-map").then((m) => m.PlanVialMap), { loading });

const TABS = [
  ["cautions", "Cautions"],
  ["design", "Design"],
  ["runs", "Run sheet"],
  ["stocks", "Stocks"],
  ["map", "Vial map"],
  ["values", "Values"],
] as const;
type Tab = (typeof TABS)[number][0];

function StatusLine({ state, waitingCount, onShowProblems }: { state: PlanPreviewState; waitingCount: number; onShowProblems: () => void }) {
  const { status, roundTripMs } = state;
  const text =
    status === "computing"
      ? "Computing…"
      : status === "ready"
        ? "Up to date"
        : status === "waiting"
          ? `Waiting: ${waitingCount} ${waitingCount === 1 ? "field needs" : "fields need"} attention`
          : status === "invalid"
            ? `The server refused the plan: ${state.issues.length} ${state.issues.length === 1 ? "problem" : "problems"} shown on the fields`
            : status === "error"
              ? (state.message ?? "The preview failed.")
              : "Fill in the recipe to see the run sheet.";
  const tone = status === "ready" ? "text-ok" : status === "computing" || status === "idle" ? "text-ink-soft" : status === "error" ? "text-blocks" : "text-caution";
  return (
    <div className="flex flex-wrap items-center justify-between gap-2 text-sm" role="status" aria-live="polite">
      <p className={`font-medium ${tone}`} data-testid="preview-status" data-status={status}>
        {status === "computing" && <span aria-hidden className="mr-1.5 inline-block h-2 w-2 animate-pulse rounded-full bg-accent" />}
        {text}
        {state.stale && status !== "ready" && state.preview && <span className="ml-1 font-normal text-ink-soft">— showing the last answer</span>}
      </p>
      <div className="flex items-center gap-3">
        {(status === "waiting" || status === "invalid") && (
          <button type="button" className="text-sm text-accent underline-offset-2 hover:underline" onClick={onShowProblems}>
            Show them
          </button>
        )}
        {roundTripMs !== null && status === "ready" && <span className="num text-xs text-ink-faint">{Math.round(roundTripMs)} ms</span>}
      </div>
    </div>
  );
}

export function PreviewPanel({ state, factors, waitingCount, onShowProblems, settingsHref, settingsIssues }: { state: PlanPreviewState; factors: readonly DesignFactor[]; waitingCount: number; onShowProblems: () => void; settingsHref: string; settingsIssues: readonly string[] }) {
  const [tab, setTab] = useState<Tab>("cautions");
  const p = state.preview;
  const dim = state.stale && state.status !== "ready";
  const blocking = p ? p.cautions.filter((c) => c.severity === "blocking").length : 0;
  const designRows = p ? (p.runSheet?.runs ?? p.designRuns ?? []) : [];
  const blockedRuns = new Set(p ? p.cautions.filter((c) => c.severity === "blocking").flatMap((c) => c.runs) : []);
  return (
    <section className="flex flex-col gap-3" aria-labelledby="preview-heading" data-testid="preview">
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id="preview-heading">Preview</h2>
        {p && (
          <p className="num text-sm text-ink-soft" data-testid="preview-summary">
            {designRows.length} {designRows.length === 1 ? "run" : "runs"}
            {p.runSheet ? ` · ${p.runSheet.stocks.length} stocks and master mixes` : ""}
            {blocking > 0 ? ` · ${blocking} blocking` : ""}
          </p>
        )}
      </div>
      <StatusLine state={state} waitingCount={waitingCount} onShowProblems={onShowProblems} />
      {p?.problem && (
        <div className="rounded-md border border-blocks/30 bg-blocks-bg px-3 py-2 text-sm text-blocks" data-testid="preview-problem">
          {p.problem.message}
        </div>
      )}
      {p && p.inventoryIssues.length > 0 && (
        <div className="rounded-md border border-caution/30 bg-caution-bg px-3 py-2 text-sm text-caution" data-testid="preview-inventory-issues">
          The plan disagrees with the inventory in {p.inventoryIssues.length} {p.inventoryIssues.length === 1 ? "place" : "places"} (marked on the fields); its hazards come from the inventory.
        </div>
      )}
      <div role="tablist" aria-label="Preview" className="flex flex-wrap gap-1 border-b border-ink-line">
        {TABS.map(([id, label]) => (
          <button
            key={id}
            type="button"
            role="tab"
            id={`preview-tab-${id}`}
            aria-selected={tab === id}
            aria-controls={`preview-pane-${id}`}
            className={`-mb-px rounded-t-md border px-2.5 py-1.5 text-sm ${tab === id ? "border-ink-line border-b-paper bg-paper font-medium text-ink" : "border-transparent text-ink-soft hover:text-ink"}`}
            onClick={() => setTab(id)}
          >
            {label}
            {id === "cautions" && p && p.cautions.length > 0 && <span className={`num ml-1.5 rounded px-1 text-xs ${blocking > 0 ? "bg-blocks-bg text-blocks" : "bg-caution-bg text-caution"}`}>{p.cautions.length}</span>}
          </button>
        ))}
      </div>
      <div role="tabpanel" id={`preview-pane-${tab}`} aria-labelledby={`preview-tab-${tab}`} className={dim ? "opacity-60" : ""} data-testid={`preview-pane-${tab}`}>
        {!p ? (
          <p className="text-sm text-ink-soft">The preview appears here as soon as the plan can be computed.</p>
        ) : tab === "cautions" ? (
          <CautionsList report={p} testId="preview-cautions" />
        ) : tab === "design" ? (
          <DesignTable runs={designRows} factors={factors} testId="preview-design" highlight={blockedRuns} />
        ) : tab === "runs" ? (
          p.runSheet ? <RunSheetTable sheet={p.runSheet} testId="preview-run-sheet" highlight={blockedRuns} /> : <p className="text-sm text-ink-soft">No run sheet: the amounts cannot be planned (see above).</p>
        ) : tab === "stocks" ? (
          p.runSheet ? <StocksTable stocks={p.runSheet.stocks} notes={p.runSheet.notes} testId="preview-stocks" /> : <p className="text-sm text-ink-soft">No stocks: the amounts cannot be planned (see above).</p>
        ) : tab === "map" ? (
          <PlanVialMap runSheet={p.runSheet} document={p.document} highlightRuns={[...blockedRuns]} />
        ) : (
          <ValuesUsed computedWith={p.computedWith} settingsHref={settingsHref} issues={settingsIssues} testId="preview-values" />
        )}
      </div>
    </section>
  );
}
