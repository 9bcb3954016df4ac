"use client";

import { useMemo } from "react";
import type { SurfaceAnswer } from "@/lib/results/surface";
import { PlotlyChart } from "./plotly-chart";
import { contourFigure } from "./surface-traces";

/** The contour plot of the surface: the safe envelope hatched and labelled, the extrapolated region shaded, the design points and the best conditions. */
export function SurfaceContour({ surface, optimum }: { surface: SurfaceAnswer; optimum: Record<string, number> | null }) {
  const fig = useMemo(() => contourFigure(surface, { optimum }), [surface, optimum]);
  return <PlotlyChart data={fig.data} layout={fig.layout} testId="surface-contour" label={`Contour plot of the predicted ${surface.response.name} over ${surface.x} and ${surface.y}`} />;
}
