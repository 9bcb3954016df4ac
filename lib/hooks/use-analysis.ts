"use client";

import useSWR from "swr";
import { getJson } from "@/lib/client/fetch-json";
import type { AnalysisAnswer } from "@/lib/results/analysis";

/** What to analyse: one plan, or several plans of a study together (a block term). */
export type AnalysisSource = { kind: "plan"; planId: string } | { kind: "study"; studyId: string; plans: string[] };

/** The analysis request's query: response, model (a name or terms), α (pruning; null: none), hierarchy, transform; where the optimum is looked for and the responses optimised with it. */
export interface AnalysisParams {
  response: string;
  model: "linear" | "interaction" | "quadratic" | string[];
  alpha: number | null;
  hierarchy: boolean;
  transform: "none" | "ln";
  /** The cube of the factor ranges (default) or the design's sphere. */
  region?: "cube" | "sphere";
  /** Other responses optimised together through their desirability. */
  combine?: string[];
}

/** The query string of CONTRACT.md `GET …/analysis` for these parameters. */
export function analysisQuery(p: AnalysisParams): string {
  const q = new URLSearchParams({ response: p.response, model: Array.isArray(p.model) ? p.model.join(",") : p.model, hierarchy: String(p.hierarchy), transform: p.transform });
  if (p.alpha !== null) q.set("alpha", String(p.alpha));
  if (p.region && p.region !== "cube") q.set("region", p.region);
  if (p.combine && p.combine.length) q.set("combine", p.combine.join(","));
  return q.toString();
}

/** The URL of an analysis. */
export function analysisUrl(labSlug: string, source: AnalysisSource, p: AnalysisParams): string {
  const base = source.kind === "plan" ? `/api/labs/${labSlug}/plans/${source.planId}/analysis` : `/api/labs/${labSlug}/studies/${source.studyId}/analysis`;
  const q = analysisQuery(p);
  return `${base}?${source.kind === "study" ? `plans=${source.plans.join(",")}&` : ""}${q}`;
}

/** An analysis (the fit verb's output, the optimum, the runs used); the previous answer stays shown while the next loads. */
export function useAnalysis(labSlug: string, source: AnalysisSource | null, p: AnalysisParams) {
  return useSWR<AnalysisAnswer>(source && (source.kind === "plan" || source.plans.length > 0) ? analysisUrl(labSlug, source, p) : null, getJson, { keepPreviousData: true, revalidateOnFocus: false, shouldRetryOnError: false });
}
