/**
 * A plan's timeline, pure: every state change, signature, edit and reservation of one
 * plan, read from its audit entries and made readable — who, when, what happened and what
 * changed. Edits show the document's changes against the version before them
 * (lib/plans/diff.ts: each created/updated entry records the whole document); other
 * entries show their fields as the audit log does (lib/audit/changes.ts).
 */
import { auditChanges, type FieldChange } from "../audit/changes";
import type { Dimension } from "@/inventory/units";
import { diffDocuments } from "./diff";
import { PLAN_STATE_LABELS, PLAN_STATES, type PlanState } from "./states";

/** An audit entry as the timeline reads it. */
export interface TimelineEntry {
  id: string;
  action: string;
  entityType: string;
  entityId: string | null;
  actorUserId: string | null;
  actorTokenId: string | null;
  before: unknown;
  after: unknown;
  createdAt: Date | string;
}

export type TimelineKind = "created" | "edited" | "state" | "signature" | "reservation";

export interface TimelineItem {
  id: string;
  at: string;
  kind: TimelineKind;
  /** Who: the person's name (and the API token, when one made the change). */
  actor: string;
  title: string;
  changes: FieldChange[];
}

const isRecord = (v: unknown): v is Record<string, unknown> => typeof v === "object" && v !== null && !Array.isArray(v);
const stateLabel = (v: unknown) => (typeof v === "string" && (PLAN_STATES as readonly string[]).includes(v) ? PLAN_STATE_LABELS[v as PlanState] : null);
const text = (v: unknown) => (typeof v === "string" && v !== "" ? v : null);

const RESULTS: Record<string, true> = { "plan.results_entered": true, "plan.results_corrected": true };
const SIGNED: Record<string, true> = { "plan.approved": true, "plan.changes_requested": true, "plan.rejected": true };
const TITLES: Record<string, string> = {
  "plan.created": "Created the plan",
  "plan.updated": "Edited the plan",
  "plan.submitted": "Submitted for review",
  "plan.approved": "Signed: approved for execution as planned",
  "plan.changes_requested": "Signed: changes requested",
  "plan.rejected": "Signed: rejected",
  "plan.released": "Released",
  "plan.started": "Marked running",
  "plan.results_entered": "Entered results",
  "plan.results_corrected": "Corrected results",
  "plan.closed": "Closed",
  "plan.cancelled": "Cancelled",
  "reservation.created": "Reserved stock",
  "reservation.released": "Released a reservation",
  "reservation.consumed": "Consumed a reservation",
};

function stateChange(before: unknown, after: unknown): FieldChange[] {
  const b = isRecord(before) ? stateLabel(before.state) : null;
  const a = isRecord(after) ? stateLabel(after.state) : null;
  return a && b !== a ? [{ field: "state", label: "state", before: b, after: a }] : [];
}

/**
 * The timeline of one plan from its audit entries (any order; sorted oldest first here).
 * `names` gives people's names by user id, `tokens` API tokens' names by id, and
 * `reservations` each reservation's barcode and measure (for amounts in units).
 */
export function buildTimeline(
  entries: readonly TimelineEntry[],
  context: { names: ReadonlyMap<string, string>; tokens?: ReadonlyMap<string, string>; reservations?: ReadonlyMap<string, { barcode: string; dimension: Dimension }> },
): TimelineItem[] {
  const sorted = [...entries].sort((x, y) => new Date(x.createdAt).getTime() - new Date(y.createdAt).getTime() || Number(x.id) - Number(y.id));
  let lastDocument: unknown = null;
  const items: TimelineItem[] = [];
  for (const e of sorted) {
    const person = (e.actorUserId && context.names.get(e.actorUserId)) || "Someone";
    const token = e.actorTokenId ? context.tokens?.get(e.actorTokenId) : undefined;
    const actor = token ? `${person} (API token "${token}")` : person;
    const at = new Date(e.createdAt).toISOString();
    const after = isRecord(e.after) ? e.after : {};
    const base = { id: e.id, at, actor };
    if (e.entityType === "reservation") {
      const r = e.entityId ? context.reservations?.get(e.entityId) : undefined;
      const dimension = (after.dimension === "mass" || after.dimension === "volume" ? after.dimension : r?.dimension) ?? null;
      const barcode = text(after.barcode) ?? r?.barcode ?? "a container";
      const changes = auditChanges(e.action === "reservation.created" ? null : e.before, { ...after, barcode: undefined, planRef: undefined, containerId: undefined }, { dimension });
      items.push({ ...base, kind: "reservation", title: `${TITLES[e.action] ?? e.action}: ${barcode}`, changes });
      continue;
    }
    if (e.action === "plan.created") {
      lastDocument = after.document ?? null;
      items.push({ ...base, kind: "created", title: TITLES[e.action]!, changes: auditChanges(null, { name: after.name, state: stateLabel(after.state), derivation: after.derivation ?? null }) });
      continue;
    }
    if (e.action === "plan.updated") {
      const changes: FieldChange[] = [...stateChange(e.before, after)];
      if (after.document !== undefined) {
        changes.push(...diffDocuments(lastDocument, after.document).map(({ field, label, before, after: now }) => ({ field, label, before, after: now })));
        lastDocument = after.document;
      }
      if (after.signatureVoided === true) changes.push({ field: "signature", label: "signature", before: "valid", after: "voided by this edit" });
      items.push({ ...base, kind: "edited", title: TITLES[e.action]!, changes });
      continue;
    }
    const changes = stateChange(e.before, after);
    if (SIGNED[e.action]) {
      if (text(after.comment)) changes.push({ field: "comment", label: "comment", before: null, after: text(after.comment) });
      if (text(after.signedContentHash)) changes.push({ field: "signedContentHash", label: "signed content SHA-256", before: null, after: text(after.signedContentHash) });
      items.push({ ...base, kind: "signature", title: TITLES[e.action]!, changes });
      continue;
    }
    if (typeof after.reservations === "number") changes.push({ field: "reservations", label: "reservations made", before: null, after: String(after.reservations) });
    if (typeof after.reservationsReleased === "number" && after.reservationsReleased > 0) changes.push({ field: "reservationsReleased", label: "reservations released", before: null, after: String(after.reservationsReleased) });
    if (RESULTS[e.action]) {
      // Results entry (lib/results/server/put-results.ts) records each cell as `run N response`.
      const cells = Object.keys(after).filter((k) => k.startsWith("run ")).length;
      if (cells > 0) changes.push({ field: "results", label: "result cells changed", before: null, after: String(cells) });
      if (typeof after.reservationsConsumed === "number" && after.reservationsConsumed > 0) changes.push({ field: "reservationsConsumed", label: "reservations consumed", before: null, after: String(after.reservationsConsumed) });
    }
    items.push({ ...base, kind: "state", title: TITLES[e.action] ?? e.action, changes });
  }
  return items;
}
