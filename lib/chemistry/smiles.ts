/**
 * SMILES input: the molecular formula of a SMILES string, through openchemlib's SMILES
 * parser (implicit hydrogens filled in by valence, as the OpenSMILES specification
 * describes). The molar mass is then computed from that formula with the IUPAC standard
 * atomic weights (./molar-mass.ts). openchemlib is large, so it is loaded only when a
 * SMILES string is actually given.
 */
import { AppError } from "../errors/app-error";
import { formulaMolarMass, type MolarMassResult } from "./molar-mass";

/**
 * The molecular formula (Hill order, as openchemlib writes it) of a SMILES string.
 * @throws AppError("invalid_input") at `path` when the SMILES does not parse or is empty.
 * @example await formulaFromSmiles("CC(C)c1ccc(Br)cc1") // "C9H11Br"
 */
export async function formulaFromSmiles(smiles: string, path = "smiles"): Promise<string> {
  const text = smiles.trim();
  if (text === "") throw AppError.field(path, "the SMILES string is empty");
  // openchemlib forgives an unclosed branch ("C(C"); a chemist's typo should not pass.
  const open = (text.match(/\(/g) ?? []).length;
  const close = (text.match(/\)/g) ?? []).length;
  if (open !== close) throw AppError.field(path, `not a valid SMILES string (${open} "(" but ${close} ")")`);
  const OCL = await import("openchemlib");
  let formula: string;
  try {
    formula = OCL.Molecule.fromSmiles(text).getMolecularFormula().formula;
  } catch (e) {
    const message = (e as Error).message.replace(/^[^:]*: /, "");
    throw AppError.field(path, `not a valid SMILES string (${message})`);
  }
  if (formula.trim() === "") throw AppError.field(path, "the SMILES string has no atoms");
  return formula;
}

/**
 * Molar mass of a SMILES string: its formula from openchemlib, then IUPAC 2021
 * standard atomic weights summed over the atoms (see molar-mass.ts).
 * @throws AppError("invalid_input") at `path` for a SMILES that does not parse.
 */
export async function smilesMolarMass(smiles: string, path = "smiles"): Promise<MolarMassResult & { smiles: string }> {
  const formula = await formulaFromSmiles(smiles, path);
  // Charges as openchemlib writes them ("H4N+") are not atoms: strip them for the mass.
  const neutral = formula.replace(/[+-]\d*$/u, "");
  return { ...formulaMolarMass(neutral, path), smiles };
}

/**
 * Fills in `formula` for every recipe component of a raw plan document that gives only
 * `smiles`, so the synchronous run-sheet builder can use it. Other input is returned
 * unchanged (the schema reports what is wrong with it).
 * @throws AppError("invalid_input") at `recipe.components.<i>.smiles` for a bad SMILES.
 */
export async function resolvePlanSmiles(input: unknown): Promise<unknown> {
  if (!input || typeof input !== "object") return input;
  const recipe = (input as { recipe?: unknown }).recipe;
  if (!recipe || typeof recipe !== "object") return input;
  const components = (recipe as { components?: unknown }).components;
  if (!Array.isArray(components)) return input;
  const resolved = await Promise.all(
    components.map(async (c: unknown, i) => {
      if (!c || typeof c !== "object") return c;
      const comp = c as Record<string, unknown>;
      if (typeof comp.smiles !== "string" || comp.formula !== undefined || comp.molarMassGPerMol !== undefined) return c;
      const formula = (await formulaFromSmiles(comp.smiles, `recipe.components.${i}.smiles`)).replace(/[+-]\d*$/u, "");
      return { ...comp, formula };
    }),
  );
  return { ...(input as object), recipe: { ...(recipe as object), components: resolved } };
}
