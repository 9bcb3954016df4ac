/**
 * GHS hazard statements and the hazard flags they imply: the one mapping every part of
 * Tareline uses (the inventory's chemical records, the plan document, the chemistry
 * engine's dispensing rules and the hazard engine's cautions).
 *
 * Statements (UN GHS, Globally Harmonized System of Classification and Labelling of
 * Chemicals, Rev. 10 (2023), Annex 3, section 1 (hazard statement codes); EU CLP Regulation (EC) No 1272/2008,
 * Annex III for the EUH statements):
 * - pyrophoric: H250 "Catches fire spontaneously if exposed to air";
 * - water-reactive: H260 "In contact with water releases flammable gases which may
 *   ignite spontaneously", H261 "In contact with water releases flammable gas",
 *   EUH014 "Reacts violently with water";
 * - peroxide former: EUH019 "May form explosive peroxides";
 * - carcinogenic, mutagenic, reprotoxic (category 1): H340 "May cause genetic defects",
 *   H350 "May cause cancer", H360 "May damage fertility or the unborn child" (with
 *   their suffixes, e.g. H350i, H360FD). The "suspected" category-2 statements H341,
 *   H351 and H361 are not CMR flags here.
 *
 * A statement implies its flag; a flag set by hand adds a hazard but never removes one
 * that a statement implies.
 */
import { z } from "zod";

/** A hazard (H, EUH) or precautionary (P, P+P) statement code. */
export const GHS_STATEMENT_PATTERN = /^(H\d{3}[A-Za-z]*|EUH\d{3}[A-Za-z]*|P\d{3}(\+P\d{3})*)$/;

/** Trims a statement code and writes its prefix in capitals ("h225" → "H225"; suffixes such as "Fd" keep their case). */
export function normalizeGhsStatement(code: string): string {
  // Fast path (the common case, parsed once per vial and component): already trimmed,
  // prefix in capitals.
  const first = code.charCodeAt(0);
  const last = code.charCodeAt(code.length - 1);
  if (last > 32 && (first === 72 /* H */ || first === 80 /* P */ || (first === 69 /* E */ && code.startsWith("EUH")))) return code;
  return code.trim().replace(/^(euh|h|p)/i, (m) => m.toUpperCase());
}

/** One GHS statement code, e.g. "H225", "EUH019", "H360Fd" or "P210". */
export const ghsStatementSchema = z
  .string()
  .overwrite(normalizeGhsStatement)
  .refine((s) => s.length <= 40 && GHS_STATEMENT_PATTERN.test(s), "must be a GHS statement code such as H225, EUH019 or P210");

/** A list of GHS statement codes. */
export const ghsStatementsSchema = z.array(ghsStatementSchema).max(80);

/**
 * Peroxide-former classes (Prudent Practices in the Laboratory: Handling and Management
 * of Chemical Hazards, updated version, National Research Council, National Academies
 * Press 2011, chapter 4, the classes of peroxide-forming chemicals): A explosive
 * peroxides without concentration, B hazardous on concentration, C peroxide-initiated
 * polymerisation, D may form peroxides.
 */
export const PEROXIDE_CLASSES = ["A", "B", "C", "D"] as const;
export const peroxideClassSchema = z.enum(PEROXIDE_CLASSES);
export type PeroxideClass = z.output<typeof peroxideClassSchema>;
/** A peroxide former whose class is not known (EUH019 stated without a class). */
export type PeroxideFormer = PeroxideClass | "unclassified";

/** The statement stems behind each flag. */
export const GHS_FLAG_STEMS = {
  pyrophoric: ["H250"],
  waterReactive: ["H260", "H261", "EUH014"],
  peroxideFormer: ["EUH019"],
  cmr: ["H340", "H350", "H360"],
} as const;

/** The statements of `ghs` whose stem is one of `stems` (H350i and H360FD match by their stem). */
export function statementsWithStem(ghs: readonly string[], stems: readonly string[]): string[] {
  const out: string[] = [];
  for (const g of ghs) {
    const code = normalizeGhsStatement(g).toUpperCase();
    for (const s of stems) {
      if (code.startsWith(s) && !/\d/.test(code.charAt(s.length))) {
        out.push(normalizeGhsStatement(g));
        break;
      }
    }
  }
  return out;
}

/** The fields that describe a chemical's hazards (plan document, caution input). */
export const hazardFlagFields = {
  /** GHS hazard statement codes, e.g. ["H225", "H250", "H261", "H314"]. */
  ghs: ghsStatementsSchema.default([]),
  /** Catches fire in air (also implied by H250). */
  pyrophoric: z.boolean().optional(),
  /** Reacts with water (also implied by H260, H261, EUH014). */
  waterReactive: z.boolean().optional(),
  /** Peroxide-former class, or null for none (EUH019 without a class: treated as unclassified). */
  peroxideClass: peroxideClassSchema.nullable().optional(),
  /** Has an acidic O–H/N–H proton that destroys organometallics (alcohols, water, acids). */
  protic: z.boolean().optional(),
  /** Is or contains water. */
  aqueous: z.boolean().optional(),
};

/** Hazard flags as stated, before the statements are applied. */
export const hazardFlagsSchema = z.strictObject(hazardFlagFields);
export type HazardFlagsInput = z.input<typeof hazardFlagsSchema>;

/** What a chemical's statements and flags together say about it. */
export interface ImpliedHazards {
  pyrophoric: boolean;
  waterReactive: boolean;
  /** The declared class, "unclassified" for EUH019 without one, or null. */
  peroxideClass: PeroxideFormer | null;
  /** The water-reactivity statements (H260, H261, EUH014) present. */
  waterCodes: string[];
  /** The CMR statements (H340, H350, H360 with suffixes) present. */
  cmrCodes: string[];
}

/**
 * The hazards a chemical has: each flag is true when it is set or when a statement
 * implies it; the peroxide class is the declared one, else "unclassified" when EUH019 is
 * stated, else null.
 * Example: impliedHazards({ ghs: ["H225", "H250", "EUH014"] }) → pyrophoric and water-reactive.
 */
export function impliedHazards(h: {
  ghs: readonly string[];
  pyrophoric?: boolean | null | undefined;
  waterReactive?: boolean | null | undefined;
  peroxideClass?: PeroxideClass | null | undefined;
}): ImpliedHazards {
  const waterCodes = statementsWithStem(h.ghs, GHS_FLAG_STEMS.waterReactive);
  const peroxide = statementsWithStem(h.ghs, GHS_FLAG_STEMS.peroxideFormer).length > 0;
  return {
    pyrophoric: h.pyrophoric === true || statementsWithStem(h.ghs, GHS_FLAG_STEMS.pyrophoric).length > 0,
    waterReactive: h.waterReactive === true || waterCodes.length > 0,
    peroxideClass: h.peroxideClass ?? (peroxide ? "unclassified" : null),
    waterCodes,
    cmrCodes: statementsWithStem(h.ghs, GHS_FLAG_STEMS.cmr),
  };
}
