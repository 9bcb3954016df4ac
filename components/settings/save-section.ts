"use client";

import type { FieldValues, Path, UseFormSetError } from "react-hook-form";
import { postJson } from "@/lib/client/fetch-json";
import type { LabSettingsView, SettingsSection } from "@/lib/lab-settings/schemas";

/**
 * Saves one settings section (PUT /api/labs/{lab}/settings/{section} `{ version, value }`).
 * Field errors from the server (`value.types.0.ratedBar`) are put on their form fields.
 * Returns the new settings, or the message to show.
 */
export async function saveSection<T extends FieldValues>(opts: {
  labSlug: string;
  section: SettingsSection;
  version: number;
  value: unknown;
  setError: UseFormSetError<T>;
}): Promise<{ ok: true; view: LabSettingsView } | { ok: false; message: string }> {
  const res = await postJson<LabSettingsView>(`/api/labs/${opts.labSlug}/settings/${opts.section}`, { version: opts.version, value: opts.value }, "PUT");
  if (res.ok) return { ok: true, view: res.data };
  for (const issue of res.error.issues) {
    if (issue.path.startsWith("value.")) opts.setError(issue.path.slice("value.".length) as Path<T>, { message: issue.message });
  }
  const stale = res.status === 409 ? " Reload the page to see the latest settings." : "";
  return { ok: false, message: `${res.error.message}${stale}` };
}
