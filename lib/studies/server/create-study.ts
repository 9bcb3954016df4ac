import "server-only";
import type { Transaction } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import { audit } from "@/lib/server/audit";
import { inTransaction } from "@/lib/server/db";
import { Study, User } from "@/lib/server/models";
import { studyCreateSchema, type StudyRow } from "../schemas";
import { studyAudit, studyRow } from "./common";

/**
 * Creates a study in the lab (CONTRACT.md `POST /studies`), audited.
 * @throws AppError invalid_input naming each bad field (`responses.0.target`).
 */
export async function createStudy(opts: { labId: string; actorUserId: string; input: unknown }, t?: Transaction): Promise<StudyRow> {
  const v = parseOrThrow(studyCreateSchema, opts.input, "The study is not valid.");
  return inTransaction(t, async (tx) => {
    const study = await Study.create(
      { labId: opts.labId, name: v.name, goal: v.goal, targetProduct: v.targetProduct, responses: v.responses, authorId: opts.actorUserId, archivedAt: null },
      { transaction: tx },
    );
    await audit({ labId: opts.labId, actorUserId: opts.actorUserId, action: "study.created", entityType: "study", entityId: study.id, after: studyAudit(study) }, tx);
    study.author = (await User.findByPk(opts.actorUserId, { attributes: ["id", "name"], transaction: tx })) ?? undefined;
    return studyRow(study, 0);
  });
}
