"use client";

import useSWR from "swr";
import { getJson } from "@/lib/client/fetch-json";
import type { LabSettingsView } from "@/lib/lab-settings/schemas";

/** The lab's settings (every section, defaults filled in) and their version. */
export function useLabSettings(labSlug: string, fallback?: LabSettingsView) {
  return useSWR<LabSettingsView>(`/api/labs/${labSlug}/settings`, getJson, { fallbackData: fallback });
}
