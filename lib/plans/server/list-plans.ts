import "server-only";
import { Op, col, fn, type Order, type Transaction, type WhereOptions } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import { Plan } from "@/lib/server/models";
import { planQuerySchema, type PlanPage, type PlanQuery } from "../schemas";
import { planAuthor, planStudy, planSummary } from "./common";

/**
 * One page of the lab's plans (`GET /plans?state=&author=&study=&q=&sort=&dir=&page=`),
 * filtered by state (one or several), author ("me" is `actorUserId`), study and name,
 * sorted and paged in the database.
 * @throws AppError invalid_input naming the bad query field.
 */
export async function listPlans(opts: { labId: string; actorUserId?: string; query: unknown }, t?: Transaction): Promise<PlanPage & { query: PlanQuery }> {
  const query = parseOrThrow(planQuerySchema, opts.query, "The plan list query is not valid.");
  const and: WhereOptions[] = [{ labId: opts.labId }];
  if (query.state.length) and.push({ state: { [Op.in]: query.state } });
  if (query.author) and.push({ authorId: query.author === "me" ? (opts.actorUserId ?? null) : query.author });
  if (query.study) and.push({ studyId: query.study });
  if (query.q) and.push({ name: { [Op.iLike]: `%${query.q.replace(/[\\%_]/g, (m) => `\\${m}`)}%` } });
  const dir = query.dir === "desc" ? "DESC" : "ASC";
  const orders: Record<PlanQuery["sort"], Order> = {
    updatedAt: [["updatedAt", dir], ["id", "ASC"]],
    createdAt: [["createdAt", dir], ["id", "ASC"]],
    name: [[fn("lower", col("Plan.name")), dir], ["id", "ASC"]],
    state: [["state", dir], ["updatedAt", "DESC"], ["id", "ASC"]],
  };
  const { rows, count } = await Plan.findAndCountAll({
    where: { [Op.and]: and },
    attributes: { exclude: ["document"] },
    include: [planAuthor, planStudy],
    order: orders[query.sort],
    limit: query.pageSize,
    offset: (query.page - 1) * query.pageSize,
    distinct: true,
    transaction: t,
  });
  return { plans: rows.map(planSummary), total: count, page: query.page, pageSize: query.pageSize, query };
}
