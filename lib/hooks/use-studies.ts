"use client";

import useSWR from "swr";
import { getJson } from "@/lib/client/fetch-json";
import type { PlanSummary } from "@/lib/plans/schemas";
import type { StudyPage, StudyRow } from "@/lib/studies/schemas";

/** One page of the lab's studies for a query string (name filter, sort and paging on the server). */
export function useStudies(labSlug: string, query: string, fallback?: StudyPage) {
  return useSWR<StudyPage>(`/api/labs/${labSlug}/studies?${query}`, getJson, { fallbackData: fallback, keepPreviousData: true });
}

/** One study with its plans. */
export function useStudy(labSlug: string, studyId: string, fallback?: { study: StudyRow; plans: PlanSummary[] }) {
  return useSWR<{ study: StudyRow; plans: PlanSummary[] }>(`/api/labs/${labSlug}/studies/${studyId}`, getJson, { fallbackData: fallback });
}
