import { AppError } from "@/lib/errors/app-error";
import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { SETTINGS_SECTIONS, SETTINGS_SECTION_PERMISSION, type SettingsSection } from "@/lib/lab-settings/schemas";
import { updateLabSettings } from "@/lib/lab-settings/server/update-lab-settings";

type Ctx = { params: Promise<{ lab: string; section: string }> };

const isSection = (s: string): s is SettingsSection => (SETTINGS_SECTIONS as readonly string[]).includes(s);

/**
 * `PUT /settings/{vessels|blocks|dispensing|thresholds}` `{ version, value }` → the whole
 * settings `{ version, settings }`; who may edit each section is SETTINGS_SECTION_PERMISSION.
 */
export const PUT = route(async (req, { params }: Ctx) => {
  const p = await params;
  const section = p.section;
  const access = await requireLabAccess(p.lab, isSection(section) ? SETTINGS_SECTION_PERMISSION[section] : "settings.read");
  if (!isSection(section)) throw new AppError("not_found", `No settings section "${section}"; use ${SETTINGS_SECTIONS.join(", ")}.`, [{ path: "section", message: "unknown section" }]);
  return updateLabSettings({ labId: access.lab.id, actorUserId: access.userId, section, input: await readJson(req) });
});
