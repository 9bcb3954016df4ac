/**
 * The codes the safe envelope reports and what a chart calls them (no engine imported, so
 * pages can use it): blocking cautions by their rule's title (lib/hazards/caution-rules.ts),
 * the lab's limits by the titles below. Which pointSafety limits bound the envelope is
 * decided here, once (lib/results/envelope.ts applies it).
 */
import { CAUTION_RULES } from "../hazards/caution-rules";

/** pointSafety's limit codes that bound the envelope, with their titles: the lab's equipment and vessel, and the recipe's meaning. */
export const ENVELOPE_LIMITS: Readonly<Record<string, string>> = {
  "TL-T01": CAUTION_RULES["TL-T01"].title,
  "TL-T02": CAUTION_RULES["TL-T02"].title,
  vessel_volume_above: "Above the vial's working volume",
  vessel_volume_below: "Below the vial's working volume",
  neat_over_volume: "Liquids as supplied exceed the final volume",
  amount_not_positive: "An amount at or below zero",
  fraction_out_of_range: "A solvent fraction out of range",
  temperature_not_accepted: "A temperature the hazard engine does not evaluate",
};

/** A finding of the envelope: a blocking caution, or a limit of the lab's equipment (or of the recipe's meaning). */
export type FindingKind = "caution" | "limit";

/** Whether a code the envelope reports is a blocking caution or a limit. */
export function findingKind(code: string): FindingKind {
  return Object.hasOwn(ENVELOPE_LIMITS, code) ? "limit" : "caution";
}

/** A short title for a code the envelope reports ("Estimated pressure over the lab's limit for the vessel"). */
export function findingTitle(code: string): string {
  if (Object.hasOwn(ENVELOPE_LIMITS, code)) return ENVELOPE_LIMITS[code]!;
  const rule = (CAUTION_RULES as Record<string, { title: string } | undefined>)[code];
  return rule?.title ?? code;
}
