"use client";
/**
 * Plotly (plotly.js 4.1.1, MIT) for the analysis pages only: loaded with a dynamic import
 * the first time a chart mounts, so no other page carries it. Two prebuilt bundles, both
 * free of eval and `new Function` (the app's Content-Security-Policy forbids them; the CSP
 * browser test opens the analysis page): "cartesian" — scatter, bar, contour, heatmap — for
 * the diagnostics and the contour plots, and "gl3d" — surface, scatter3d, mesh3d — for the
 * 3-D response surface (WebGL), loaded only when one is drawn.
 */
import type * as PlotlyTypes from "plotly.js";

export type PlotlyApi = typeof PlotlyTypes;
export type PlotlyBundle = "cartesian" | "gl3d";

const loading = new Map<PlotlyBundle, Promise<PlotlyApi>>();

function unwrap(m: unknown): PlotlyApi {
  const mod = m as { default?: PlotlyApi } & PlotlyApi;
  return mod.default ?? mod;
}

/** The Plotly bundle, imported once per page. */
export function loadPlotly(bundle: PlotlyBundle = "cartesian"): Promise<PlotlyApi> {
  let p = loading.get(bundle);
  if (!p) {
    p = bundle === "cartesian" ? import("plotly.js-cartesian-dist-min").then(unwrap) : import("plotly.js-gl3d-dist-min").then(unwrap);
    loading.set(bundle, p);
  }
  return p;
}
