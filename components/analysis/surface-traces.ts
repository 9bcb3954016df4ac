/**
 * The Plotly traces and layouts of a response surface (lib/results/surface.ts answer): the
 * contour plot — filled contours of the predicted response, the extrapolated region shaded
 * and labelled, the safe envelope hatched (brick red where a blocking caution fires, graphite
 * where a limit of the lab is left) with each caution's label inside its own region, the
 * design points (filled on the slice drawn, hollow off it) and the best conditions — and the
 * 3-D surface with the same regions painted on it. Pure: data in, Plotly objects out.
 */
import { displayUnit } from "@/lib/units/display-unit";
import type { Annotations, Data, Layout } from "plotly.js";
import type { SurfaceAnswer, SurfaceFactor } from "@/lib/results/surface";
import type { MaskRegion } from "@/lib/surface/regions";
import { CHART_COLORS, baseLayout } from "./plotly-chart";
import { sig, withUnit } from "./format";

/** Paper to slate blue: low responses light, high responses dark. */
export const SURFACE_SCALE: Array<[number, string]> = [
  [0, "#f4eee2"],
  [0.35, "#c9d2da"],
  [0.7, "#7d93ad"],
  [1, "#2f4a6d"],
];
export const HATCH = { caution: CHART_COLORS.blocks, limit: "#3d3c40", extrapolated: "rgba(98, 94, 87, 0.16)" } as const;

const unitText = (u: string) => displayUnit(u);
export const axisTitle = (f: SurfaceFactor | undefined, name: string) => (f?.unit ? `${name} (${unitText(f.unit)})` : name);

/** A region's rings as one scatter path (rings separated by gaps), for a fill "toself". */
function ringPath(r: MaskRegion): { x: Array<number | null>; y: Array<number | null> } {
  const x: Array<number | null> = [];
  const y: Array<number | null> = [];
  r.rings.forEach((ring, i) => {
    if (i > 0) {
      x.push(null);
      y.push(null);
    }
    for (const [a, b] of ring) {
      x.push(a);
      y.push(b);
    }
  });
  return { x, y };
}

/**
 * Moves labels apart: in the plot's fractions (about 480 × 380 px), a label that would
 * overlap one already placed steps up or down by its height until it is free.
 */
function placeLabels<T extends { at: [number, number]; text: string }>(labels: readonly T[], xr: number[], yr: number[], xLog: boolean, yLog: boolean): T[] {
  const t = (v: number, log: boolean) => (log ? Math.log10(v) : v);
  const frac = (v: number, r: number[], log: boolean) => (t(v, log) - t(r[0]!, log)) / (t(r[1]!, log) - t(r[0]!, log));
  const back = (f: number, r: number[], log: boolean) => {
    const v = t(r[0]!, log) + f * (t(r[1]!, log) - t(r[0]!, log));
    return log ? 10 ** v : v;
  };
  const h = 18 / 380;
  const placed: Array<{ x: number; y: number; w: number }> = [];
  return labels.map((l) => {
    const w = (l.text.replace(/<[^>]+>/g, "").length * 6.4 + 8) / 480;
    const x = frac(l.at[0], xr, xLog);
    const y0 = frac(l.at[1], yr, yLog);
    let y = y0;
    for (let k = 1; k < 40 && placed.some((p) => Math.abs(p.x - x) < (p.w + w) / 2 && Math.abs(p.y - y) < h); k++) {
      y = Math.min(0.96, Math.max(0.04, y0 + (k % 2 ? 1 : -1) * Math.ceil(k / 2) * h));
    }
    placed.push({ x, y, w });
    return { ...l, at: [l.at[0], back(y, yr, yLog)] as [number, number] };
  });
}

export interface SurfaceMarks {
  /** The best conditions (natural values by factor), drawn as a cross when on the chart. */
  optimum?: Record<string, number> | null;
}

/** The contour plot of a surface with the envelope hatched and the design points. */
export function contourFigure(s: SurfaceAnswer, marks: SurfaceMarks = {}): { data: Data[]; layout: Partial<Layout> } {
  const g = s.grid;
  const fx = s.factors.find((f) => f.name === s.x);
  const fy = s.factors.find((f) => f.name === s.y);
  const ru = s.response.unit ? ` (${unitText(s.response.unit)})` : "";
  const data: Data[] = [
    {
      type: "contour",
      x: g.xNatural,
      y: g.yNatural,
      z: g.z,
      colorscale: SURFACE_SCALE,
      contours: { coloring: "heatmap", showlabels: true, labelfont: { size: 10, color: CHART_COLORS.ink } },
      line: { color: "rgba(42, 42, 45, 0.45)", width: 0.8, smoothing: 0.85 },
      colorbar: { title: { text: `${s.response.name}${ru}`, side: "right", font: { size: 11, color: CHART_COLORS.soft } }, thickness: 12, outlinewidth: 0, tickfont: { size: 10, color: CHART_COLORS.soft } },
      hovertemplate: `${s.x} %{x:.4g}<br>${s.y} %{y:.4g}<br>predicted ${s.response.name} %{z:.4g}<extra></extra>`,
      name: "predicted",
    } as Data,
  ];
  const region = (r: MaskRegion, extra: Partial<Data>) => {
    if (r.rings.length === 0) return;
    data.push({ type: "scatter", mode: "lines", ...ringPath(r), fill: "toself", hoverinfo: "skip", showlegend: false, ...extra } as Data);
  };
  region(s.extrapolated, { fillcolor: HATCH.extrapolated, line: { color: "rgba(98, 94, 87, 0.55)", width: 1, dash: "dot" }, name: "extrapolated" });
  region(s.envelope.cautions, { fillcolor: "rgba(0,0,0,0)", fillpattern: { shape: "/", fgcolor: HATCH.caution, bgcolor: "rgba(244, 217, 211, 0.6)", size: 8, solidity: 0.22 }, line: { color: HATCH.caution, width: 1.6 }, name: "a blocking caution fires" });
  region(s.envelope.limits, { fillcolor: "rgba(0,0,0,0)", fillpattern: { shape: "\\", fgcolor: HATCH.limit, bgcolor: "rgba(0,0,0,0)", size: 9, solidity: 0.18 }, line: { color: HATCH.limit, width: 1.4, dash: "dash" }, name: "outside the lab's limits" });

  const pts = s.points.filter((p) => p.status === "used" || p.status === "excluded");
  const pointTrace = (on: boolean): Data => {
    const ps = pts.filter((p) => p.onSlice === on);
    return {
      type: "scatter",
      mode: "markers",
      x: ps.map((p) => p.x),
      y: ps.map((p) => p.y),
      text: ps.map((p) => `run ${p.run}${s.points.some((q) => q.planId !== p.planId) ? ` of ${p.planName}` : ""}: ${p.observed === null ? "no result" : `${sig(p.observed)}${ru ? ` ${unitText(s.response.unit)}` : ""}`}${on ? "" : " (off this slice)"}${p.status === "excluded" ? ", left out" : ""}`),
      hovertemplate: "%{text}<extra></extra>",
      marker: on ? { color: CHART_COLORS.ink, size: 8, line: { color: CHART_COLORS.paper, width: 1.2 } } : { color: "rgba(0,0,0,0)", size: 7, line: { color: CHART_COLORS.ink, width: 1.3 } },
      name: on ? "design points on this slice" : "design points off this slice",
    } as Data;
  };
  data.push(pointTrace(false), pointTrace(true));
  const o = marks.optimum;
  if (o && o[s.x] !== undefined && o[s.y] !== undefined) {
    data.push({
      type: "scatter",
      mode: "text+markers",
      x: [o[s.x]!],
      y: [o[s.y]!],
      text: ["best"],
      textposition: "top right",
      textfont: { color: CHART_COLORS.accent, size: 11 },
      hovertemplate: `best conditions<br>${s.x} %{x:.4g}<br>${s.y} %{y:.4g}<extra></extra>`,
      marker: { symbol: "cross-thin-open", size: 16, line: { color: CHART_COLORS.accent, width: 2.5 }, color: CHART_COLORS.accent },
      name: "best conditions",
    } as Data);
  }

  // Labels: the extrapolated region, and each finding by its code where it is most alone (titles are in the legend beside).
  const xr = [g.xNatural[0]!, g.xNatural[g.xNatural.length - 1]!];
  const yr = [g.yNatural[0]!, g.yNatural[g.yNatural.length - 1]!];
  const wanted: Array<{ at: [number, number]; text: string; color: string }> = [];
  if (s.extrapolated.rings.length && s.extrapolated.label) wanted.push({ at: s.extrapolated.label, text: "extrapolated", color: CHART_COLORS.faint });
  for (const f of s.envelope.findings) if (f.label) wanted.push({ at: f.label, text: `<b>${f.code}</b>`, color: f.kind === "caution" ? HATCH.caution : HATCH.limit });
  const annotations: Array<Partial<Annotations>> = placeLabels(wanted, xr, yr, fx?.scale === "log", fy?.scale === "log").map((l) => ({
    x: l.at[0],
    y: l.at[1],
    text: l.text,
    showarrow: false,
    font: { size: 10, color: l.color },
    bgcolor: "rgba(251, 248, 241, 0.92)",
    bordercolor: l.color,
    borderwidth: 1,
    borderpad: 2,
  }));

  const base = baseLayout(`Predicted ${s.response.name}${heldLine(s)}`, axisTitle(fx, s.x), axisTitle(fy, s.y));
  const logRange = (r: number[]) => r.map((v) => Math.log10(v));
  return {
    data,
    layout: {
      ...base,
      height: 480,
      margin: { l: 64, r: 16, t: 44, b: 52 },
      xaxis: { ...base.xaxis, range: fx?.scale === "log" ? logRange(xr) : xr, type: fx?.scale === "log" ? "log" : "linear", showgrid: false, zeroline: false },
      yaxis: { ...base.yaxis, range: fy?.scale === "log" ? logRange(yr) : yr, type: fy?.scale === "log" ? "log" : "linear", showgrid: false, zeroline: false },
      annotations,
    },
  };
}

/** "· held at baseEquiv 2.25 equiv" for the title. */
function heldLine(s: SurfaceAnswer): string {
  const held = Object.entries(s.grid.fixed).map(([k, v]) => `${k} ${withUnit(v, s.factors.find((f) => f.name === k)?.unit)}`);
  return held.length ? ` · ${held.join(", ")}` : "";
}

/** z where the mask holds, null elsewhere (a surface draws only the cells with four values). */
const masked = (z: number[][], test: (i: number, j: number) => boolean, lift: number) => z.map((row, j) => row.map((v, i) => (test(i, j) ? v + lift : null)));

/** The 3-D surface with the envelope and the extrapolated region painted on it, and the design points at their observed results. */
export function surfaceFigure(s: SurfaceAnswer, marks: SurfaceMarks = {}, optimumPredicted: number | null = null): { data: Data[]; layout: Partial<Layout> } {
  const g = s.grid;
  const fx = s.factors.find((f) => f.name === s.x);
  const fy = s.factors.find((f) => f.name === s.y);
  const ru = s.response.unit ? ` (${unitText(s.response.unit)})` : "";
  const flat = g.z.flat();
  const zMin = Math.min(...flat);
  const zMax = Math.max(...flat);
  const lift = (zMax - zMin || 1) * 0.004;
  const kinds = s.envelope.findings.map((f) => f.kind);
  const blockedKind = (i: number, j: number, kind: "caution" | "limit") => (g.blocked?.[j]?.[i] ?? []).some((k) => kinds[k] === kind);
  const flatColour = (colour: string, name: string, z: Array<Array<number | null>>, opacity: number): Data =>
    ({ type: "surface", x: g.xNatural, y: g.yNatural, z, surfacecolor: z.map((r) => r.map((v) => (v === null ? null : 0))), colorscale: [[0, colour], [1, colour]], showscale: false, opacity, hoverinfo: "skip", name }) as Data;
  const data: Data[] = [
    {
      type: "surface",
      x: g.xNatural,
      y: g.yNatural,
      z: g.z,
      colorscale: SURFACE_SCALE,
      colorbar: { title: { text: `${s.response.name}${ru}`, side: "right", font: { size: 11, color: CHART_COLORS.soft } }, thickness: 12, outlinewidth: 0, len: 0.7 },
      contours: { z: { show: true, usecolormap: true, project: { z: true }, width: 1 } },
      hovertemplate: `${s.x} %{x:.4g}<br>${s.y} %{y:.4g}<br>predicted %{z:.4g}<extra></extra>`,
      name: "predicted",
    } as Data,
  ];
  if (s.extrapolated.rings.length) data.push(flatColour("#b9b2a6", "extrapolated", masked(g.z, (i, j) => g.extrapolated[j]![i]! && !(g.blocked?.[j]?.[i]?.length), lift), 0.55));
  if (s.envelope.limits.rings.length) data.push(flatColour("#5b5a60", "outside the lab's limits", masked(g.z, (i, j) => blockedKind(i, j, "limit") && !blockedKind(i, j, "caution"), 2 * lift), 0.85));
  if (s.envelope.cautions.rings.length) data.push(flatColour(HATCH.caution, "a blocking caution fires", masked(g.z, (i, j) => blockedKind(i, j, "caution"), 3 * lift), 0.85));
  const pts = s.points.filter((p) => p.observed !== null && (p.status === "used" || p.status === "excluded"));
  for (const on of [true, false]) {
    const ps = pts.filter((p) => p.onSlice === on);
    if (ps.length === 0) continue;
    data.push({
      type: "scatter3d",
      mode: "markers",
      x: ps.map((p) => p.x),
      y: ps.map((p) => p.y),
      z: ps.map((p) => p.observed!),
      text: ps.map((p) => `run ${p.run}: ${sig(p.observed)}${on ? "" : " (off this slice)"}`),
      hovertemplate: "%{text}<extra></extra>",
      marker: on ? { size: 4, color: CHART_COLORS.ink } : { size: 3, color: "rgba(42,42,45,0.35)" },
      name: on ? "runs on this slice" : "runs off this slice",
    } as Data);
  }
  const o = marks.optimum;
  if (o && optimumPredicted !== null && o[s.x] !== undefined && o[s.y] !== undefined) {
    data.push({ type: "scatter3d", mode: "markers", x: [o[s.x]!], y: [o[s.y]!], z: [optimumPredicted], marker: { size: 6, color: CHART_COLORS.accent, symbol: "diamond" }, hovertemplate: "best conditions<extra></extra>", name: "best conditions" } as Data);
  }
  const axis = (t: string, log: boolean) => ({ title: { text: t, font: { size: 11, color: CHART_COLORS.soft } }, type: log ? ("log" as const) : ("linear" as const), backgroundcolor: CHART_COLORS.paper, gridcolor: "#e3d9c6", zerolinecolor: CHART_COLORS.line, tickfont: { size: 10, color: CHART_COLORS.soft } });
  return {
    data,
    layout: {
      paper_bgcolor: CHART_COLORS.paper,
      font: { family: "Inter Variable, system-ui, sans-serif", color: CHART_COLORS.ink, size: 12 },
      title: { text: `Predicted ${s.response.name}${heldLine(s)}`, font: { size: 13, color: CHART_COLORS.ink }, x: 0.02, xanchor: "left" },
      margin: { l: 0, r: 0, t: 36, b: 0 },
      height: 480,
      showlegend: false,
      scene: {
        xaxis: axis(axisTitle(fx, s.x), fx?.scale === "log"),
        yaxis: axis(axisTitle(fy, s.y), fy?.scale === "log"),
        zaxis: axis(`${s.response.name}${ru}`, false),
        camera: { eye: { x: 1.55, y: -1.55, z: 0.95 } },
        aspectmode: "manual",
        aspectratio: { x: 1, y: 1, z: 0.7 },
      },
    } as Partial<Layout>,
  };
}
