"use client";

import useSWR from "swr";
import { getJson } from "@/lib/client/fetch-json";
import type { ApiTokenRow } from "@/lib/api-tokens/schemas";

/** The lab's API tokens (never their secrets). */
export function useApiTokens(labSlug: string, fallback?: ApiTokenRow[]) {
  return useSWR<{ tokens: ApiTokenRow[] }>(`/api/labs/${labSlug}/tokens`, getJson, { fallbackData: fallback ? { tokens: fallback } : undefined });
}
