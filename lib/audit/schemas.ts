/** The audit log's query (server-side filters and paging) and the rows it returns. */
import { z } from "zod";
import { text } from "@/lib/schemas/text";
import type { FieldChange } from "./changes";

export const AUDIT_PAGE_SIZES = [25, 50, 100] as const;

/** `actor` is "user:<id>" (what a person did in person) or "token:<id>" (what an API token did). */
export const auditQuerySchema = z.object({
  entity: text(60)
    .regex(/^[a-z_]*$/, "an entity type such as chemical or container")
    .nullish()
    .transform((v) => (v ? v : null)),
  actor: z
    .string()
    .regex(/^((user|token):[0-9a-f]{8}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{4}-[0-9a-f]{12})?$/i, "user:<id> or token:<id>")
    .nullish()
    .transform((v) => (v ? v.toLowerCase() : null)),
  page: z.coerce.number().int().min(1).max(100_000).optional().default(1),
  pageSize: z.coerce.number().int().min(1).max(100).optional().default(25),
});
export type AuditQuery = z.output<typeof auditQuerySchema>;

export type AuditActor =
  | { kind: "user"; id: string; name: string }
  | { kind: "token"; id: string; name: string; /** the person the token acts for */ onBehalfOf: string | null }
  | { kind: "system" };

export interface AuditRow {
  id: string;
  at: string;
  actor: AuditActor;
  action: string;
  entityType: string;
  entityId: string | null;
  /** A name for the record (its name, barcode, e-mail…) when the entry carries one. */
  entityName: string | null;
  changes: FieldChange[];
}

export interface AuditPage {
  entries: AuditRow[];
  total: number;
  page: number;
  pageSize: number;
}

/** What the filters offer: the lab's entity types and everyone (and every token) in the log. */
export interface AuditFilterOptions {
  entityTypes: Array<{ value: string; label: string }>;
  actors: Array<{ value: string; label: string }>;
}

const ENTITY_LABELS: Record<string, string> = { api_token: "API token", sds: "Safety data sheet" };

/** "api_token" → "API token", "chemical" → "Chemical". */
export function entityLabel(entityType: string): string {
  const s = ENTITY_LABELS[entityType] ?? entityType.replace(/_/g, " ");
  return s.charAt(0).toUpperCase() + s.slice(1);
}

/** "membership.role_changed" → "role changed" (the verb part, for people). */
export function actionLabel(action: string): string {
  const verb = action.includes(".") ? action.slice(action.indexOf(".") + 1) : action;
  return verb.replace(/_/g, " ");
}
