/**
 * The audit log's readable changes, pure: from an entry's `before` and `after` records,
 * the fields that changed, each with a label and both values formatted for people
 * (amounts in units, yes/no, dates, lists). Bookkeeping fields (ids, timestamps, versions,
 * hashes) are left out.
 */
import { formatAmount, type Dimension } from "@/inventory/units";
import { ROLE_LABELS, ROLES, type Role } from "@/lib/auth/roles";

export interface FieldChange {
  field: string;
  label: string;
  /** The value before, formatted; null when the field was not set. */
  before: string | null;
  /** The value after, formatted; null when the field is no longer set. */
  after: string | null;
}

/** Never shown: identity and bookkeeping, secrets' hashes, file bytes. */
const HIDDEN = new Set(["id", "labId", "createdAt", "updatedAt", "version", "secretHash", "tokenHash", "passwordHash", "data"]);

const LABELS: Record<string, string> = {
  cas: "CAS number",
  ghsStatements: "GHS statements",
  molarMass: "molar mass",
  density: "density",
  peroxideClass: "peroxide-former class",
  lowStockBase: "low-stock mark",
  amountBase: "amount",
  consumedBase: "consumed",
  containerAmountBase: "left in the container",
  purityPercent: "purity",
  sizeBytes: "size",
  sha256: "SHA-256",
  planRef: "plan",
  chemicalId: "chemical",
  containerId: "container",
  locationId: "location",
  containerIds: "containers",
  userId: "person",
  expiresAt: "expires",
  revokedAt: "revoked",
  selector: "token begins",
  // Lab settings (lib/lab-settings/schemas.ts), as the settings page words them.
  minC: "lowest temperature",
  maxC: "highest temperature",
  ratedBar: "pressure rating",
  totalVolumeMl: "total volume",
  workingMinMl: "working volume from",
  workingMaxMl: "working volume to",
  maxFillFraction: "maximum fill",
  confirmWithSupplier: "not yet confirmed with the supplier",
  minPipetteVolumeUl: "smallest volume pipetted",
  minWeighMassMg: "smallest mass weighed",
  overagePercent: "overage",
  deadVolumeUl: "dead volume per stock",
  maxStockVolumeMl: "largest stock",
  stockFillFraction: "stock share of a vial's solvent",
  signOffTemperatureC: "sign-off needed from",
  pyrophoricSecondPersonVolumeMl: "second person above",
  autoignitionMarginC: "autoignition margin",
  peroxideTestIntervalMonths: "peroxide test interval",
};

/** Units written after a field's number (PRODUCT.md "Look": units always next to numbers). */
const UNITS: Record<string, string> = {
  molarMass: "g/mol",
  density: "g/mL",
  purityPercent: "%",
  sizeBytes: "bytes",
  minC: "°C",
  maxC: "°C",
  ratedBar: "bar",
  totalVolumeMl: "mL",
  workingMinMl: "mL",
  workingMaxMl: "mL",
  minPipetteVolumeUl: "µL",
  minWeighMassMg: "mg",
  overagePercent: "%",
  deadVolumeUl: "µL",
  maxStockVolumeMl: "mL",
  signOffTemperatureC: "°C",
  pyrophoricSecondPersonVolumeMl: "mL",
  autoignitionMarginC: "K",
};
/** Decimal fields whose unit is given by another field (shown as numbers, trailing zeros dropped). */
const DECIMALS = new Set(["concentration"]);

/** "molarMass" → "molar mass"; known fields have their own label. */
export function fieldLabel(field: string): string {
  return LABELS[field] ?? field.replace(/Base$/, "").replace(/([a-z0-9])([A-Z])/g, "$1 $2").replace(/_/g, " ").toLowerCase();
}

type Record_ = Record<string, unknown>;

/** Fields that only say how to read another (the dimension of a `…Base` amount). */
function isHelperField(field: string, record: Record_ | null): boolean {
  return field.endsWith("Dimension") || (field === "dimension" && !!record && Object.keys(record).some((k) => k.endsWith("Base")));
}
const isRecord = (v: unknown): v is Record_ => typeof v === "object" && v !== null && !Array.isArray(v);
const MAX_LIST = 8;

/** One value for people; null for "not set" (null, undefined, empty text). */
export function formatValue(value: unknown, field = "", context: { dimension?: Dimension | null } = {}): string | null {
  if (value === null || value === undefined || value === "") return null;
  if (typeof value === "boolean") return value ? "yes" : "no";
  if (field.endsWith("Base") && (typeof value === "string" || typeof value === "number") && /^-?\d+$/.test(String(value))) {
    return context.dimension ? formatAmount(BigInt(value), context.dimension) : `${value} (base units)`;
  }
  if (Array.isArray(value)) {
    if (value.length === 0) return "none";
    const items = value.slice(0, MAX_LIST).map((v) => formatValue(v) ?? "—");
    return value.length > MAX_LIST ? `${items.join(", ")} … (${value.length - MAX_LIST} more)` : items.join(", ");
  }
  if (isRecord(value)) {
    const parts = Object.entries(value)
      .filter(([k]) => !HIDDEN.has(k) && !isHelperField(k, value))
      .map(([k, v]) => `${fieldLabel(k)}: ${formatValue(v, k, dimensionFor(value, k, context.dimension)) ?? "—"}`);
    return parts.length ? parts.join("; ") : null;
  }
  const text = String(value);
  if (field === "role" && (ROLES as readonly string[]).includes(text)) return ROLE_LABELS[text as Role];
  const dateTime = /^(\d{4}-\d{2}-\d{2})T(\d{2}:\d{2})(:\d{2}(\.\d+)?)?(Z|[+-]00:00)$/.exec(text);
  if (dateTime) return `${dateTime[1]} ${dateTime[2]} UTC`;
  const unit = UNITS[field];
  if (unit && /^-?\d+(\.\d+)?$/.test(text)) return `${trimZeros(text)} ${unit}`;
  return DECIMALS.has(field) && /^-?\d+(\.\d+)?$/.test(text) ? trimZeros(text) : text;
}

/** "199.0900" → "199.09" (database decimals carry their scale). */
function trimZeros(text: string): string {
  return text.includes(".") ? text.replace(/0+$/, "").replace(/\.$/, "") : text;
}

/** The dimension (mass or volume) that a `…Base` amount of `record` is measured in. */
function dimensionFor(record: Record_ | null, field: string, fallback?: Dimension | null): { dimension?: Dimension | null } {
  const own = record?.[`${field.replace(/Base$/, "")}Dimension`] ?? record?.dimension;
  return { dimension: own === "mass" || own === "volume" ? own : (fallback ?? null) };
}

function same(a: unknown, b: unknown): boolean {
  const norm = (v: unknown) => (v === undefined || v === "" ? null : v);
  return JSON.stringify(norm(a)) === JSON.stringify(norm(b));
}

/** Nested records are compared field by field to this depth; deeper, a record is shown whole. */
const MAX_DEPTH = 6;

/** Both sides records, or both lists of the same length holding records: compared inside. */
function comparableInside(b: unknown, a: unknown): boolean {
  if (isRecord(b) && isRecord(a)) return true;
  return Array.isArray(b) && Array.isArray(a) && b.length === a.length && [...b, ...a].some(isRecord);
}

/**
 * The fields that differ between `before` and `after` (either may be null: a record made or
 * removed), in the order the record lists them. For a record made or removed, only the
 * fields that were set are listed. A field holding a record (or a list of records) on both
 * sides is compared inside, so a change deep in a plan document or a settings section reads
 * as its own line ("value › types 1 › source: … → …", lists counted from 1), not as the
 * whole record twice. `context.dimension` formats amounts the entry does not say the
 * dimension of.
 */
export function auditChanges(before: unknown, after: unknown, context: { dimension?: Dimension | null } = {}): FieldChange[] {
  const b = isRecord(before) ? before : before === null || before === undefined ? null : { value: before };
  const a = isRecord(after) ? after : after === null || after === undefined ? null : { value: after };
  return changesOf(b, a, context, "", "", 0);
}

function changesOf(b: Record_ | null, a: Record_ | null, context: { dimension?: Dimension | null }, fieldPrefix: string, labelPrefix: string, depth: number): FieldChange[] {
  const fields = [...new Set([...Object.keys(a ?? {}), ...Object.keys(b ?? {})])].filter((k) => !HIDDEN.has(k) && !isHelperField(k, a) && !isHelperField(k, b));
  const oneSided = !a || !b;
  const changes: FieldChange[] = [];
  for (const field of fields) {
    const bv = b?.[field];
    const av = a?.[field];
    if (same(bv, av)) continue;
    const path = `${fieldPrefix}${field}`;
    const label = `${labelPrefix}${fieldLabel(field)}`;
    if (!oneSided && depth < MAX_DEPTH && comparableInside(bv, av)) {
      if (isRecord(bv) && isRecord(av)) changes.push(...changesOf(bv, av, context, `${path}.`, `${label} › `, depth + 1));
      else {
        const bl = bv as unknown[];
        const al = av as unknown[];
        bl.forEach((item, i) => {
          const other = al[i];
          if (same(item, other)) return;
          if (isRecord(item) && isRecord(other)) changes.push(...changesOf(item, other, context, `${path}.${i}.`, `${label} ${i + 1} › `, depth + 1));
          else changes.push({ field: `${path}.${i}`, label: `${label} ${i + 1}`, before: formatValue(item), after: formatValue(other) });
        });
      }
      continue;
    }
    const bs = b ? formatValue(bv, field, dimensionFor(b, field, context.dimension)) : null;
    const as = a ? formatValue(av, field, dimensionFor(a, field, context.dimension)) : null;
    // The same value written differently (the database's "0.8890" and the form's "0.889") is no change.
    if (b && a && bs === as) continue;
    // A record made or removed: leave out what was not set (empty lists, "no" flags).
    if (oneSided) {
      const shown = bs ?? as;
      if (shown === null || shown === "none" || shown === "no") continue;
    }
    changes.push({ field: path, label, before: bs, after: as });
  }
  return changes;
}
