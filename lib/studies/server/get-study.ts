import "server-only";
import type { Transaction } from "sequelize";
import { Plan } from "@/lib/server/models";
import { planAuthor, planStudy, planSummary } from "@/lib/plans/server/common";
import type { PlanSummary } from "@/lib/plans/schemas";
import type { StudyRow } from "../schemas";
import { findStudy, studyRow } from "./common";

/** The most plans one study page lists; `GET /plans?study=` pages through more. */
export const STUDY_PLAN_LIMIT = 500;

/**
 * One study of the lab with its plans, newest change first (CONTRACT.md
 * `GET /studies/{study}` → `{ study, plans }`).
 * @throws AppError not_found (another lab's study, or none).
 */
export async function getStudy(opts: { labId: string; studyId: string }, t?: Transaction): Promise<{ study: StudyRow; plans: PlanSummary[] }> {
  const study = await findStudy(opts, t);
  const { rows, count } = await Plan.findAndCountAll({
    where: { labId: opts.labId, studyId: study.id },
    attributes: { exclude: ["document"] },
    include: [planAuthor, planStudy],
    order: [["updatedAt", "DESC"], ["id", "ASC"]],
    limit: STUDY_PLAN_LIMIT,
    distinct: true,
    transaction: t,
  });
  return { study: studyRow(study, count), plans: rows.map(planSummary) };
}
