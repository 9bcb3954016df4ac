/**
 * Molar masses of reagents from a molecular formula, with the IUPAC standard atomic
 * weights (see ./atomic-weights.ts for the edition and why not mf-parser's own table).
 */
import { MF } from "mf-parser";
import { z } from "zod";
import { AppError, parseOrThrow } from "../errors/app-error";
import { standardAtomicWeight } from "./atomic-weights";

export interface MolarMassResult {
  /** The formula as given. */
  formula: string;
  /** The same composition in Hill order (C, H, then the other elements alphabetically). */
  hillFormula: string;
  /** Atom counts per element. */
  atoms: Record<string, number>;
  /** Molar mass in g/mol from the IUPAC 2021 standard (conventional) atomic weights. */
  gPerMol: number;
  /** Monoisotopic mass (Da) of the most abundant isotopes, from mf-parser; null if unknown. */
  monoisotopic: number | null;
  /** Where the atomic weights come from. */
  source: string;
}

export const MOLAR_MASS_SOURCE =
  "IUPAC/CIAAW standard atomic weights 2021 (Pure Appl. Chem. 94 (2022) 573), conventional values for interval elements; formula parsed by mf-parser";

export const molarMassInputSchema = z
  .strictObject({
    formula: z.string().min(1, "give a molecular formula such as C9H11Br").optional(),
    smiles: z.string().min(1, "give a SMILES string").optional(),
  })
  .superRefine((v, ctx) => {
    if ((v.formula === undefined) === (v.smiles === undefined)) {
      ctx.addIssue({ code: "custom", path: ["formula"], message: "give exactly one of formula or smiles" });
    }
  });
export type MolarMassInput = z.infer<typeof molarMassInputSchema>;

/** Hill order: carbon first, hydrogen second, then alphabetical; without carbon, all alphabetical. */
export function hillFormula(atoms: Record<string, number>): string {
  const symbols = Object.keys(atoms).filter((s) => (atoms[s] ?? 0) !== 0);
  const hasCarbon = symbols.includes("C");
  const rest = symbols.filter((s) => !hasCarbon || (s !== "C" && s !== "H")).sort();
  const ordered = hasCarbon ? ["C", ...(symbols.includes("H") ? ["H"] : []), ...rest] : rest;
  return ordered.map((s) => (atoms[s] === 1 ? s : `${s}${atoms[s]}`)).join("");
}

/**
 * Molar mass (g/mol) of a molecular formula, summing the IUPAC standard atomic weights
 * (2021; conventional values for interval elements) over the atoms mf-parser finds.
 * Accepts groups and hydrates as mf-parser writes them: `Et3N`, `(Pd(C3H5)Cl)2`,
 * `K3PO4.H2O`. Square brackets denote isotopes in mf-parser and are refused here
 * (a labelled compound has no standard molar mass).
 *
 * Accepts a formula string or `{ formula }`; for `{ smiles }` use the asynchronous
 * `smilesMolarMass` of ./smiles.ts (openchemlib is loaded only then).
 *
 * @throws AppError("invalid_input") naming path `formula` (or `smiles`) when the formula
 *   does not parse, is empty, contains an unknown element or group, or an element with
 *   no standard atomic weight.
 * @example molarMass("C9H11Br").gPerMol // 199.091 (9 × 12.011 + 11 × 1.008 + 79.904)
 */
export function molarMass(input: string | MolarMassInput | unknown): MolarMassResult {
  const parsed = typeof input === "string" ? { formula: input } : parseOrThrow(molarMassInputSchema, input);
  if (parsed.formula === undefined) {
    throw AppError.field(
      "smiles",
      "SMILES needs the asynchronous smilesMolarMass() (lib/chemistry/smiles.ts); molarMass() takes a formula",
    );
  }
  return formulaMolarMass(parsed.formula, "formula");
}

/** Molar mass of a formula; `path` names the input field in errors. See {@link molarMass}. */
export function formulaMolarMass(formula: string, path = "formula"): MolarMassResult {
  const text = formula.trim();
  if (text === "") throw AppError.field(path, "the formula is empty");
  if (text.includes("[") || text.includes("]")) {
    throw AppError.field(path, "square brackets mean isotopes to the formula parser; use parentheses for groups, e.g. (Pd(C3H5)Cl)2");
  }
  let atoms: Record<string, number>;
  let monoisotopic: number | null;
  try {
    const info = new MF(text).getInfo();
    atoms = { ...info.atoms } as Record<string, number>;
    monoisotopic = Number.isFinite(info.monoisotopicMass) ? info.monoisotopicMass : null;
  } catch (e) {
    const first = (e as Error).message.split("\n")[0] ?? "";
    throw AppError.field(path, `not a molecular formula (${first})`);
  }
  let gPerMol = 0;
  let count = 0;
  for (const [symbol, n] of Object.entries(atoms)) {
    const weight = standardAtomicWeight(symbol);
    if (weight === undefined) {
      const hint = symbol === "Ac" ? ' (for acetate write O2CCH3 or C2H3O2, e.g. Pd(O2CCH3)2)' : "";
      throw AppError.field(
        path,
        `"${symbol}" has no standard atomic weight (an unknown group, or an element without one); write the group out in elements${hint}`,
      );
    }
    if (!Number.isFinite(n) || n < 0) throw AppError.field(path, `atom count of ${symbol} is not a positive number`);
    gPerMol += weight * n;
    count += n;
  }
  if (count <= 0 || !(gPerMol > 0)) throw AppError.field(path, "the formula has no atoms");
  return { formula, hillFormula: hillFormula(atoms), atoms, gPerMol, monoisotopic, source: MOLAR_MASS_SOURCE };
}
