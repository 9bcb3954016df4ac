import "server-only";
import type { Transaction } from "sequelize";
import { AuditEntry } from "@/lib/server/models";
import { readRequestToken } from "@/lib/api-tokens/server/read-request-token";

export interface AuditInput {
  labId: string | null;
  /** The person acting; for a lab API token, the member who created it. */
  actorUserId: string | null;
  action: string; // verb-first, e.g. "membership.role_changed"
  entityType: string;
  entityId: string | null;
  before?: unknown;
  after?: unknown;
}

/**
 * Appends one entry to the audit log, in the caller's transaction when given. When the
 * request is made with a lab API token of the entry's lab, the token is recorded as the
 * actor too (`actorTokenId`), so the log names the token that made the change.
 */
export async function audit(entry: AuditInput, transaction?: Transaction): Promise<void> {
  const token = entry.labId ? await readRequestToken(transaction) : null;
  await AuditEntry.create(
    {
      labId: entry.labId,
      actorUserId: entry.actorUserId,
      actorTokenId: token && token.labId === entry.labId ? token.id : null,
      action: entry.action,
      entityType: entry.entityType,
      entityId: entry.entityId,
      before: entry.before ?? null,
      after: entry.after ?? null,
    },
    { transaction },
  );
}
