/**
 * A lab's settings: one schema composed from the engines' own schemas, in four sections
 * that the settings page edits one at a time —
 *
 * - `vessels`: the lab's vessel types (lib/hazards/vessels.ts `vesselTypeSchema`: total
 *   volume, working range, maximum fill, pressure rating, sealed or vented, and `source`,
 *   where the rating comes from) and the one plans get by default;
 * - `blocks`: heating and cooling blocks (positions 24 | 48 | 96, temperature range) and
 *   the default one;
 * - `dispensing`: liquid-handling and weighing limits (lib/chemistry `dispensingSchema`);
 * - `thresholds`: the hazard thresholds (lib/hazards/thresholds.ts `labThresholdsSchema`).
 *
 * Every section has defaults, so a lab that saved nothing has a complete, usable set.
 * Who may edit each section is data too (`SETTINGS_SECTION_PERMISSION`).
 */
// First: chooses zod's interpreter before any engine schema below is built (lib/schemas/text.ts).
import "../schemas/text";
import { z } from "zod";
import type { Permission } from "../auth/permissions";
import { dispensingSchema } from "../chemistry/plan-document";
import { BLOCK_POSITIONS, blockSchema, labThresholdsSchema } from "../hazards/thresholds";
import { DEFAULT_VESSELS, vesselTypeSchema } from "../hazards/vessels";

export { BLOCK_POSITIONS };

/** A heating or cooling block of the lab: the plan document's `block` plus its temperature range. */
export const labBlockSchema = blockSchema
  .extend({
    /** Heats (an aluminium block on a hotplate) or cools (a cooling block or bath). */
    mode: z.enum(["heating", "cooling"], { message: "choose heating or cooling" }),
    /** Lowest temperature the block holds (°C). */
    minC: z.number().min(-273.15).max(1000),
    /** Highest temperature the block holds (°C). */
    maxC: z.number().min(-273.15).max(1000),
    /** Where the range comes from (the maker's data sheet, the lab's own test…). */
    source: z.string().max(500).optional(),
  })
  .superRefine((b, ctx) => {
    if (!(b.minC < b.maxC)) ctx.addIssue({ code: "custom", path: ["maxC"], message: "must be above the lowest temperature" });
  });
export type LabBlock = z.output<typeof labBlockSchema>;

/** A list of typed items with unique ids and a default among them. */
function catalogSchema<T extends z.ZodType<{ id: string }>>(item: T, noun: string) {
  return z
    .object({
      /** The id of the item plans take when they name none. */
      defaultId: z.string().min(1, `choose the default ${noun}`),
      types: z.array(item).min(1, `the lab needs at least one ${noun}`).max(100),
    })
    .superRefine((c, ctx) => {
      const seen = new Map<string, number>();
      c.types.forEach((t, i) => {
        const prior = seen.get(t.id);
        if (prior !== undefined) ctx.addIssue({ code: "custom", path: ["types", i, "id"], message: `the same id as ${noun} ${prior + 1}` });
        else seen.set(t.id, i);
      });
      if (!seen.has(c.defaultId)) ctx.addIssue({ code: "custom", path: ["defaultId"], message: `names no ${noun} of the list` });
    });
}

const BLOCK_SOURCE_HEATING =
  "Tareline default (common practice, not a maker's data): aluminium heating blocks are used to 150 °C routinely; block formats 24 × 4–8 mL, 48 × 2 mL, 96 × 1 mL vials. Lowest: room temperature. Confirm with the maker.";

/**
 * Default blocks (common practice, not a maker's data; a lab enters its own): an
 * aluminium heating block in each usual format (96 × 1 mL, 48 × 2 mL, 24 × 4–8 mL vials),
 * used to 150 °C routinely, and a 24-position cooling block in a dry ice/acetone bath
 * (−78 °C, the cooling default of lib/hazards/thresholds.ts).
 */
export const DEFAULT_BLOCKS: readonly LabBlock[] = [
  { id: "block-al-24", name: "Aluminium heating block, 24 positions (4 mL and 8 mL vials)", positions: 24, mode: "heating", minC: 20, maxC: 150, source: BLOCK_SOURCE_HEATING },
  { id: "block-al-48", name: "Aluminium heating block, 48 positions (2 mL vials)", positions: 48, mode: "heating", minC: 20, maxC: 150, source: BLOCK_SOURCE_HEATING },
  { id: "block-al-96", name: "Aluminium heating block, 96 positions (1 mL vials)", positions: 96, mode: "heating", minC: 20, maxC: 150, source: BLOCK_SOURCE_HEATING },
  {
    id: "block-cool-24",
    name: "Cooling block, 24 positions, in a dry ice/acetone bath",
    positions: 24,
    mode: "cooling",
    minC: -78,
    maxC: 25,
    source: "Tareline default (common practice): a dry ice/acetone bath holds −78 °C; up to room temperature as it warms. Confirm with the lab's own method.",
  },
];

/** The vessel-types section as a form edits it (no default for the whole section). */
export const vesselCatalogSchema = catalogSchema(vesselTypeSchema, "vessel type");
/** The blocks section as a form edits it. */
export const blockCatalogSchema = catalogSchema(labBlockSchema, "block");

export const vesselSettingsSchema = vesselCatalogSchema.prefault({
  defaultId: "vial-4ml-screw-septum",
  types: DEFAULT_VESSELS.map((v) => ({ ...v })),
});
export const blockSettingsSchema = blockCatalogSchema.prefault({
  defaultId: "block-al-24",
  types: DEFAULT_BLOCKS.map((b) => ({ ...b })),
});

/** Every setting of a lab, each section defaulted on its own. */
export const labSettingsSchema = z.object({
  vessels: vesselSettingsSchema,
  blocks: blockSettingsSchema,
  dispensing: dispensingSchema,
  thresholds: labThresholdsSchema,
});
export type LabSettings = z.output<typeof labSettingsSchema>;
export type LabSettingsInput = z.input<typeof labSettingsSchema>;

export const SETTINGS_SECTIONS = ["vessels", "blocks", "dispensing", "thresholds"] as const;
export type SettingsSection = (typeof SETTINGS_SECTIONS)[number];

/** The schema of each section (what `PUT /settings/{section}` takes as `value`). */
export const SETTINGS_SECTION_SCHEMAS = labSettingsSchema.shape;

/** Each section's schema without its whole-section default: what the settings forms validate with (zodResolver). */
export const SETTINGS_FORM_SCHEMAS = {
  vessels: vesselCatalogSchema,
  blocks: blockCatalogSchema,
  dispensing: dispensingSchema.unwrap(),
  thresholds: labThresholdsSchema.unwrap(),
} as const;

/** Who may edit each section: lab admins the equipment and limits, safety officers the thresholds. */
export const SETTINGS_SECTION_PERMISSION: Record<SettingsSection, Permission> = {
  vessels: "settings.equipment",
  blocks: "settings.equipment",
  dispensing: "settings.equipment",
  thresholds: "settings.thresholds",
};

export const SETTINGS_SECTION_LABELS: Record<SettingsSection, string> = {
  vessels: "Vessel types",
  blocks: "Heating and cooling blocks",
  dispensing: "Dispensing limits",
  thresholds: "Hazard thresholds",
};

/** The body of `PUT /settings/{section}`: the section's new value and the settings version it was edited from. */
export function settingsUpdateSchema<S extends SettingsSection>(section: S) {
  return z.object({
    version: z.number({ message: "give the settings version you edited" }).int().min(1),
    value: SETTINGS_SECTION_SCHEMAS[section],
  });
}

/** A lab's settings as the API shows them: every section defaulted, and the version to send back. */
export interface LabSettingsView {
  version: number;
  settings: LabSettings;
}

/** Reads stored settings (any shape: older or partial) into a complete set; a section that no longer validates falls back to its defaults. */
export function readLabSettings(stored: unknown): LabSettings {
  const raw = stored && typeof stored === "object" ? (stored as Record<string, unknown>) : {};
  const out: Record<string, unknown> = {};
  for (const section of SETTINGS_SECTIONS) {
    const parsed = SETTINGS_SECTION_SCHEMAS[section].safeParse(raw[section]);
    out[section] = parsed.success ? parsed.data : SETTINGS_SECTION_SCHEMAS[section].parse(undefined);
  }
  return out as LabSettings;
}
