/**
 * The GHS statements and pictograms of every chemical in a plan: each component's
 * statements from the plan document, each solvent's from the document and from the
 * solvent records of the hazard engine (lib/hazards). The prep sheet draws the
 * pictograms beside the cautions that name the chemical. Pure.
 */
import { parseOrThrow } from "../errors/app-error";
import { planDocumentSchema } from "../chemistry/plan-document";
import { findSolvent } from "../hazards/solvents";
import { normalizeGhsStatement } from "../hazards/hazard-flags";
import { ghsPictograms, type GhsPictogram } from "../hazards/ghs-pictograms";

export interface ChemicalStatements {
  /** As the run sheet and the cautions name it. */
  name: string;
  kind: "component" | "solvent";
  statements: string[];
  pictograms: GhsPictogram[];
}

function entry(name: string, kind: ChemicalStatements["kind"], statements: readonly string[]): ChemicalStatements {
  const unique = [...new Set(statements.map(normalizeGhsStatement))];
  return { name, kind, statements: unique, pictograms: ghsPictograms(unique) };
}

/**
 * The statements and pictograms of each component and solvent of a plan document (raw
 * JSON or parsed: it is parsed with the plan document's schema).
 * @throws AppError("invalid_input") with document paths when the document does not validate.
 */
export function planChemicalHazards(document: unknown): ChemicalStatements[] {
  const doc = parseOrThrow(planDocumentSchema, document, "The plan document is not valid.");
  const out: ChemicalStatements[] = doc.recipe.components.map((c) => entry(c.name, "component", c.hazards.ghs));
  for (const s of doc.recipe.solvents) {
    const record = findSolvent(s.name);
    out.push(entry(s.name, "solvent", [...s.ghs, ...(record?.ghs.value ?? [])]));
  }
  return out;
}
