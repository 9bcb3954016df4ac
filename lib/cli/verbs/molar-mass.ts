/**
 * `cli molar-mass`: `{ "formula": "C9H11Br" }` or `{ "smiles": "CC(C)c1ccc(Br)cc1" }` →
 * `{ formula, gPerMol, monoisotopic, … }` (the README), IUPAC 2021 standard
 * atomic weights. A SMILES string is turned into its formula by openchemlib first.
 */
import { parseOrThrow } from "../../errors/app-error";
import { molarMass, molarMassInputSchema } from "../../chemistry/molar-mass";
import { smilesMolarMass } from "../../chemistry/smiles";

export async function run(input: unknown): Promise<unknown> {
  if (typeof input === "string") return molarMass({ formula: input });
  const parsed = parseOrThrow(molarMassInputSchema, input);
  if (parsed.smiles !== undefined) return smilesMolarMass(parsed.smiles);
  return molarMass(parsed);
}
