"use client";

import { useMemo } from "react";
import type { Data } from "plotly.js";
import { flaggedRuns, normalScores } from "@/lib/results/diagnostic-plots";
import type { AnalysisAnswer } from "@/lib/results/analysis";
import { CHART_COLORS, PlotlyChart, baseLayout } from "./plotly-chart";

/** How a run is named in hovers: "run 7" or "run 7 of Screen 1" when several plans are analysed. */
function runNames(a: AnalysisAnswer): string[] {
  const several = a.analysis.plans.length > 1;
  return a.analysis.runs.map((r) => (several ? `run ${r.run} of ${r.planName}` : `run ${r.run}`));
}

/**
 * The residual diagnostics as plots (normal probability plot of the residuals, residuals
 * against fitted values and against run order, predicted against actual, Cook's distance),
 * flagged runs in amber. A click on a point selects its run (to leave it out).
 */
export function DiagnosticPlots({ a, onSelect }: { a: AnalysisAnswer; onSelect: (index: number) => void }) {
  const charts = useMemo(() => {
    const d = a.diagnostics;
    const names = runNames(a);
    const flagged = new Set(flaggedRuns(d, a.stats.p).map((f) => f.index));
    const color = d.map((x) => (flagged.has(x.index) ? CHART_COLORS.caution : CHART_COLORS.accent));
    const custom = d.map((x) => x.index);
    const text = d.map((x) => names[x.index] ?? `run ${x.run}`);
    const scale = a.transform === "ln" ? ` (ln ${a.analysis.response.name})` : a.analysis.response.unit ? ` (${a.analysis.response.unit})` : "";
    const marker = { color, size: 8, line: { color: CHART_COLORS.paper, width: 1 } };
    const pts = (x: number[], y: number[], extra: Partial<Data> = {}): Data => ({ type: "scatter", mode: "markers", x, y, customdata: custom, text, hovertemplate: "%{text}<br>%{x:.4g}, %{y:.4g}<extra></extra>", marker, ...extra }) as Data;
    const line = (x: number[], y: number[], dash = "dot"): Data => ({ type: "scatter", mode: "lines", x, y, hoverinfo: "skip", line: { color: CHART_COLORS.faint, width: 1, dash } }) as Data;
    const resid = d.map((x) => x.residual);
    const scores = normalScores(resid);
    const s = a.stats.rmse ?? 1;
    const rMin = Math.min(...resid, 0);
    const rMax = Math.max(...resid, 0);
    const fitted = d.map((x) => x.fitted);
    const observed = d.map((x) => x.observed);
    const order = d.map((x) => a.analysis.runs[x.index]?.runOrder ?? x.run);
    const lo = Math.min(...observed, ...fitted);
    const hi = Math.max(...observed, ...fitted);
    const sortedByOrder = d.map((_, i) => i).sort((i, j) => order[i]! - order[j]!);
    const cooks = d.map((x) => x.cooksDistance ?? 0);
    const fMin = Math.min(...fitted);
    const fMax = Math.max(...fitted);
    return [
      {
        id: "plot-normal",
        label: "Normal probability plot of the residuals",
        data: [line([rMin, rMax], [rMin / s, rMax / s]), pts(resid, scores)],
        layout: baseLayout("Normal probability plot of residuals", `residual${scale}`, "normal score"),
      },
      {
        id: "plot-residual-fitted",
        label: "Residuals against fitted values",
        data: [line([fMin, fMax], [0, 0], "solid"), pts(fitted, resid)],
        layout: baseLayout("Residuals against fitted values", `fitted${scale}`, `residual${scale}`),
      },
      {
        id: "plot-residual-order",
        label: "Residuals against run order",
        data: [
          { type: "scatter", mode: "lines", x: sortedByOrder.map((i) => order[i]!), y: sortedByOrder.map((i) => resid[i]!), hoverinfo: "skip", line: { color: CHART_COLORS.line, width: 1 } } as Data,
          pts(order, resid),
        ],
        layout: baseLayout("Residuals against run order", "run order", `residual${scale}`),
      },
      {
        id: "plot-predicted-actual",
        label: "Predicted against actual",
        data: [line([lo, hi], [lo, hi]), pts(observed, fitted)],
        layout: baseLayout("Predicted against actual", `actual${scale}`, `predicted${scale}`),
      },
      {
        id: "plot-cooks",
        label: "Cook's distance by run",
        data: [
          { type: "bar", x: d.map((x) => x.run), y: cooks, customdata: custom, text, textposition: "none", hovertemplate: "%{text}<br>D = %{y:.3g}<extra></extra>", marker: { color } } as Data,
          line([Math.min(...d.map((x) => x.run)) - 0.5, Math.max(...d.map((x) => x.run)) + 0.5], [1, 1]),
        ],
        layout: baseLayout("Cook's distance (line at 1)", "run", "Cook's distance"),
      },
    ];
  }, [a]);
  return (
    <div className="grid gap-3 md:grid-cols-2" data-testid="diagnostic-plots">
      {charts.map((c) => (
        <PlotlyChart key={c.id} testId={c.id} label={c.label} data={c.data} layout={c.layout} onPointClick={onSelect} />
      ))}
    </div>
  );
}
