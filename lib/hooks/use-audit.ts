"use client";

import useSWR from "swr";
import { getJson } from "@/lib/client/fetch-json";
import type { AuditPage } from "@/lib/audit/schemas";

/** One page of the lab's audit log for a query string (filters and paging on the server). */
export function useAuditLog(labSlug: string, query: string, fallback?: AuditPage) {
  return useSWR<AuditPage>(`/api/labs/${labSlug}/audit?${query}`, getJson, { fallbackData: fallback, keepPreviousData: true });
}
