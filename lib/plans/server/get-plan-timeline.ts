import "server-only";
import { Op, type Transaction } from "sequelize";
import { ApiToken, AuditEntry, Container, Reservation, User } from "@/lib/server/models";
import { buildTimeline, type TimelineItem } from "../timeline";
import { findPlan } from "./common";

/**
 * The plan's timeline (`GET /plans/{plan}/timeline`): every state change, signature, edit
 * and reservation of the plan from the audit log, readable (lib/plans/timeline.ts).
 * Lab-scoped in every query.
 * @throws AppError not_found.
 */
export async function getPlanTimeline(opts: { labId: string; planId: string }, t?: Transaction): Promise<TimelineItem[]> {
  const plan = await findPlan(opts, t);
  const reservations = await Reservation.findAll({
    where: { labId: opts.labId, planId: plan.id },
    attributes: ["id"],
    include: [{ model: Container, as: "container", required: true, where: { labId: opts.labId }, attributes: ["barcode", "dimension"] }],
    transaction: t,
  });
  const entries = await AuditEntry.findAll({
    where: {
      labId: opts.labId,
      [Op.or]: [
        { entityType: "plan", entityId: plan.id },
        ...(reservations.length ? [{ entityType: "reservation", entityId: { [Op.in]: reservations.map((r) => r.id) } }] : []),
      ],
    },
    order: [["createdAt", "ASC"], ["id", "ASC"]],
    transaction: t,
  });
  const userIds = [...new Set(entries.map((e) => e.actorUserId).filter((id): id is string => !!id))];
  const tokenIds = [...new Set(entries.map((e) => e.actorTokenId).filter((id): id is string => !!id))];
  const users = userIds.length ? await User.findAll({ where: { id: { [Op.in]: userIds } }, attributes: ["id", "name"], transaction: t }) : [];
  const tokens = tokenIds.length ? await ApiToken.findAll({ where: { id: { [Op.in]: tokenIds }, labId: opts.labId }, attributes: ["id", "name"], transaction: t }) : [];
  return buildTimeline(
    entries.map((e) => ({ id: String(e.id), action: e.action, entityType: e.entityType, entityId: e.entityId, actorUserId: e.actorUserId, actorTokenId: e.actorTokenId, before: e.before, after: e.after, createdAt: e.createdAt })),
    {
      names: new Map(users.map((u) => [u.id, u.name])),
      tokens: new Map(tokens.map((k) => [k.id, k.name])),
      reservations: new Map(reservations.map((r) => [r.id, { barcode: r.container!.barcode, dimension: r.container!.dimension }])),
    },
  );
}
