/**
 * The live preview of a plan document (the plan editor's right-hand side, and
 * `POST /api/labs/{lab}/plans/preview` for scripts): the document as it would be stored
 * (the lab's defaults filled in, lib/plans/document.ts), its content hash, and its run
 * sheet and cautions computed exactly as `GET /plans/{plan}` computes them (the `plan`
 * verb's engine function, the inventory's hazard facts applied). Nothing is written.
 *
 * The preview adds two things the editor needs and a saved plan does not:
 * - `designRuns`: the design's runs when the amounts cannot be planned (the run sheet is
 *   then null), so the design table still shows what the design asks for;
 * - `inventory`: per linked chemical, the container the inventory would take it from,
 *   with its assay and molarity, so the editor can fill them in.
 */
// First: chooses zod's interpreter before the engine's plan-document schema is built (lib/schemas/text.ts).
import { uuid } from "../schemas/text";
import { z } from "zod";
import { resolveRuns, type ResolvedRun } from "../chemistry/design-runs";
import type { InventoryChemicalFacts } from "../chemistry/inventory-facts";
import type { PlanDocument } from "../chemistry/plan-document";
import type { StoredDocument } from "./document";
import type { PlanEvaluation } from "./evaluate";
import { planCreateSchema } from "./schemas";
import { computedWithOf, type PlanComputedWith } from "./view";

/** `POST /plans/preview`: a plan document as `POST /studies/{study}/plans` takes it. */
export const planPreviewSchema = planCreateSchema;

/** `GET /plans/preview?chemicals=<id>,<id>`: chemicals of the lab (at most 50). */
export const previewInventoryQuerySchema = z.object({
  chemicals: z
    .string({ message: "name the chemicals (ids, comma-separated)" })
    .transform((v) => [...new Set(v.split(",").map((s) => s.trim()).filter(Boolean))])
    .pipe(z.array(uuid("must be chemical ids (UUIDs), comma-separated")).min(1, "name at least one chemical").max(50, "at most 50 chemicals")),
});

/** What the inventory would use of a linked chemical (null when no container is usable). */
export interface PreviewInventoryLine {
  chemicalId: string;
  name: string;
  container: { id: string; barcode: string; purityPercent: number | null; molarityM: number | null } | null;
}

export interface PlanPreview extends PlanEvaluation {
  /** The document as it would be stored: lab defaults filled in, SMILES resolved, the seed fixed. */
  document: PlanDocument;
  contentHash: string;
  computedWith: PlanComputedWith;
  /** The design's runs when there is no run sheet (infeasible amounts); null when the run sheet carries them or the design itself cannot be generated. */
  designRuns: ResolvedRun[] | null;
  /** By chemical id: what the inventory would take each linked chemical from. */
  inventory: Record<string, PreviewInventoryLine>;
}

/** The design's runs of a stored document, or null when the design engine refuses it. */
function designOnly(doc: PlanDocument): ResolvedRun[] | null {
  try {
    return resolveRuns(doc);
  } catch {
    return null;
  }
}

/** The inventory lines of the facts the evaluation read. */
export function previewInventory(facts: Readonly<Record<string, InventoryChemicalFacts>>): Record<string, PreviewInventoryLine> {
  const out: Record<string, PreviewInventoryLine> = {};
  for (const [id, f] of Object.entries(facts)) {
    out[id] = {
      chemicalId: id,
      name: f.name,
      container: f.container ? { id: f.container.id, barcode: f.container.barcode, purityPercent: f.container.purityPercent, molarityM: f.container.molarityM } : null,
    };
  }
  return out;
}

/** Puts a stored document and its evaluation together into the preview. */
export function planPreview(stored: StoredDocument, evaluation: PlanEvaluation, facts: Readonly<Record<string, InventoryChemicalFacts>> = {}): PlanPreview {
  return {
    ...evaluation,
    document: stored.document,
    contentHash: stored.contentHash,
    computedWith: computedWithOf(stored.document),
    designRuns: evaluation.runSheet ? null : designOnly(stored.document),
    inventory: previewInventory(facts),
  };
}
