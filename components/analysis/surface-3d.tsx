"use client";

import { useMemo } from "react";
import type { SurfaceAnswer } from "@/lib/results/surface";
import { PlotlyChart } from "./plotly-chart";
import { surfaceFigure } from "./surface-traces";

/** The 3-D response surface (Plotly's WebGL bundle, loaded only when this mounts) with the envelope painted on it. */
export function Surface3D({ surface, optimum, optimumPredicted }: { surface: SurfaceAnswer; optimum: Record<string, number> | null; optimumPredicted: number | null }) {
  const fig = useMemo(() => surfaceFigure(surface, { optimum }, optimumPredicted), [surface, optimum, optimumPredicted]);
  return <PlotlyChart data={fig.data} layout={fig.layout} bundle="gl3d" testId="surface-3d" label={`3-D surface of the predicted ${surface.response.name} over ${surface.x} and ${surface.y}`} />;
}
