"use client";

import useSWR from "swr";
import { getJson } from "@/lib/client/fetch-json";
import type { SurfaceAnswer } from "@/lib/results/surface";
import { analysisQuery, type AnalysisParams, type AnalysisSource } from "./use-analysis";

/** The surface's axes and sliders: the two factors (null: the server's choice, the two strongest), their natural ranges (null: the studied range), the held values and the points per axis. */
export interface SurfaceParams {
  x: string | null;
  y: string | null;
  xRange: [number, number] | null;
  yRange: [number, number] | null;
  hold: Record<string, number>;
  steps: number;
}

/** The query of `GET …/analysis/surface` (the analysis query plus the surface's own parameters). */
export function surfaceQuery(p: AnalysisParams, s: SurfaceParams): string {
  const q = new URLSearchParams(analysisQuery({ ...p, region: undefined, combine: undefined }));
  if (s.x) q.set("x", s.x);
  if (s.y) q.set("y", s.y);
  if (s.xRange) q.set("xRange", s.xRange.join(","));
  if (s.yRange) q.set("yRange", s.yRange.join(","));
  const hold = Object.entries(s.hold).filter(([k]) => k !== s.x && k !== s.y);
  if (hold.length) q.set("hold", hold.map(([k, v]) => `${k}:${v}`).join(","));
  q.set("steps", String(s.steps));
  return q.toString();
}

/** The URL of a surface (of a plan's analysis, or of a study's plans analysed together). */
export function surfaceUrl(labSlug: string, source: AnalysisSource, p: AnalysisParams, s: SurfaceParams): string {
  const base = source.kind === "plan" ? `/api/labs/${labSlug}/plans/${source.planId}/analysis/surface` : `/api/labs/${labSlug}/studies/${source.studyId}/analysis/surface`;
  return `${base}?${source.kind === "study" ? `plans=${source.plans.join(",")}&` : ""}${surfaceQuery(p, s)}`;
}

/** A surface; the previous one stays drawn while the next loads (a slider moved). */
export function useSurface(labSlug: string, source: AnalysisSource, p: AnalysisParams, s: SurfaceParams | null) {
  return useSWR<{ surface: SurfaceAnswer }>(s ? surfaceUrl(labSlug, source, p, s) : null, getJson, { keepPreviousData: true, revalidateOnFocus: false, shouldRetryOnError: false });
}
