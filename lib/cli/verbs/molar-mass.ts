/**
 * `cli molar-mass`: `{ "formula": "C9H11Br" }` → `{ formula, gPerMol, monoisotopic, … }`
 * (../shared/CONTRACT.md). SMILES input is refused with an invalid-input error.
 */
import { molarMass } from "../../chemistry/molar-mass";

export function run(input: unknown): unknown {
  if (typeof input === "string") return molarMass({ formula: input });
  return molarMass(input);
}
