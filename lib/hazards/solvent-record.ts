/**
 * The shape of one solvent's data. Every value carries its source and a tag saying how
 * far it was checked (the tags below; docs/sources.md), so a page can show where a number
 * comes from. Tareline ships a set of records (`solvent-data.ts`); a lab adds its own
 * with the same schema (tag "lab", with the lab's own citation).
 */
import { z } from "zod";
import { ghsStatementSchema, peroxideClassSchema } from "./hazard-flags";

/**
 * How far a value was checked: V checked against the primary source; V* only through a
 * third-party copy; C computed from a stated method; M from memory, not re-checked;
 * CP common practice, no source; S secondary source, not verified; lab entered by a lab.
 */
export const sourceTagSchema = z.enum(["V", "V*", "C", "M", "CP", "S", "lab"]);
export type SourceTag = z.output<typeof sourceTagSchema>;

const citation = {
  source: z.string().min(1).max(500),
  tag: sourceTagSchema,
};

/** A number with its origin. */
export const sourcedNumberSchema = z.object({ value: z.number(), ...citation });

function sourced(value: z.ZodNumber) {
  return z.object({ value, ...citation });
}
export type SourcedNumber = z.output<typeof sourcedNumberSchema>;


/** DIPPR equation 101: ln(P/Pa) = C1 + C2/T + C3·ln T + C4·T^C5, T in K, valid tminK–tmaxK. */
export const dippr101Schema = z
  .object({
    c1: z.number(),
    c2: z.number(),
    c3: z.number(),
    c4: z.number(),
    c5: z.number(),
    tminK: z.number().positive(),
    tmaxK: z.number().positive(),
    ...citation,
  })
  .refine((d) => d.tminK < d.tmaxK, { message: "tminK must be below tmaxK", path: ["tminK"] });
export type Dippr101 = z.output<typeof dippr101Schema>;

/** Antoine equation, NIST form: log10(P/bar) = A − B/(T/K + C); range may be unknown (null). */
export const antoineSchema = z
  .object({
    a: z.number(),
    b: z.number(),
    c: z.number(),
    tminK: z.number().positive().nullable(),
    tmaxK: z.number().positive().nullable(),
    ...citation,
  })
  .refine((d) => d.tminK === null || d.tmaxK === null || d.tminK < d.tmaxK, {
    message: "tminK must be below tmaxK",
    path: ["tminK"],
  });
export type Antoine = z.output<typeof antoineSchema>;

export const solventRecordSchema = z.object({
  /** Stable identifier, lower case, e.g. "tetrahydrofuran". */
  id: z.string().min(1).max(80),
  name: z.string().min(1).max(200),
  /** Other names and abbreviations it is looked up by (THF, MeCN, …). */
  synonyms: z.array(z.string().min(1).max(100)).max(50).default([]),
  /** CAS registry number, e.g. "109-99-9". */
  cas: z
    .string()
    .regex(/^\d{2,7}-\d{2}-\d$/, "CAS number must look like 109-99-9")
    .nullable()
    .default(null),
  formula: z.string().max(100).nullable().default(null),
  molarMassGPerMol: sourced(z.number().positive("molar mass must be positive")),
  /** Liquid density near 20 °C (g/mL). */
  densityGPerMl: sourced(z.number().positive("density must be positive")),
  /** Mean cubic expansion coefficient of the liquid (1/K) between room and reaction temperature. */
  thermalExpansionPerK: sourced(z.number().min(0).lt(0.01, "expansion must be below 0.01 1/K")),
  normalBoilingPointC: sourced(z.number().gt(-273.15).max(1000)),
  /** Closed-cup flash point (°C); null when the liquid has none (not flammable). */
  flashPointC: sourcedNumberSchema.nullable().default(null),
  autoignitionC: sourcedNumberSchema.nullable().default(null),
  /** Critical temperature (K): above it no vapour pressure exists. */
  criticalTemperatureK: sourced(z.number().positive()).nullable().default(null),
  peroxideClass: z
    .object({ value: peroxideClassSchema, ...citation })
    .nullable()
    .default(null),
  /** GHS hazard statements of the neat solvent, e.g. ["H225", "EUH019"]. */
  ghs: z
    .object({ value: z.array(ghsStatementSchema), ...citation })
    .default({ value: [], source: "none given", tag: "lab" }),
  /** Water itself or an aqueous solution. */
  aqueous: z.boolean().default(false),
  /** Has O–H or N–H bonds that react with water-reactive reagents (water, alcohols, amines). */
  protic: z.boolean().default(false),
  /** Vapour-pressure correlations, in order of preference. */
  dippr101: dippr101Schema.nullable().default(null),
  antoine: antoineSchema.nullable().default(null),
  /** Use the IAPWS-IF97 region-4 saturation line (water only). */
  iapwsIf97: z.boolean().default(false),
});

export type SolventRecord = z.output<typeof solventRecordSchema>;
export type SolventRecordInput = z.input<typeof solventRecordSchema>;
