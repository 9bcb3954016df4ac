"use client";

import useSWR from "swr";
import { getJson } from "@/lib/client/fetch-json";
import type { MembershipRow } from "@/lib/members/schemas";

/** The lab's members (SWR), typed from the shared schema. */
export function useMembers(labSlug: string, fallback?: MembershipRow[]) {
  return useSWR<{ members: MembershipRow[] }>(`/api/labs/${labSlug}/members`, getJson, {
    fallbackData: fallback ? { members: fallback } : undefined,
  });
}
