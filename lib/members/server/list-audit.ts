import "server-only";
import { QueryTypes, type Transaction, type WhereOptions } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import { db } from "@/lib/server/db";
import { ApiToken, AuditEntry, Container, User } from "@/lib/server/models";
import { auditChanges } from "@/lib/audit/changes";
import { auditQuerySchema, entityLabel, type AuditActor, type AuditFilterOptions, type AuditPage } from "@/lib/audit/schemas";

/**
 * One page of a lab's audit log, newest first, filtered by entity type and by actor
 * ("user:<id>": what that person did themselves; "token:<id>": what that API token did),
 * each entry with its readable changes. `query` is parsed with auditQuerySchema (422
 * naming the field).
 */
export async function listAudit(opts: { labId: string; query?: unknown }, t?: Transaction): Promise<AuditPage> {
  const q = parseOrThrow(auditQuerySchema, opts.query ?? {});
  const pageSize = q.pageSize;
  const where: WhereOptions<AuditEntry> = { labId: opts.labId };
  if (q.entity) Object.assign(where, { entityType: q.entity });
  if (q.actor?.startsWith("user:")) Object.assign(where, { actorUserId: q.actor.slice(5), actorTokenId: null });
  if (q.actor?.startsWith("token:")) Object.assign(where, { actorTokenId: q.actor.slice(6) });
  const { rows, count } = await AuditEntry.findAndCountAll({ where, order: [["id", "DESC"]], limit: pageSize, offset: (q.page - 1) * pageSize, transaction: t });

  const userIds = [...new Set(rows.map((r) => r.actorUserId).filter((x): x is string => !!x))];
  const tokenIds = [...new Set(rows.map((r) => r.actorTokenId).filter((x): x is string => !!x))];
  const containerIds = [...new Set(rows.filter((r) => r.entityType === "container" && r.entityId).map((r) => r.entityId!))];
  const [users, tokens, containers] = await Promise.all([
    userIds.length ? User.findAll({ where: { id: userIds }, transaction: t }) : [],
    tokenIds.length ? ApiToken.findAll({ where: { id: tokenIds, labId: opts.labId }, transaction: t }) : [],
    containerIds.length ? Container.findAll({ where: { id: containerIds.filter(isUuid), labId: opts.labId }, attributes: ["id", "dimension", "barcode"], transaction: t }) : [],
  ]);
  const userName = new Map(users.map((u) => [u.id, u.name]));
  const tokenName = new Map(tokens.map((k) => [k.id, k.name]));
  const container = new Map(containers.map((c) => [c.id, { dimension: c.dimension, barcode: c.barcode }]));

  return {
    entries: rows.map((r) => {
      const actor: AuditActor = r.actorTokenId
        ? { kind: "token", id: r.actorTokenId, name: tokenName.get(r.actorTokenId) ?? "API token", onBehalfOf: r.actorUserId ? (userName.get(r.actorUserId) ?? null) : null }
        : r.actorUserId
          ? { kind: "user", id: r.actorUserId, name: userName.get(r.actorUserId) ?? r.actorUserId }
          : { kind: "system" };
      const box = r.entityType === "container" && r.entityId ? container.get(r.entityId) : undefined;
      return {
        id: String(r.id),
        at: r.createdAt.toISOString(),
        actor,
        action: r.action,
        entityType: r.entityType,
        entityId: r.entityId,
        entityName: nameOf(r.after) ?? nameOf(r.before) ?? box?.barcode ?? null,
        changes: auditChanges(r.before, r.after, { dimension: box?.dimension ?? null }),
      };
    }),
    total: count,
    page: q.page,
    pageSize,
  };
}

/** The audit log filters' choices: entity types present in the lab's log, and its actors. */
export async function listAuditFilters(opts: { labId: string }, t?: Transaction): Promise<AuditFilterOptions> {
  const types = await db().query<{ entity_type: string }>("SELECT DISTINCT entity_type FROM audit_log WHERE lab_id = :lab ORDER BY entity_type", { replacements: { lab: opts.labId }, type: QueryTypes.SELECT, transaction: t });
  const actors = await db().query<{ actor_user_id: string | null; actor_token_id: string | null }>(
    "SELECT DISTINCT actor_user_id, actor_token_id FROM audit_log WHERE lab_id = :lab AND (actor_user_id IS NOT NULL OR actor_token_id IS NOT NULL)",
    { replacements: { lab: opts.labId }, type: QueryTypes.SELECT, transaction: t },
  );
  const userIds = [...new Set(actors.filter((a) => !a.actor_token_id && a.actor_user_id).map((a) => a.actor_user_id!))];
  const tokenIds = [...new Set(actors.map((a) => a.actor_token_id).filter((x): x is string => !!x))];
  const [users, tokens] = await Promise.all([
    userIds.length ? User.findAll({ where: { id: userIds }, transaction: t }) : [],
    tokenIds.length ? ApiToken.findAll({ where: { id: tokenIds, labId: opts.labId }, transaction: t }) : [],
  ]);
  const byLabel = (a: { label: string }, b: { label: string }) => a.label.localeCompare(b.label);
  return {
    entityTypes: types.map((t) => ({ value: t.entity_type, label: entityLabel(t.entity_type) })),
    actors: [
      ...users.map((u) => ({ value: `user:${u.id}`, label: u.name })).sort(byLabel),
      ...tokens.map((k) => ({ value: `token:${k.id}`, label: `API token “${k.name}”` })).sort(byLabel),
    ],
  };
}

const isUuid = (s: string) => /^[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12}$/i.test(s);

/** A record's name for people: its name, barcode, e-mail or plan reference. */
function nameOf(record: unknown): string | null {
  if (typeof record !== "object" || record === null) return null;
  const r = record as Record<string, unknown>;
  for (const k of ["name", "barcode", "email", "planRef", "filename"]) {
    if (typeof r[k] === "string" && r[k]) return r[k] as string;
  }
  return null;
}
