import "server-only";
import { z } from "zod";
import type { IncludeOptions, Transaction } from "sequelize";
import { AppError } from "@/lib/errors/app-error";
import { Study, User } from "@/lib/server/models";
import type { StudyRow } from "../schemas";

const uuid = z.uuid();

/**
 * A record id from a request path: an id that cannot exist is simply not found (404,
 * naming the path segment), never a database error.
 */
export function pathId(id: string, path: string, what: string): string {
  if (!uuid.safeParse(id).success) throw new AppError("not_found", `No such ${what} in this lab.`, [{ path, message: `no ${what} has this id` }]);
  return id;
}

/** A study as the API shows it. */
export function studyRow(s: Study, planCount: number): StudyRow {
  return {
    id: s.id,
    name: s.name,
    goal: s.goal,
    targetProduct: s.targetProduct,
    responses: s.responses,
    authorId: s.authorId,
    authorName: s.author?.name ?? "",
    version: s.version,
    archivedAt: s.archivedAt ? s.archivedAt.toISOString() : null,
    createdAt: s.createdAt.toISOString(),
    updatedAt: s.updatedAt.toISOString(),
    planCount,
  };
}

export const studyAuthor = { model: User, as: "author", attributes: ["id", "name"], required: false } satisfies IncludeOptions;

/**
 * The lab's study `studyId`, locked for update when `lock` is set.
 * @throws AppError not_found for another lab's study, or none.
 */
export async function findStudy(opts: { labId: string; studyId: string; lock?: boolean }, t?: Transaction): Promise<Study> {
  const study = await Study.findOne({
    where: { id: pathId(opts.studyId, "studyId", "study"), labId: opts.labId },
    include: opts.lock ? [] : [studyAuthor],
    transaction: t,
    lock: opts.lock && t ? t.LOCK.UPDATE : undefined,
  });
  if (!study) throw new AppError("not_found", "No such study in this lab.", [{ path: "studyId", message: "no study has this id" }]);
  return study;
}

/** The fields of a study the audit log records. */
export function studyAudit(s: Study): Record<string, unknown> {
  return { name: s.name, goal: s.goal, targetProduct: s.targetProduct, responses: s.responses, version: s.version, archivedAt: s.archivedAt };
}
