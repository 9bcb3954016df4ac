import "server-only";
import type { Transaction } from "sequelize";
import type { InventoryChemicalFacts } from "@/lib/chemistry/inventory-facts";
import { parseOrThrow } from "@/lib/errors/app-error";
import { getLabSettings } from "@/lib/lab-settings/server/get-lab-settings";
import { storedDocument } from "../document";
import { planHazardFacts } from "@/inventory/server/plan-hazard-facts";
import { planPreview, planPreviewSchema, previewInventory, previewInventoryQuerySchema, type PlanPreview, type PreviewInventoryLine } from "../preview";
import { evaluateStoredPlan } from "./evaluate-stored-plan";
import { randomSeed, refuseInvalid } from "./common";

/**
 * The live preview of a plan document (lib/plans/preview.ts): stored form with the lab's
 * defaults, run sheet and cautions as `GET /plans/{plan}` computes them, with the hazard
 * facts of inventory-linked chemicals from the inventory. Reads only: nothing is stored
 * or audited. A document the engine refuses is a 422 with paths under `document.`, the
 * same answer a save would get; amounts that cannot work are a preview whose `problem`
 * says why (as a saved plan's would).
 * @throws AppError invalid_input (paths under `document.`).
 */
export async function previewPlan(opts: { labId: string; input: unknown }, t?: Transaction): Promise<PlanPreview> {
  const body = parseOrThrow(planPreviewSchema, opts.input, "The plan is not valid.");
  const { settings } = await getLabSettings({ labId: opts.labId }, t);
  const stored = await storedDocument(body.document, settings, randomSeed);
  let facts: Record<string, InventoryChemicalFacts> = {};
  const evaluation = await evaluateStoredPlan({ labId: opts.labId, document: stored.document, onFacts: (f) => (facts = f) }, t);
  refuseInvalid(evaluation);
  return planPreview(stored, evaluation, facts);
}

/**
 * What the preview would take from the inventory for each of the lab's chemicals named in
 * `chemicals` (comma-separated ids): the container the inventory proposes and its assay and
 * molarity (inventory `planHazardFacts`, the same the preview applies). Reads only.
 * @throws AppError invalid_input naming `chemicals`, not_found for a chemical the lab does not have.
 */
export async function previewInventoryOf(opts: { labId: string; query: unknown }, t?: Transaction): Promise<Record<string, PreviewInventoryLine>> {
  const { chemicals } = parseOrThrow(previewInventoryQuerySchema, opts.query, "The chemical list is not valid.");
  return previewInventory(await planHazardFacts({ labId: opts.labId, chemicalIds: chemicals }, t));
}
