"use client";

import useSWR from "swr";
import { getJson } from "@/lib/client/fetch-json";
import type { PlanPage } from "@/lib/plans/schemas";
import type { PlanView } from "@/lib/plans/view";

/** One page of the lab's plans for a query string (`state=`, `author=`, `study=`, `q=`, sort and paging on the server). */
export function usePlans(labSlug: string, query: string, fallback?: PlanPage) {
  return useSWR<PlanPage>(`/api/labs/${labSlug}/plans?${query}`, getJson, { fallbackData: fallback, keepPreviousData: true });
}

/** One plan in the GET shape of CONTRACT.md (document, run sheet, cautions, the values it was computed with). */
export function usePlan(labSlug: string, planId: string, fallback?: PlanView) {
  return useSWR<{ plan: PlanView }>(`/api/labs/${labSlug}/plans/${planId}`, getJson, { fallbackData: fallback ? { plan: fallback } : undefined });
}
