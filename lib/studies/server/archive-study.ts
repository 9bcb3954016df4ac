import "server-only";
import type { Transaction } from "sequelize";
import { audit } from "@/lib/server/audit";
import { inTransaction } from "@/lib/server/db";
import { Plan, User } from "@/lib/server/models";
import type { StudyRow } from "../schemas";
import { findStudy, studyAudit, studyRow } from "./common";

/**
 * Archives a study (`archived: true`) or brings it back (`false`): it leaves the default
 * list but keeps its plans and history. Audited; a no-op when already so.
 * @throws AppError not_found.
 */
export async function archiveStudy(opts: { labId: string; actorUserId: string; studyId: string; archived: boolean }, t?: Transaction): Promise<StudyRow> {
  return inTransaction(t, async (tx) => {
    const study = await findStudy({ labId: opts.labId, studyId: opts.studyId, lock: true }, tx);
    if ((study.archivedAt !== null) !== opts.archived) {
      const before = studyAudit(study);
      study.archivedAt = opts.archived ? new Date() : null;
      study.version = study.version + 1;
      await study.save({ transaction: tx });
      await audit({ labId: opts.labId, actorUserId: opts.actorUserId, action: opts.archived ? "study.archived" : "study.restored", entityType: "study", entityId: study.id, before, after: studyAudit(study) }, tx);
    }
    study.author = (await User.findByPk(study.authorId, { attributes: ["id", "name"], transaction: tx })) ?? undefined;
    return studyRow(study, await Plan.count({ where: { labId: opts.labId, studyId: study.id }, transaction: tx }));
  });
}
