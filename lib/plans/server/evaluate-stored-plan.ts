import "server-only";
import { Op, type Transaction } from "sequelize";
import { AppError, type FieldIssue } from "@/lib/errors/app-error";
import { applyInventoryFacts, linkedChemicalIds, type InventoryChemicalFacts } from "@/lib/chemistry/inventory-facts";
import type { PlanDocument, PlanDocumentInput } from "@/lib/chemistry/plan-document";
import { planHazardFacts } from "@/inventory/server/plan-hazard-facts";
import { Chemical } from "@/lib/server/models";
import { DOCUMENT_PATH } from "../document";
import { evaluatePlan, type PlanEvaluation } from "../evaluate";

/** A linked chemical the lab does not have (applyInventoryFacts names it at `….chemicalId`). */
const isMissingChemical = (issue: FieldIssue) => issue.path.endsWith(".chemicalId");

type EvaluateOptions = {
  labId: string;
  document: PlanDocument;
  refuseUnknownChemicals?: boolean;
  onFacts?: (facts: Record<string, InventoryChemicalFacts>) => void;
};

/**
 * The run sheet and cautions of a stored document, computed as the `plan` verb computes
 * them, with the hazard facts of inventory-linked components and solvents (`chemicalId`)
 * taken from the lab's inventory — the chemical record and the container the inventory
 * would take it from — rather than from what the document says (applyInventoryFacts of
 * lib/chemistry, facts read by the inventory's planHazardFacts). Where the document
 * disagrees with the record, or names a chemical the lab does not have, `inventoryIssues`
 * says so at the document path.
 *
 * With `refuseUnknownChemicals` (saving), a chemical the lab does not have is a 422 naming
 * `document.recipe.….chemicalId`, and nothing is stored. `onFacts` receives the facts that
 * were read (the editor's preview shows the container's purity and molarity from them).
 */
export async function evaluateStoredPlan(opts: EvaluateOptions, t?: Transaction): Promise<PlanEvaluation> {
  const linked = await withInventoryFacts(opts, t);
  return evaluatePlan(linked.document, linked.issues);
}

/**
 * The stored document as the engines see it: with the hazard facts of its inventory-linked
 * components and solvents taken from the lab's inventory (see `evaluateStoredPlan`), and
 * the issues found on the way at `document.<path>`.
 * @throws AppError invalid_input with `refuseUnknownChemicals`, as `evaluateStoredPlan`.
 */
export async function withInventoryFacts(opts: EvaluateOptions, t?: Transaction): Promise<{ document: PlanDocumentInput; issues: FieldIssue[] }> {
  const ids = linkedChemicalIds(opts.document);
  if (ids.length === 0) return { document: opts.document, issues: [] };
  // Only the lab's own chemicals are read; an id the lab does not have is reported by applyInventoryFacts.
  let facts: Record<string, InventoryChemicalFacts>;
  try {
    facts = await planHazardFacts({ labId: opts.labId, chemicalIds: ids }, t);
  } catch (e) {
    // Some id is not the lab's (planHazardFacts names it): read the facts of those that are.
    if (!(e instanceof AppError) || e.code !== "not_found") throw e;
    const known = (await Chemical.findAll({ where: { labId: opts.labId, id: { [Op.in]: ids } }, attributes: ["id"], transaction: t })).map((c) => c.id);
    facts = await planHazardFacts({ labId: opts.labId, chemicalIds: known }, t);
  }
  opts.onFacts?.(facts);
  const linked = applyInventoryFacts(opts.document, facts);
  const issues = linked.issues.map((i) => ({ ...i, path: `${DOCUMENT_PATH}.${i.path}` }));
  if (opts.refuseUnknownChemicals && issues.some(isMissingChemical)) {
    throw new AppError("invalid_input", "The plan names chemicals this lab's inventory does not have.", issues.filter(isMissingChemical));
  }
  return { document: linked.document as PlanDocumentInput, issues };
}
