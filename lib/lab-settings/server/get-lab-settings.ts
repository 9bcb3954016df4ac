import "server-only";
import type { Transaction } from "sequelize";
import { AppError } from "@/lib/errors/app-error";
import { Lab } from "@/lib/server/models";
import { readLabSettings, type LabSettingsView } from "../schemas";

/**
 * The lab's settings, every section complete (defaults where the lab saved nothing), and
 * the version to send back with a change.
 * @throws AppError not_found when the lab does not exist.
 */
export async function getLabSettings(opts: { labId: string }, t?: Transaction): Promise<LabSettingsView> {
  const lab = await Lab.findByPk(opts.labId, { attributes: ["id", "settings", "settingsVersion"], transaction: t });
  if (!lab) throw new AppError("not_found", "No such lab.");
  return { version: lab.settingsVersion, settings: readLabSettings(lab.settings) };
}
