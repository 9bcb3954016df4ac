import "server-only";
import { Op, type Transaction } from "sequelize";
import { AppError } from "@/lib/errors/app-error";
import { resolveRuns } from "@/lib/chemistry/design-runs";
import { Plan } from "@/lib/server/models";
import type { ConfirmationSource } from "../confirmation-check";
import type { ConfirmationDetails } from "../confirmation-plan";
import type { DerivedPlanRef } from "../next-design";
import { resultCells } from "./common";

/** States whose derived plans are left out of the analysis (they will never have results). */
const GONE = ["rejected", "cancelled"];

/**
 * The confirmation and augmentation plans derived from a plan (oldest first), with what the
 * analysis of the plan reads of them: each confirmation plan's runs, stored results and
 * derivation details. Rejected and cancelled plans are left out. Reads only.
 */
export async function listDerivedPlans(opts: { labId: string; planId: string }, t?: Transaction): Promise<{ confirmations: ConfirmationSource[]; augmentations: DerivedPlanRef[] }> {
  const rows = await Plan.findAll({
    where: { labId: opts.labId, derivedFromPlanId: opts.planId, derivation: { [Op.in]: ["confirmation", "augmentation"] }, state: { [Op.notIn]: GONE } },
    attributes: ["id", "name", "state", "derivation", "document", "derivationDetails", "createdAt"],
    order: [["createdAt", "ASC"], ["id", "ASC"]],
    transaction: t,
  });
  const confirmations: ConfirmationSource[] = [];
  const augmentations: DerivedPlanRef[] = [];
  for (const p of rows) {
    const ref = { id: p.id, name: p.name, state: p.state };
    if (p.derivation === "augmentation") {
      augmentations.push(ref);
      continue;
    }
    let runs;
    try {
      runs = resolveRuns(p.document);
    } catch (e) {
      if (!(e instanceof AppError)) throw e;
      continue; // a draft edited into a design without runs: nothing to judge yet
    }
    const details = p.derivationDetails && p.derivationDetails.kind === "confirmation" ? (p.derivationDetails as unknown as ConfirmationDetails) : null;
    confirmations.push({ plan: ref, details, runs: runs.map((r) => ({ run: r.standardOrder, natural: r.natural })), results: await resultCells({ labId: opts.labId, planId: p.id }, t) });
  }
  return { confirmations, augmentations };
}
