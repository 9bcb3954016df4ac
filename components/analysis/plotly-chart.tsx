"use client";

import { useEffect, useRef, useState } from "react";
import type { Config, Data, Layout, PlotMouseEvent } from "plotly.js";
import { loadPlotly, type PlotlyBundle } from "./plotly";

/** Tareline's look for charts: paper, graphite ink, slate-blue marks, the app's sans font, tabular figures. */
export const CHART_COLORS = { ink: "#2a2a2d", soft: "#4b4a4f", faint: "#625e57", line: "#d9cfbd", paper: "#fbf8f1", accent: "#2f4a6d", caution: "#8a5607", blocks: "#9c3324", ok: "#1a6b64" } as const;

export function baseLayout(title: string, x: string, y: string): Partial<Layout> {
  const axis = (t: string) => ({ title: { text: t, font: { size: 12, color: CHART_COLORS.soft } }, gridcolor: "#ece4d4", zerolinecolor: CHART_COLORS.line, linecolor: CHART_COLORS.line, tickfont: { size: 11, color: CHART_COLORS.soft }, automargin: true });
  return {
    title: { text: title, font: { size: 13, color: CHART_COLORS.ink }, x: 0.02, xanchor: "left" },
    paper_bgcolor: CHART_COLORS.paper,
    plot_bgcolor: CHART_COLORS.paper,
    font: { family: "Inter Variable, system-ui, sans-serif", color: CHART_COLORS.ink, size: 12 },
    margin: { l: 56, r: 16, t: 36, b: 44 },
    xaxis: axis(x),
    yaxis: axis(y),
    showlegend: false,
    hovermode: "closest",
    height: 280,
  };
}

const CONFIG: Partial<Config> = { displaylogo: false, responsive: true, modeBarButtonsToRemove: ["select2d", "lasso2d", "autoScale2d", "toggleSpikelines"], toImageButtonOptions: { format: "png", scale: 2 } };

/**
 * One Plotly chart; `onPointClick` gets the clicked point's `customdata` (the run index).
 * Redraws with Plotly.react when data or layout change.
 */
export function PlotlyChart({ data, layout, testId, onPointClick, bundle = "cartesian", label }: { data: Data[]; layout: Partial<Layout>; testId: string; onPointClick?: (custom: number) => void; bundle?: PlotlyBundle; label: string }) {
  const el = useRef<HTMLDivElement | null>(null);
  const click = useRef(onPointClick);
  click.current = onPointClick;
  const [failed, setFailed] = useState<string | null>(null);
  const [drawn, setDrawn] = useState(false);
  useEffect(() => {
    let live = true;
    const node = el.current;
    loadPlotly(bundle)
      .then(async (Plotly) => {
        if (!live || !node) return;
        await Plotly.react(node, data, layout, CONFIG);
        const withEvents = node as unknown as { on?: (ev: string, fn: (e: PlotMouseEvent) => void) => void; removeAllListeners?: (ev: string) => void };
        withEvents.removeAllListeners?.("plotly_click");
        withEvents.on?.("plotly_click", (e) => {
          const custom = e.points[0]?.customdata;
          if (typeof custom === "number") click.current?.(custom);
        });
        if (live) setDrawn(true);
      })
      .catch((e: unknown) => live && setFailed(e instanceof Error ? e.message : String(e)));
    return () => {
      live = false;
    };
  }, [data, layout, bundle]);
  useEffect(() => {
    const node = el.current;
    return () => {
      if (node) void loadPlotly(bundle).then((Plotly) => Plotly.purge(node));
    };
  }, [bundle]);
  return (
    <figure className="min-w-0 rounded-lg border border-ink-line bg-paper-card p-2" data-testid={testId} data-drawn={drawn ? "true" : "false"} aria-label={label}>
      <div ref={el} className="min-h-[280px] w-full" />
      {failed && <figcaption className="px-2 text-sm text-blocks">The chart could not be drawn: {failed}</figcaption>}
    </figure>
  );
}
