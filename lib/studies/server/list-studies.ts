import "server-only";
import { Op, fn, col, literal, type Order, type WhereOptions } from "sequelize";
import type { Transaction } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import { Study } from "@/lib/server/models";
import { studyQuerySchema, type StudyPage, type StudyQuery } from "../schemas";
import { studyAuthor, studyRow } from "./common";

/** The number of plans of each study, counted in the same query ("Study" is the model name set in models/study.ts, stable in minified builds). */
const PLAN_COUNT = literal(`(SELECT count(*)::int FROM plans p WHERE p.lab_id = "Study"."lab_id" AND p.study_id = "Study"."id")`);

/**
 * One page of the lab's studies (CONTRACT.md `GET /studies`), filtered by name (`q`, case
 * insensitive, anywhere in the name), sorted and paged in the database.
 * @throws AppError invalid_input for a bad query (e.g. `sort`).
 */
export async function listStudies(opts: { labId: string; query: unknown }, t?: Transaction): Promise<StudyPage & { query: StudyQuery }> {
  const query = parseOrThrow(studyQuerySchema, opts.query, "The study list query is not valid.");
  const and: WhereOptions[] = [{ labId: opts.labId }];
  if (query.archived === "exclude") and.push({ archivedAt: null });
  if (query.archived === "only") and.push({ archivedAt: { [Op.ne]: null } });
  if (query.q) and.push({ name: { [Op.iLike]: `%${query.q.replace(/[\\%_]/g, (m) => `\\${m}`)}%` } });
  const dir = query.dir === "desc" ? "DESC" : "ASC";
  const orders: Record<StudyQuery["sort"], Order> = {
    name: [[fn("lower", col("Study.name")), dir], ["id", "ASC"]],
    updatedAt: [["updatedAt", dir], ["id", "ASC"]],
    createdAt: [["createdAt", dir], ["id", "ASC"]],
  };
  const { rows, count } = await Study.findAndCountAll({
    where: { [Op.and]: and },
    attributes: { include: [[PLAN_COUNT, "planCount"]] },
    include: [studyAuthor],
    order: orders[query.sort],
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize,
    distinct: true,
    transaction: t,
  });
  return {
    studies: rows.map((s) => studyRow(s, Number(s.get("planCount") ?? 0))),
    total: count,
    page: query.page,
    pageSize: query.pageSize,
    query,
  };
}
