import { pageLabAccess } from "@/lib/auth/page-access";
import { can } from "@/lib/auth/permissions";
import { SETTINGS_SECTIONS, SETTINGS_SECTION_PERMISSION, type SettingsSection } from "@/lib/lab-settings/schemas";
import { getLabSettings } from "@/lib/lab-settings/server/get-lab-settings";
import { LabSettingsSections } from "@/components/settings/lab-settings-sections";

export const metadata = { title: "Settings" };

/** The lab's settings overview: one section per kind of setting, each editable only by its role. */
export default async function SettingsPage({ params }: { params: Promise<{ lab: string }> }) {
  const { lab: slug } = await params;
  const access = await pageLabAccess(slug, "settings.read");
  const view = await getLabSettings({ labId: access.lab.id });
  const editable = Object.fromEntries(SETTINGS_SECTIONS.map((s) => [s, can(access.role, SETTINGS_SECTION_PERMISSION[s])])) as Record<SettingsSection, boolean>;
  return (
    <div className="flex flex-col gap-5">
      <div>
        <p className="text-sm uppercase tracking-wide text-ink-faint">Settings</p>
        <h1>Lab settings</h1>
        <p className="mt-1 max-w-3xl text-sm text-ink-soft">
          The equipment, limits and thresholds of {access.lab.name}. A new plan copies them into its document, so it keeps the values it was planned with when they change later.
          Lab admins edit equipment and dispensing limits; safety officers edit the hazard thresholds.
        </p>
      </div>
      <LabSettingsSections labSlug={access.lab.slug} initial={view} editable={editable} />
    </div>
  );
}
