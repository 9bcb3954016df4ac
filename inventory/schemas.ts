/**
 * The inventory's shared zod schemas: one per entity, with create/update/query variants
 * derived from it. Route handlers parse with these; client forms use the same ones
 * through zodResolver. Amounts travel as decimal strings with a unit ("12.5", "mg") and
 * are converted to exact base units (µg, nL) on the server.
 */
import { z } from "zod";
import { optionalText, safeString, text, uuid } from "@/lib/schemas/text";
import { casProblem } from "@/inventory/cas";
import { parseDecimal, toDecimalString, type Rational } from "@/inventory/decimal";
import { formatAmount, toBase, unitInfo } from "@/inventory/units";
import { requirementQuantity } from "@/inventory/conversion";
import { CSV_FIELDS } from "@/inventory/csv-fields";
import { GHS_STATEMENT_PATTERN, PEROXIDE_CLASSES, ghsStatementsSchema } from "@/lib/hazards/hazard-flags";
import { isoDateSchema } from "@/lib/hazards/iso-date";

/** Text fields: trimmed, bounded and storable (lib/schemas/text.ts refuses NUL and lone surrogates). */
const trimmed = (max: number) => text(max);

/** The largest amount one container, reservation or mark may hold, in base units (µg or nL). */
export const MAX_STOCK_BASE = 10n ** 15n; // 10^15 µg = 1000 t, 10^15 nL = 1000 m³: far below BIGINT's 9.2·10^18, so sums stay in range

/**
 * How a decimal written as text may look before any exact (BigInt) arithmetic is done on
 * it: at most 40 characters, digits with one optional point, and an exponent of at most
 * three digits (so "1e10000000" is refused at once instead of building a ten-million-digit
 * number). No digit separators ("1_000"), no hexadecimal, no "Infinity".
 */
const DECIMAL_TEXT = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d{1,3})?$/;
const MAX_DECIMAL_LENGTH = 40;

interface DecimalRule {
  /** "positive": > 0; "nonNegative": ≥ 0. */
  sign: "positive" | "nonNegative";
  /** Exclusive upper bound (the column's range), e.g. 10n ** 8n for NUMERIC(12,4). */
  below: bigint;
  /** Digits kept after the decimal point (the column's scale); more is refused, not rounded. Omit for amounts (rounded up to base units). */
  scale?: number;
  /** Optional inclusive upper bound with its message (purity ≤ 100 %). */
  atMost?: { value: bigint; message: string };
}

/** Checks a decimal's text against `rule`; returns the exact value or the problem. */
function checkDecimal(v: string, rule: DecimalRule): { value: Rational } | { problem: string } {
  if (v.length > MAX_DECIMAL_LENGTH) return { problem: `at most ${MAX_DECIMAL_LENGTH} characters` };
  if (!DECIMAL_TEXT.test(v)) return { problem: "enter a number, e.g. 12.5" };
  const x = parseDecimal(v);
  if (rule.sign === "positive" ? x.n <= 0n : x.n < 0n) return { problem: rule.sign === "positive" ? "must be greater than zero" : "must not be negative" };
  if (x.n >= rule.below * x.d) return { problem: `must be less than ${rule.below.toLocaleString("en-US")}` };
  if (rule.atMost && x.n > rule.atMost.value * x.d) return { problem: rule.atMost.message };
  if (rule.scale !== undefined && (x.n * 10n ** BigInt(rule.scale)) % x.d !== 0n) return { problem: `at most ${rule.scale} digit${rule.scale === 1 ? "" : "s"} after the decimal point` };
  return { value: x };
}

/**
 * A decimal field written as text (or a JSON number), checked by `rule` and returned as
 * its canonical exact text ("1e3" → "1000", "+2.50" → "2.5").
 */
function decimalField(rule: DecimalRule) {
  return z
    .union([z.string(), z.number()], { message: "enter a number, e.g. 12.5" })
    .transform((v, ctx) => {
      const r = checkDecimal(String(v).trim(), rule);
      if ("problem" in r) {
        ctx.addIssue({ code: "custom", message: r.problem });
        return z.NEVER;
      }
      return canonical(r.value, rule, String(v).trim());
    });
}

/** Exact canonical text for a column with a scale; an amount (no scale) keeps its text, rounded up to base units later. */
function canonical(x: Rational, rule: DecimalRule, typed: string): string {
  return rule.scale === undefined ? typed : toDecimalString(x, rule.scale);
}

/** The same, optional: "", null and a missing field become null. */
function optionalDecimalField(rule: DecimalRule) {
  return z
    .union([z.string(), z.number(), z.null()], { message: "enter a number, e.g. 12.5" })
    .optional()
    .transform((v, ctx) => {
      const s = v === null || v === undefined ? "" : String(v).trim();
      if (s === "") return null;
      const r = checkDecimal(s, rule);
      if ("problem" in r) {
        ctx.addIssue({ code: "custom", message: r.problem });
        return z.NEVER;
      }
      return canonical(r.value, rule, s);
    });
}

/** An amount of stock as typed (any unit); its size in base units is checked with the unit (`stockAmountIssue`). */
const AMOUNT_RULE = { below: 10n ** 15n } as const;
/** A positive decimal written as text (or a number), kept as its exact text. */
export const positiveDecimal = decimalField({ sign: "positive", ...AMOUNT_RULE });
/** A non-negative decimal amount (text) — the amount in a container may be zero. */
const nonNegativeDecimal = decimalField({ sign: "nonNegative", ...AMOUNT_RULE });

/** The columns' ranges: molar_mass NUMERIC(12,4), density NUMERIC(10,4), purity_percent NUMERIC(6,3), concentration NUMERIC(14,6). */
export const molarMassSchema = optionalDecimalField({ sign: "positive", below: 10n ** 8n, scale: 4 });
export const densitySchema = optionalDecimalField({ sign: "positive", below: 10n ** 6n, scale: 4 });
export const puritySchema = optionalDecimalField({ sign: "positive", below: 1000n, scale: 3, atMost: { value: 100n, message: "at most 100 %" } });
export const concentrationSchema = optionalDecimalField({ sign: "positive", below: 10n ** 8n, scale: 6 });

export const stockUnitSchema = safeString(20).refine((u) => unitInfo(u) !== null, { error: (issue) => `unknown unit "${String(issue.input)}" (use µg, mg, g, kg, µL, mL or L)` });
/** Requirement units: amount of substance, mass or volume. */
export const requirementUnitSchema = safeString(20).refine((u) => requirementQuantity(1, u) !== null, "use mmol, µmol, mol, a mass (mg, g) or a volume (µL, mL)");

/**
 * Adds an issue at `path` when `amount` in `unit` is more than one container may hold
 * (MAX_STOCK_BASE base units). Skipped when either is already invalid.
 */
function stockAmountIssue(amount: string | undefined, unit: string | undefined, ctx: z.RefinementCtx, path: PropertyKey[]) {
  if (amount === undefined || unit === undefined || !unitInfo(unit)) return;
  if (toBase(amount, unit).base > MAX_STOCK_BASE) {
    ctx.addIssue({ code: "custom", path, message: `too large: at most ${formatAmount(MAX_STOCK_BASE, unitInfo(unit)!.dimension)}` });
  }
}

/**
 * A calendar date written YYYY-MM-DD: a real day (no 2027-02-30) of a year from 1900 to
 * 2200 — Tareline's one date schema (lib/hazards/iso-date.ts), shared with the plan
 * document and the hazard engine. The inventory's forms, API and CSV import use it.
 */
export { isoDateSchema };
const isoDate = isoDateSchema;
const optionalDate = z
  .union([isoDate, z.literal(""), z.null()])
  .optional()
  .transform((v) => (v ? v : null));

export const casSchema = text(20).superRefine((v, ctx) => {
  const p = casProblem(v);
  if (p) ctx.addIssue({ code: "custom", message: p });
});

export const PHYSICAL_STATES = ["solid", "liquid", "gas", "solution"] as const;
export { PEROXIDE_CLASSES };
export const GHS_CODE = GHS_STATEMENT_PATTERN;

/** An optional reference to another record of the lab: a UUID, or "" / null for none. */
const optionalId = z
  .union([uuid(), z.literal(""), z.null()], { message: "must be an id (a UUID)" })
  .optional()
  .transform((v) => (v ? v : null));

/** The version of a record as the client read it (optimistic locking): a stale one is a conflict naming `version`. */
export const versionSchema = z.number({ message: "send the version you read (a whole number)" }).int("a whole number").min(0).max(2_147_483_647);

/** A low-stock mark: an amount of a stock unit, bounded like any amount. */
const lowStockSchema = z
  .object({ amount: nonNegativeDecimal, unit: stockUnitSchema })
  .superRefine((v, ctx) => stockAmountIssue(v.amount, v.unit, ctx, ["amount"]));

/**
 * The fields of a chemical, without defaults: the create schema adds the defaults, the
 * update schema makes every field optional, so a PATCH changes only the fields it sends.
 */
const chemicalFields = {
  name: trimmed(200).min(1, "name is required"),
  synonyms: z.array(trimmed(200).min(1, "a synonym cannot be empty"), { message: "a list of names" }).max(50, "at most 50 synonyms"),
  cas: z
    .union([casSchema, z.literal(""), z.null()])
    .optional()
    .transform((v) => (v ? v : null)),
  formula: optionalText(100),
  molarMass: molarMassSchema,
  density: densitySchema,
  physicalState: z.enum(PHYSICAL_STATES, { message: "choose solid, liquid, gas or solution" }),
  ghsStatements: ghsStatementsSchema,
  pyrophoric: z.boolean({ message: "true or false" }),
  waterReactive: z.boolean({ message: "true or false" }),
  peroxideClass: z
    .union([z.enum(PEROXIDE_CLASSES), z.literal(""), z.null()], { message: "choose peroxide class A, B, C or D" })
    .optional()
    .transform((v) => (v ? v : null)),
  storageNotes: optionalText(2000),
  lowStock: lowStockSchema
    .nullable()
    .optional()
    .transform((v) => v ?? null),
};

/** A chemical as a form or the API sends it. */
export const chemicalInputSchema = z.object({
  ...chemicalFields,
  synonyms: chemicalFields.synonyms.default([]),
  physicalState: chemicalFields.physicalState.default("solid"),
  ghsStatements: chemicalFields.ghsStatements.default([]),
  pyrophoric: chemicalFields.pyrophoric.default(false),
  waterReactive: chemicalFields.waterReactive.default(false),
});
export type ChemicalInput = z.input<typeof chemicalInputSchema>;
export type ChemicalValues = z.output<typeof chemicalInputSchema>;
/** A change to a chemical: any subset of its fields (only those sent change) and the version it was read at. */
export const chemicalUpdateSchema = z.object(chemicalFields).partial().extend({ version: versionSchema });

export const CONTAINER_STATUSES = ["available", "quarantined", "empty", "disposed"] as const;

/** The fields of a new container; the CSV import checks its rows with the same ones. */
export const containerFields = {
  chemicalId: uuid("choose a chemical"),
  barcode: trimmed(64).min(1, "barcode is required"),
  lot: optionalText(64),
  locationId: optionalId,
  amount: nonNegativeDecimal,
  unit: stockUnitSchema,
  concentration: concentrationSchema,
  concentrationUnit: z
    .union([z.enum(["M", "mg/mL"]), z.literal(""), z.null()], { message: "use M or mg/mL" })
    .optional()
    .transform((v) => (v ? v : null)),
  solvent: optionalText(120),
  purityPercent: puritySchema,
  receivedOn: optionalDate,
  openedOn: optionalDate,
  expiresOn: optionalDate,
};

/**
 * The rules across a container's fields: a solution has a concentration unit and a volume
 * as its amount; the amount fits in stock. `paths` names the fields where the input calls
 * them otherwise (the CSV's columns).
 */
export function containerRules(
  c: { amount?: string; unit?: string; concentration?: string | null; concentrationUnit?: string | null },
  ctx: z.RefinementCtx,
  paths: { amount: string; unit: string; concentrationUnit: string } = { amount: "amount", unit: "unit", concentrationUnit: "concentrationUnit" },
) {
  if (c.concentration && !c.concentrationUnit) ctx.addIssue({ code: "custom", path: [paths.concentrationUnit], message: "give the concentration's unit (M or mg/mL)" });
  if (c.concentration && c.unit !== undefined && unitInfo(c.unit)?.dimension !== "volume") ctx.addIssue({ code: "custom", path: [paths.unit], message: "a solution's amount must be a volume" });
  stockAmountIssue(c.amount, c.unit, ctx, [paths.amount]);
}

/** A new container (received into stock). */
export const containerInputSchema = z.object(containerFields).superRefine(containerRules);
export type ContainerInput = z.input<typeof containerInputSchema>;

/** Changes to a container that are not stock movements (only the fields sent change), with the version it was read at. */
export const containerUpdateSchema = z
  .object({
    lot: optionalText(64),
    locationId: optionalId,
    openedOn: optionalDate,
    expiresOn: optionalDate,
    peroxideTestedOn: optionalDate,
    status: z.enum(CONTAINER_STATUSES, { message: "choose available, quarantined, empty or disposed" }),
  })
  .partial()
  .extend({ version: versionSchema });

/** A counted correction of the amount in a container (a stock-take), with its reason. */
export const adjustAmountSchema = z
  .object({
    amount: nonNegativeDecimal,
    unit: stockUnitSchema,
    reason: trimmed(500).min(3, "say why (at least 3 characters)"),
    /** Optional: the version the count was made against (a stale one is refused). */
    version: versionSchema.optional(),
  })
  .superRefine((v, ctx) => stockAmountIssue(v.amount, v.unit, ctx, ["amount"]));
export type AdjustAmountInput = z.input<typeof adjustAmountSchema>;

export const locationInputSchema = z.object({ name: trimmed(120).min(1, "name is required"), notes: optionalText(1000) });
export type LocationInput = z.input<typeof locationInputSchema>;

/** A reference to a plan: its id (a UUID) or another stable text key. */
export const planRefSchema = trimmed(100).min(1, "plan reference is required");

const reserveLineSchema = z
  .object({ containerId: uuid(), amount: positiveDecimal, unit: stockUnitSchema })
  .superRefine((v, ctx) => stockAmountIssue(v.amount, v.unit, ctx, ["amount"]));

export const reserveInputSchema = z.object({
  planRef: planRefSchema,
  note: optionalText(500),
  lines: z.array(reserveLineSchema, { message: "a list of lines" }).min(1, "reserve at least one amount").max(200, "at most 200 lines"),
});
export type ReserveInput = z.input<typeof reserveInputSchema>;

export const consumeInputSchema = z
  .object({ amount: nonNegativeDecimal, unit: stockUnitSchema, note: optionalText(500) })
  .superRefine((v, ctx) => stockAmountIssue(v.amount, v.unit, ctx, ["amount"]));
export type ConsumeInput = z.input<typeof consumeInputSchema>;
export const releaseInputSchema = z.object({ reason: trimmed(500).min(3, "say why (at least 3 characters)") });

export const requirementSchema = z.object({ chemicalId: uuid("choose a chemical"), amount: positiveDecimal, unit: requirementUnitSchema, label: optionalText(200) });
export const availabilityInputSchema = z.object({ requirements: z.array(requirementSchema, { message: "a list of requirements" }).min(1, "add at least one requirement").max(500, "at most 500 requirements") });
export type AvailabilityInput = z.input<typeof availabilityInputSchema>;

export const CONTAINER_SORTS = ["name", "barcode", "amount", "expiresOn", "location", "receivedOn"] as const;
/** The containers list's query (server-side filter, sort and paging). */
export const containerQuerySchema = z.object({
  q: text(200).optional().default(""),
  chemicalId: uuid().optional(),
  locationId: uuid().optional(),
  status: z.enum([...CONTAINER_STATUSES, "all"]).optional().default("all"),
  sort: z.enum(CONTAINER_SORTS).optional().default("name"),
  dir: z.enum(["asc", "desc"]).optional().default("asc"),
  page: z.coerce.number().int().min(1).max(1_000_000).optional().default(1),
  pageSize: z.coerce.number().int().min(1).max(200).optional().default(25),
});
export type ContainerQuery = z.output<typeof containerQuerySchema>;

/** The reservations list's query. */
export const reservationQuerySchema = z.object({
  status: z.enum(["held", "consumed", "released", "all"]).default("held"),
  planRef: planRefSchema.optional(),
});

/**
 * One row of a container CSV, keyed by the CSV's field names, checked with exactly the
 * fields and rules of a chemical, a location and a new container (the preview and the
 * import both run it, so a row the preview accepts is one the import can write).
 */
export const csvRowSchema = z
  .object({
    name: optionalText(200),
    cas: casSchema,
    barcode: containerFields.barcode,
    amount: containerFields.amount,
    unit: containerFields.unit,
    location: locationInputSchema.shape.name.optional().transform((v) => v ?? null),
    lot: containerFields.lot,
    purity: containerFields.purityPercent,
    concentration: containerFields.concentration,
    concentration_unit: containerFields.concentrationUnit,
    solvent: containerFields.solvent,
    received: containerFields.receivedOn,
    opened: containerFields.openedOn,
    expiry: containerFields.expiresOn,
    status: z.enum(["available", "quarantined"], { error: (issue) => `status must be available or quarantined, not "${String(issue.input)}"` }).default("available"),
    formula: chemicalFields.formula,
    molar_mass: chemicalFields.molarMass,
    density: chemicalFields.density,
  })
  .superRefine((r, ctx) => containerRules({ ...r, concentrationUnit: r.concentration_unit }, ctx, { amount: "amount", unit: "unit", concentrationUnit: "concentration_unit" }));
export type CsvRowValues = z.output<typeof csvRowSchema>;

/** The largest container CSV accepted, in characters. */
export const MAX_IMPORT_CHARS = 5_000_000;
/** The import routes' body cap: a 5-million-character CSV as a JSON string (escapes included), with room to spare. */
export const IMPORT_BODY_LIMIT = 12_000_000;
export const importRequestSchema = z.object({
  csv: safeString(MAX_IMPORT_CHARS).min(1, "choose a CSV file"),
  mapping: z.partialRecord(z.enum(CSV_FIELDS), z.union([text(200), z.null()])).optional(),
});

/** What the API returns for one amount: exact base units (as a string), and for display. */
export interface AmountView {
  base: string;
  dimension: "mass" | "volume";
  /** e.g. "12.5 mg" */
  display: string;
}

export interface ChemicalRow {
  id: string;
  /** Send it back with an edit (optimistic locking). */
  version: number;
  name: string;
  synonyms: string[];
  cas: string | null;
  formula: string | null;
  molarMass: string | null;
  density: string | null;
  physicalState: (typeof PHYSICAL_STATES)[number];
  ghsStatements: string[];
  pyrophoric: boolean;
  waterReactive: boolean;
  peroxideClass: (typeof PEROXIDE_CLASSES)[number] | null;
  storageNotes: string | null;
  lowStock: AmountView | null;
  onHand: AmountView[];
  containerCount: number;
  sds: { filename: string; sizeBytes: number; uploadedAt: string } | null;
}

export interface ContainerRow {
  id: string;
  /** Send it back with an edit (optimistic locking). */
  version: number;
  barcode: string;
  chemicalId: string;
  chemicalName: string;
  cas: string | null;
  lot: string | null;
  locationId: string | null;
  location: string | null;
  amount: AmountView;
  held: AmountView;
  available: AmountView;
  displayUnit: string;
  concentration: string | null;
  concentrationUnit: string | null;
  solvent: string | null;
  purityPercent: string | null;
  receivedOn: string | null;
  openedOn: string | null;
  expiresOn: string | null;
  peroxideTestedOn: string | null;
  status: (typeof CONTAINER_STATUSES)[number];
  flags: { pyrophoric: boolean; waterReactive: boolean; peroxideClass: string | null; peroxideTestDue: string | null };
}

export interface LedgerRow {
  id: string;
  kind: string;
  delta: AmountView;
  heldDelta: AmountView;
  balance: AmountView;
  reason: string;
  reservationId: string | null;
  actor: string | null;
  at: string;
}

export interface ReservationRow {
  id: string;
  planRef: string;
  containerId: string;
  barcode: string;
  chemicalName: string;
  amount: AmountView;
  consumed: AmountView | null;
  status: "held" | "consumed" | "released";
  note: string | null;
  reservedBy: string;
  reservedAt: string;
  closedAt: string | null;
}

/**
 * The chemical form's fields, derived from the chemical schema: GHS statements typed as
 * one line of text, and the low-stock mark as an amount and a unit. `chemicalFromForm`
 * turns the parsed form into the API's input.
 */
export const chemicalFormSchema = chemicalInputSchema
  .omit({ ghsStatements: true, lowStock: true, synonyms: true })
  .extend({
    ghs: text(4000)
      .transform((s) => s.split(/[\s,;]+/).filter(Boolean).map((c) => c.toUpperCase()))
      .superRefine((codes, ctx) => {
        const bad = codes.filter((c) => !GHS_CODE.test(c));
        if (bad.length) ctx.addIssue({ code: "custom", message: `not GHS codes: ${bad.join(", ")} (use e.g. H225 EUH019 P210)` });
      }),
    lowAmount: text(MAX_DECIMAL_LENGTH).superRefine((v, ctx) => {
      const r = v === "" ? null : checkDecimal(v, { sign: "nonNegative", ...AMOUNT_RULE });
      if (r && "problem" in r) ctx.addIssue({ code: "custom", message: r.problem });
    }),
    lowUnit: stockUnitSchema,
  });
export type ChemicalFormInput = z.input<typeof chemicalFormSchema>;

export function chemicalFromForm(v: z.output<typeof chemicalFormSchema>): ChemicalInput {
  const { ghs, lowAmount, lowUnit, ...rest } = v;
  return { ...rest, ghsStatements: ghs, lowStock: lowAmount ? { amount: lowAmount, unit: lowUnit } : null };
}
