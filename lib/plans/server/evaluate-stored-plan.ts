import "server-only";
import type { Transaction } from "sequelize";
import type { PlanDocument } from "@/lib/chemistry/plan-document";
import { evaluatePlan, type PlanEvaluation } from "../evaluate";

/**
 * The run sheet and cautions of a stored document, computed as the `plan` verb computes
 * them, with the hazard facts of inventory-linked components taken from the lab's
 * inventory (the chemical record and the container that will be used) rather than from
 * what the document says.
 */
export async function evaluateStoredPlan(opts: { labId: string; document: PlanDocument }, t?: Transaction): Promise<PlanEvaluation> {
  const document = await withInventoryHazardFacts(opts.labId, opts.document, t);
  return evaluatePlan(document);
}

/**
 * TODO(issue 9 "hazard facts from the inventory"): replace with the inventory's
 * plan-hazard-facts reader and lib/chemistry's pure overwrite once they land on main.
 */
async function withInventoryHazardFacts(_labId: string, document: PlanDocument, _t?: Transaction): Promise<PlanDocument> {
  return document;
}
