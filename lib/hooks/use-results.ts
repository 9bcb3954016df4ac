"use client";

import useSWR from "swr";
import { getJson } from "@/lib/client/fetch-json";
import type { ResultsView } from "@/lib/results/view";

/** A plan's results (`GET /plans/{plan}/results`): every cell with who entered it, what is missing, the runs left out. */
export function useResults(labSlug: string, planId: string, fallback?: ResultsView) {
  return useSWR<{ results: ResultsView }>(`/api/labs/${labSlug}/plans/${planId}/results`, getJson, { fallbackData: fallback ? { results: fallback } : undefined });
}
