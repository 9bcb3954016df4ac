"use client";

import { useState } from "react";
import { SETTINGS_SECTIONS, SETTINGS_SECTION_LABELS, type LabSettingsView, type SettingsSection } from "@/lib/lab-settings/schemas";
import { BlocksSection } from "./blocks-section";
import { DispensingSection } from "./dispensing-section";
import { ThresholdsSection } from "./thresholds-section";
import { VesselTypesSection } from "./vessel-types-section";

/**
 * The lab settings' sections, each with its own form, editable only by the role that may
 * (SETTINGS_SECTION_PERMISSION). The settings share one version: each save returns the
 * new one, which the next save sends.
 */
export function LabSettingsSections({ labSlug, initial, editable }: { labSlug: string; initial: LabSettingsView; editable: Record<SettingsSection, boolean> }) {
  const [view, setView] = useState(initial);
  const common = { labSlug, version: view.version, onSaved: setView };
  return (
    <div className="flex flex-col gap-5">
      <nav aria-label="Settings sections" className="flex flex-wrap gap-3 text-sm">
        {SETTINGS_SECTIONS.map((s) => (
          <a key={s} href={`#${s}`}>
            {SETTINGS_SECTION_LABELS[s]}
          </a>
        ))}
      </nav>
      <VesselTypesSection {...common} value={view.settings.vessels} editable={editable.vessels} />
      <BlocksSection {...common} value={view.settings.blocks} editable={editable.blocks} />
      <DispensingSection {...common} value={view.settings.dispensing} editable={editable.dispensing} />
      <ThresholdsSection {...common} value={view.settings.thresholds} editable={editable.thresholds} />
    </div>
  );
}
