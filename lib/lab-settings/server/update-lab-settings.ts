import "server-only";
import type { Transaction } from "sequelize";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { audit } from "@/lib/server/audit";
import { inTransaction } from "@/lib/server/db";
import { Lab } from "@/lib/server/models";
import { assertVersion } from "@/inventory/server/common";
import { readLabSettings, settingsUpdateSchema, SETTINGS_SECTION_LABELS, type LabSettingsView, type SettingsSection } from "../schemas";

/**
 * Replaces one section of the lab's settings (`{ version, value }`), with the version
 * check, and audits the section before → after. Plans already made keep the values they
 * were created with (they are copied into each plan's document).
 * The caller checks that the person may edit this section (SETTINGS_SECTION_PERMISSION).
 * @throws AppError invalid_input (paths `value.…`), conflict (stale `version`), not_found.
 */
export async function updateLabSettings(opts: { labId: string; actorUserId: string; section: SettingsSection; input: unknown }, t?: Transaction): Promise<LabSettingsView> {
  const v = parseOrThrow(settingsUpdateSchema(opts.section), opts.input, `The ${SETTINGS_SECTION_LABELS[opts.section].toLowerCase()} are not valid.`);
  return inTransaction(t, async (tx) => {
    const lab = await Lab.findByPk(opts.labId, { attributes: ["id", "settings", "settingsVersion"], transaction: tx, lock: tx.LOCK.UPDATE });
    if (!lab) throw new AppError("not_found", "No such lab.");
    assertVersion("lab's settings", lab.settingsVersion, v.version);
    const before = readLabSettings(lab.settings)[opts.section];
    const stored = lab.settings && typeof lab.settings === "object" ? lab.settings : {};
    lab.settings = { ...stored, [opts.section]: v.value };
    lab.settingsVersion = lab.settingsVersion + 1;
    await lab.save({ transaction: tx });
    await audit(
      {
        labId: opts.labId,
        actorUserId: opts.actorUserId,
        action: "lab_settings.updated",
        entityType: "lab_settings",
        entityId: opts.labId,
        before: { section: opts.section, version: v.version, value: before },
        after: { section: opts.section, version: lab.settingsVersion, value: v.value },
      },
      tx,
    );
    return { version: lab.settingsVersion, settings: readLabSettings(lab.settings) };
  });
}
