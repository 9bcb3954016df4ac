import "server-only";
import type { Transaction } from "sequelize";
import { AuditEntry, User } from "@/lib/server/models";

export interface AuditRow {
  id: string;
  at: string;
  actor: string | null;
  action: string;
  entityType: string;
  entityId: string | null;
  before: unknown;
  after: unknown;
}

/** The newest audit entries of one lab. */
export async function listAudit({ labId, limit = 100 }: { labId: string; limit?: number }, t?: Transaction): Promise<AuditRow[]> {
  const rows = await AuditEntry.findAll({ where: { labId }, order: [["id", "DESC"]], limit, transaction: t });
  const actorIds = [...new Set(rows.map((r) => r.actorUserId).filter((x): x is string => !!x))];
  const actors = new Map((await User.findAll({ where: { id: actorIds }, transaction: t })).map((u) => [u.id, u.name]));
  return rows.map((r) => ({
    id: String(r.id),
    at: r.createdAt.toISOString(),
    actor: r.actorUserId ? (actors.get(r.actorUserId) ?? r.actorUserId) : null,
    action: r.action,
    entityType: r.entityType,
    entityId: r.entityId,
    before: r.before,
    after: r.after,
  }));
}
