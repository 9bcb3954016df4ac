import "server-only";
import type { Transaction } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import { audit } from "@/lib/server/audit";
import { inTransaction } from "@/lib/server/db";
import { Plan, User } from "@/lib/server/models";
import { studyUpdateSchema, type StudyRow } from "../schemas";
import { assertVersion } from "@/inventory/server/common";
import { findStudy, studyAudit, studyRow } from "./common";

/**
 * Changes a study's name, goal, target product or responses (only the fields sent), with
 * the version check, audited before → after.
 * @throws AppError invalid_input, not_found, conflict (stale `version`).
 */
export async function updateStudy(opts: { labId: string; actorUserId: string; studyId: string; input: unknown }, t?: Transaction): Promise<StudyRow> {
  const v = parseOrThrow(studyUpdateSchema, opts.input, "The study is not valid.");
  return inTransaction(t, async (tx) => {
    const study = await findStudy({ labId: opts.labId, studyId: opts.studyId, lock: true }, tx);
    assertVersion("study", study.version, v.version);
    const before = studyAudit(study);
    if (v.name !== undefined) study.name = v.name;
    if (v.goal !== undefined) study.goal = v.goal;
    if (v.targetProduct !== undefined) study.targetProduct = v.targetProduct;
    if (v.responses !== undefined) study.responses = v.responses;
    study.version = study.version + 1;
    await study.save({ transaction: tx });
    await audit({ labId: opts.labId, actorUserId: opts.actorUserId, action: "study.updated", entityType: "study", entityId: study.id, before, after: studyAudit(study) }, tx);
    study.author = (await User.findByPk(study.authorId, { attributes: ["id", "name"], transaction: tx })) ?? undefined;
    return studyRow(study, await Plan.count({ where: { labId: opts.labId, studyId: study.id }, transaction: tx }));
  });
}
