/**
 * GHS hazard statements and the pictograms they carry: the one mapping every sheet and
 * screen uses (the prep sheet's cautions, the plan page, the inventory). It sits beside
 * hazard-flags.ts, which maps the same statements to Tareline's hazard flags; statement
 * codes are normalised and matched by their stem there (`statementsWithStem`), so
 * H350i and H360FD carry the pictogram of H350 and H360.
 *
 * Source: UN GHS (Globally Harmonized System of Classification and Labelling of
 * Chemicals), Rev. 10 (2023): Annex 1 (allocation of label elements: the symbol of each
 * hazard class and category) and Annex 3 section 1 (the hazard statement codes of those
 * categories). The nine pictograms are GHS01 exploding bomb, GHS02 flame, GHS03 flame
 * over circle, GHS04 gas cylinder, GHS05 corrosion, GHS06 skull and crossbones, GHS07
 * exclamation mark, GHS08 health hazard, GHS09 environment. Categories that the GHS
 * labels with no symbol (e.g. H221 flammable gas cat. 2, H227 flammable liquid cat. 4,
 * H303/H313/H333 acute toxicity cat. 5, H305, H316, H320, H362, H401, H402, H412, H413,
 * H229 alone) have none here, nor have the EU's supplemental EUH statements.
 *
 * Precedence (UN GHS §1.4.10.5.3.1; EU CLP Regulation (EC) No 1272/2008, Art. 26(1)),
 * from memory: where the skull and crossbones (GHS06) applies, the exclamation mark
 * (GHS07) does not appear; where corrosion (GHS05) applies, the exclamation mark does
 * not appear for skin or eye irritation; where the health hazard (GHS08) appears for
 * respiratory sensitisation, the exclamation mark does not appear for skin
 * sensitisation or skin or eye irritation.
 */
import { statementsWithStem } from "./hazard-flags";

export const GHS_PICTOGRAMS = ["GHS01", "GHS02", "GHS03", "GHS04", "GHS05", "GHS06", "GHS07", "GHS08", "GHS09"] as const;
export type GhsPictogram = (typeof GHS_PICTOGRAMS)[number];

/** The name of each pictogram in the GHS (Annex 3). */
export const GHS_PICTOGRAM_NAMES: Record<GhsPictogram, string> = {
  GHS01: "Exploding bomb",
  GHS02: "Flame",
  GHS03: "Flame over circle",
  GHS04: "Gas cylinder",
  GHS05: "Corrosion",
  GHS06: "Skull and crossbones",
  GHS07: "Exclamation mark",
  GHS08: "Health hazard",
  GHS09: "Environment",
};

/** The statement stems that carry each pictogram (UN GHS Rev. 10, Annex 1 and Annex 3). */
export const GHS_PICTOGRAM_STEMS: Record<GhsPictogram, readonly string[]> = {
  // Explosives (unstable, div. 1.1–1.4); self-reactive substances and organic peroxides type A and B.
  GHS01: ["H200", "H201", "H202", "H203", "H204", "H240", "H241"],
  // Flammable gases cat. 1, pyrophoric gases, aerosols cat. 1–2, flammable liquids cat. 1–3,
  // flammable solids, desensitised explosives, self-reactive and organic peroxides type B–F,
  // pyrophoric liquids and solids, self-heating, and substances that release flammable gas with water.
  GHS02: ["H206", "H207", "H208", "H220", "H222", "H223", "H224", "H225", "H226", "H228", "H232", "H241", "H242", "H250", "H251", "H252", "H260", "H261"],
  // Oxidising gases, liquids and solids.
  GHS03: ["H270", "H271", "H272"],
  // Gases under pressure (compressed, liquefied, dissolved; refrigerated liquefied).
  GHS04: ["H280", "H281"],
  // Corrosive to metals; skin corrosion cat. 1; serious eye damage cat. 1.
  GHS05: ["H290", "H314", "H318"],
  // Acute toxicity cat. 1–3 (oral, dermal, inhalation).
  GHS06: ["H300", "H301", "H310", "H311", "H330", "H331"],
  // Acute toxicity cat. 4; skin irritation cat. 2; skin sensitisation; eye irritation cat. 2(A);
  // STOT single exposure cat. 3 (respiratory irritation, narcotic effects); ozone layer.
  GHS07: ["H302", "H312", "H332", "H315", "H317", "H319", "H335", "H336", "H420"],
  // Aspiration cat. 1; respiratory sensitisation; germ cell mutagenicity; carcinogenicity;
  // reproductive toxicity cat. 1–2; STOT single exposure cat. 1–2; STOT repeated exposure.
  GHS08: ["H304", "H334", "H340", "H341", "H350", "H351", "H360", "H361", "H370", "H371", "H372", "H373"],
  // Hazardous to the aquatic environment: acute cat. 1, chronic cat. 1 and 2.
  GHS09: ["H400", "H410", "H411"],
};

/** Statements for which GHS07 gives way to GHS05 (skin and eye irritation). */
const IRRITATION = ["H315", "H319"];
/** Statements for which GHS07 gives way to GHS08 for respiratory sensitisation (skin sensitisation, irritation). */
const SENSITISATION_OR_IRRITATION = ["H317", "H315", "H319"];

/** Split combined statements ("H300+H310+H330") into their parts. */
function parts(statements: readonly string[]): string[] {
  return statements.flatMap((s) => s.split("+")).filter((s) => s.trim().length > 0);
}

/**
 * The pictograms a chemical's hazard statements carry, in GHS order (GHS01 … GHS09),
 * with the precedence rules of the module comment applied.
 * Example: ghsPictograms(["H225", "H250", "H261", "H314"]) → ["GHS02", "GHS05"];
 * ghsPictograms(["H301", "H315"]) → ["GHS06"] (the skull replaces the exclamation mark).
 */
export function ghsPictograms(statements: readonly string[]): GhsPictogram[] {
  const codes = parts(statements);
  const has = (p: GhsPictogram, stems: readonly string[] = GHS_PICTOGRAM_STEMS[p]) => statementsWithStem(codes, stems).length > 0;
  const out = new Set<GhsPictogram>();
  for (const p of GHS_PICTOGRAMS) if (has(p)) out.add(p);
  if (out.has("GHS07")) {
    let reasons = statementsWithStem(codes, GHS_PICTOGRAM_STEMS.GHS07).map((c) => c.toUpperCase().slice(0, 4));
    if (out.has("GHS06")) reasons = [];
    if (out.has("GHS05")) reasons = reasons.filter((r) => !IRRITATION.includes(r));
    if (statementsWithStem(codes, ["H334"]).length > 0) reasons = reasons.filter((r) => !SENSITISATION_OR_IRRITATION.includes(r));
    if (reasons.length === 0) out.delete("GHS07");
  }
  return GHS_PICTOGRAMS.filter((p) => out.has(p));
}
