import "server-only";
import { createHash } from "node:crypto";
import type { Transaction } from "sequelize";
import { AppError } from "@/lib/errors/app-error";
import { toStorable } from "@/lib/schemas/text";
import { inTransaction } from "@/lib/server/db";
import { audit } from "@/lib/server/audit";
import { Chemical, SafetyDataSheet } from "@/lib/server/models";
import { sdsProblem } from "../sds";

/** The uploaded file's name as stored: no path separators, quotes, line breaks, NUL or broken characters; at most 255 characters. */
function storableFilename(name: string): string {
  const clean = toStorable(name.slice(0, 255)).replace(/[\\/\r\n"\u0000-\u001f]/g, "_");
  return clean.trim() || "safety-data-sheet.pdf";
}

/**
 * Stores (or replaces) a chemical's safety data sheet in the database (BYTEA), after
 * checking that it is a PDF by its first bytes and at most 10 MB. Audited with the file's
 * name, size and SHA-256.
 * @throws AppError not_found (chemical of another lab), invalid_input (not a PDF, too big).
 */
export async function uploadSafetyDataSheet(opts: { labId: string; actorUserId: string; chemicalId: string; filename: string; bytes: Uint8Array }, t?: Transaction) {
  const problem = sdsProblem(opts.bytes);
  if (problem) throw AppError.field("file", problem);
  const filename = storableFilename(opts.filename);
  const sha256 = createHash("sha256").update(opts.bytes).digest("hex");
  return inTransaction(t, async (t) => {
    const chem = await Chemical.findOne({ where: { id: opts.chemicalId, labId: opts.labId }, lock: t.LOCK.UPDATE, transaction: t });
    if (!chem) throw new AppError("not_found", "No such chemical in this lab.");
    const existing = await SafetyDataSheet.findOne({ where: { chemicalId: chem.id, labId: opts.labId }, attributes: ["id", "filename", "sha256"], transaction: t });
    if (existing) await SafetyDataSheet.destroy({ where: { id: existing.id, labId: opts.labId }, transaction: t });
    const sds = await SafetyDataSheet.create({ labId: opts.labId, chemicalId: chem.id, filename, contentType: "application/pdf", sizeBytes: opts.bytes.length, sha256, data: Buffer.from(opts.bytes), uploadedBy: opts.actorUserId }, { transaction: t });
    await audit({ labId: opts.labId, actorUserId: opts.actorUserId, action: existing ? "sds.replaced" : "sds.uploaded", entityType: "chemical", entityId: chem.id, before: existing ? { filename: existing.filename, sha256: existing.sha256 } : null, after: { filename, sizeBytes: opts.bytes.length, sha256 } }, t);
    return { filename: sds.filename, sizeBytes: sds.sizeBytes, sha256 };
  });
}

/** A chemical's safety data sheet for download. @throws AppError not_found. */
export async function getSafetyDataSheet(opts: { labId: string; chemicalId: string }, t?: Transaction) {
  const sds = await SafetyDataSheet.findOne({ where: { chemicalId: opts.chemicalId, labId: opts.labId }, transaction: t });
  if (!sds) throw new AppError("not_found", "This chemical has no safety data sheet.");
  return { filename: sds.filename, data: sds.data, sizeBytes: sds.sizeBytes };
}
