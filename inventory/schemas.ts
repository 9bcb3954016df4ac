/**
 * The inventory's shared zod schemas: one per entity, with create/update/query variants
 * derived from it. Route handlers parse with these; client forms use the same ones
 * through zodResolver. Amounts travel as decimal strings with a unit ("12.5", "mg") and
 * are converted to exact base units (µg, nL) on the server.
 */
import { z } from "zod";
import { casProblem } from "@/inventory/cas";
import { parseDecimal } from "@/inventory/decimal";
import { unitInfo } from "@/inventory/units";
import { requirementQuantity } from "@/inventory/conversion";

const trimmed = (max: number) => z.string().trim().max(max, `at most ${max} characters`);
const optionalText = (max: number) =>
  z
    .string()
    .trim()
    .max(max, `at most ${max} characters`)
    .optional()
    .nullable()
    .transform((v) => (v ? v : null));

const isDecimal = (v: string) => {
  try {
    parseDecimal(v);
    return true;
  } catch {
    return false;
  }
};

/** A positive decimal written as text (or a number), kept as its exact text. */
export const positiveDecimal = z
  .union([z.string(), z.number()])
  .transform((v) => String(v).trim())
  .refine((v) => v !== "" && isDecimal(v), "enter a number, e.g. 12.5")
  .refine((v) => !isDecimal(v) || parseDecimal(v).n > 0n, "must be greater than zero");

const optionalPositiveDecimal = z
  .union([z.string(), z.number(), z.null()])
  .optional()
  .transform((v) => (v === null || v === undefined ? "" : String(v).trim()))
  .refine((v) => v === "" || isDecimal(v), "enter a number, e.g. 12.5")
  .refine((v) => v === "" || !isDecimal(v) || parseDecimal(v).n > 0n, "must be greater than zero")
  .transform((v) => (v === "" ? null : v));

/** A non-negative decimal amount (text) — the amount in a container may be zero. */
const nonNegativeDecimal = z
  .union([z.string(), z.number()])
  .transform((v) => String(v).trim())
  .refine((v) => v !== "" && isDecimal(v), "enter a number, e.g. 12.5")
  .refine((v) => !isDecimal(v) || parseDecimal(v).n >= 0n, "must not be negative");

export const stockUnitSchema = z.string().refine((u) => unitInfo(u) !== null, "use µg, mg, g, kg, µL, mL or L");
/** Requirement units: amount of substance, mass or volume. */
export const requirementUnitSchema = z.string().refine((u) => requirementQuantity(1, u) !== null, "use mmol, µmol, mol, a mass (mg, g) or a volume (µL, mL)");

const isoDate = z
  .string()
  .regex(/^\d{4}-\d{2}-\d{2}$/, "use YYYY-MM-DD")
  .refine((s) => !Number.isNaN(Date.parse(`${s}T00:00:00Z`)) && new Date(`${s}T00:00:00Z`).toISOString().startsWith(s), "not a real date");
const optionalDate = z
  .union([isoDate, z.literal(""), z.null()])
  .optional()
  .transform((v) => (v ? v : null));

export const casSchema = z
  .string()
  .trim()
  .superRefine((v, ctx) => {
    const p = casProblem(v);
    if (p) ctx.addIssue({ code: "custom", message: p });
  });

export const PHYSICAL_STATES = ["solid", "liquid", "gas", "solution"] as const;
export const PEROXIDE_CLASSES = ["A", "B", "C", "D"] as const;
export const GHS_CODE = /^(H\d{3}[A-Za-z]*|EUH\d{3}[A-Za-z]*|P\d{3}(\+P\d{3})*)$/;

/** A chemical as a form or the API sends it. */
export const chemicalInputSchema = z.object({
  name: trimmed(200).min(1, "name is required"),
  synonyms: z.array(trimmed(200).min(1)).max(50).default([]),
  cas: z
    .union([casSchema, z.literal(""), z.null()])
    .optional()
    .transform((v) => (v ? v : null)),
  formula: optionalText(100),
  molarMass: optionalPositiveDecimal,
  density: optionalPositiveDecimal,
  physicalState: z.enum(PHYSICAL_STATES, { message: "choose solid, liquid, gas or solution" }).default("solid"),
  ghsStatements: z.array(z.string().trim().toUpperCase().regex(GHS_CODE, "a GHS code such as H225, EUH019 or P210")).max(80).default([]),
  pyrophoric: z.boolean().default(false),
  waterReactive: z.boolean().default(false),
  peroxideClass: z
    .union([z.enum(PEROXIDE_CLASSES), z.literal(""), z.null()])
    .optional()
    .transform((v) => (v ? v : null)),
  storageNotes: optionalText(2000),
  lowStock: z
    .object({ amount: nonNegativeDecimal, unit: stockUnitSchema })
    .nullable()
    .optional()
    .transform((v) => v ?? null),
});
export type ChemicalInput = z.input<typeof chemicalInputSchema>;
export type ChemicalValues = z.output<typeof chemicalInputSchema>;
export const chemicalUpdateSchema = chemicalInputSchema.partial();

export const CONTAINER_STATUSES = ["available", "quarantined", "empty", "disposed"] as const;

/** A new container (received into stock). */
export const containerInputSchema = z
  .object({
    chemicalId: z.uuid("choose a chemical"),
    barcode: trimmed(64).min(1, "barcode is required"),
    lot: optionalText(64),
    locationId: z
      .union([z.uuid(), z.literal(""), z.null()])
      .optional()
      .transform((v) => (v ? v : null)),
    amount: nonNegativeDecimal,
    unit: stockUnitSchema,
    concentration: optionalPositiveDecimal,
    concentrationUnit: z
      .union([z.enum(["M", "mg/mL"]), z.literal(""), z.null()])
      .optional()
      .transform((v) => (v ? v : null)),
    solvent: optionalText(120),
    purityPercent: optionalPositiveDecimal.refine((v) => v === null || parseDecimal(v).n <= parseDecimal(v).d * 100n, "at most 100 %"),
    receivedOn: optionalDate,
    openedOn: optionalDate,
    expiresOn: optionalDate,
  })
  .superRefine((c, ctx) => {
    if (c.concentration && !c.concentrationUnit) ctx.addIssue({ code: "custom", path: ["concentrationUnit"], message: "give the concentration's unit" });
    if (c.concentration && unitInfo(c.unit)?.dimension !== "volume") ctx.addIssue({ code: "custom", path: ["unit"], message: "a solution's amount must be a volume" });
  });
export type ContainerInput = z.input<typeof containerInputSchema>;

/** Changes to a container that are not stock movements. */
export const containerUpdateSchema = z.object({
  lot: optionalText(64),
  locationId: z
    .union([z.uuid(), z.literal(""), z.null()])
    .optional()
    .transform((v) => (v ? v : null)),
  openedOn: optionalDate,
  expiresOn: optionalDate,
  peroxideTestedOn: optionalDate,
  status: z.enum(CONTAINER_STATUSES).optional(),
}).partial();

/** A counted correction of the amount in a container (a stock-take), with its reason. */
export const adjustAmountSchema = z.object({
  amount: nonNegativeDecimal,
  unit: stockUnitSchema,
  reason: trimmed(500).min(3, "say why (at least 3 characters)"),
});
export type AdjustAmountInput = z.input<typeof adjustAmountSchema>;

export const locationInputSchema = z.object({ name: trimmed(120).min(1, "name is required"), notes: optionalText(1000) });
export type LocationInput = z.input<typeof locationInputSchema>;

/** A reference to a plan: its id (a UUID) or another stable text key. */
export const planRefSchema = trimmed(100).min(1, "plan reference is required");

export const reserveInputSchema = z.object({
  planRef: planRefSchema,
  note: optionalText(500),
  lines: z
    .array(z.object({ containerId: z.uuid(), amount: positiveDecimal, unit: stockUnitSchema }))
    .min(1, "reserve at least one amount")
    .max(200),
});
export type ReserveInput = z.input<typeof reserveInputSchema>;

export const consumeInputSchema = z.object({ amount: nonNegativeDecimal, unit: stockUnitSchema, note: optionalText(500) });
export type ConsumeInput = z.input<typeof consumeInputSchema>;
export const releaseInputSchema = z.object({ reason: trimmed(500).min(3, "say why (at least 3 characters)") });

export const requirementSchema = z.object({ chemicalId: z.uuid("choose a chemical"), amount: positiveDecimal, unit: requirementUnitSchema, label: optionalText(200) });
export const availabilityInputSchema = z.object({ requirements: z.array(requirementSchema).min(1, "add at least one requirement").max(500) });
export type AvailabilityInput = z.input<typeof availabilityInputSchema>;

export const CONTAINER_SORTS = ["name", "barcode", "amount", "expiresOn", "location", "receivedOn"] as const;
/** The containers list's query (server-side filter, sort and paging). */
export const containerQuerySchema = z.object({
  q: z.string().trim().max(200).optional().default(""),
  chemicalId: z.uuid().optional(),
  locationId: z.uuid().optional(),
  status: z.enum([...CONTAINER_STATUSES, "all"]).optional().default("all"),
  sort: z.enum(CONTAINER_SORTS).optional().default("name"),
  dir: z.enum(["asc", "desc"]).optional().default("asc"),
  page: z.coerce.number().int().min(1).optional().default(1),
  pageSize: z.coerce.number().int().min(1).max(200).optional().default(25),
});
export type ContainerQuery = z.output<typeof containerQuerySchema>;

export const importRequestSchema = z.object({
  csv: z.string().min(1, "choose a CSV file").max(5_000_000, "the file is larger than 5 MB"),
  mapping: z.record(z.string(), z.string()).optional(),
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
    ghs: z
      .string()
      .transform((s) => s.split(/[\s,;]+/).filter(Boolean).map((c) => c.toUpperCase()))
      .superRefine((codes, ctx) => {
        const bad = codes.filter((c) => !GHS_CODE.test(c));
        if (bad.length) ctx.addIssue({ code: "custom", message: `not GHS codes: ${bad.join(", ")} (use e.g. H225 EUH019 P210)` });
      }),
    lowAmount: z
      .string()
      .trim()
      .refine((v) => v === "" || (isDecimal(v) && parseDecimal(v).n >= 0n), "enter a number, e.g. 50"),
    lowUnit: stockUnitSchema,
  });
export type ChemicalFormInput = z.input<typeof chemicalFormSchema>;

export function chemicalFromForm(v: z.output<typeof chemicalFormSchema>): ChemicalInput {
  const { ghs, lowAmount, lowUnit, ...rest } = v;
  return { ...rest, ghsStatements: ghs, lowStock: lowAmount ? { amount: lowAmount, unit: lowUnit } : null };
}
