"use client";

import { analysisQuery, type AnalysisParams, type AnalysisSource } from "@/lib/hooks/use-analysis";
import { surfaceQuery, type SurfaceParams } from "@/lib/hooks/use-surface";
import { buttonClass } from "@/components/ui/button";

/** The analysis report's URL: the analysis as shown (model, pruning, optimum region and responses) and the contour as drawn (axes, held values). */
export function reportUrl(labSlug: string, source: AnalysisSource, params: AnalysisParams, surface: SurfaceParams | null): string {
  const q = new URLSearchParams(surface ? surfaceQuery(params, { ...surface, steps: 61 }) : analysisQuery(params));
  if (surface) {
    // The optimum's region and responses, which the surface query leaves out.
    const a = new URLSearchParams(analysisQuery(params));
    for (const k of ["region", "combine"]) if (a.has(k)) q.set(k, a.get(k)!);
  }
  if (source.kind === "plan") return `/api/labs/${labSlug}/plans/${source.planId}/analysis-report.pdf?${q.toString()}`;
  return `/api/labs/${labSlug}/studies/${source.studyId}/analysis-report.pdf?plans=${source.plans.join(",")}&${q.toString()}`;
}

/** "Download the analysis report (PDF)": the model, tables, diagnostics, the contour with the safe envelope, the optimum, the notice. */
export function ReportLink({ labSlug, source, params, surface }: { labSlug: string; source: AnalysisSource; params: AnalysisParams; surface: SurfaceParams | null }) {
  return (
    <p className="flex flex-wrap items-center gap-3 text-sm">
      <a className={buttonClass("secondary")} href={reportUrl(labSlug, source, params, surface)} download data-testid="analysis-report-link">
        Download the analysis report (PDF)
      </a>
      <span className="text-ink-faint">the model, its tables and diagnostics, the contour plot as drawn above with the safe envelope, and the best conditions</span>
    </p>
  );
}
