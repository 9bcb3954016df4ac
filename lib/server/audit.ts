import "server-only";
import type { Transaction } from "sequelize";
import { AuditEntry } from "@/lib/server/models";

export interface AuditInput {
  labId: string | null;
  actorUserId: string | null;
  action: string; // verb-first, e.g. "membership.role_changed"
  entityType: string;
  entityId: string | null;
  before?: unknown;
  after?: unknown;
}

/** Appends one entry to the audit log, in the caller's transaction when given. */
export async function audit(entry: AuditInput, transaction?: Transaction): Promise<void> {
  await AuditEntry.create(
    {
      labId: entry.labId,
      actorUserId: entry.actorUserId,
      action: entry.action,
      entityType: entry.entityType,
      entityId: entry.entityId,
      before: entry.before ?? null,
      after: entry.after ?? null,
    },
    { transaction },
  );
}
