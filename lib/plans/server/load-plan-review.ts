import "server-only";
import type { Transaction } from "sequelize";
import { amountView } from "@/inventory/server/common";
import { Chemical, Container, Plan, PlanSignature, Reservation } from "@/lib/server/models";
import type { PlanEvaluation } from "../evaluate";
import { signatureView } from "../signature";
import { planView, type PlanReservationLine, type PlanReviewState, type PlanView } from "../view";
import { planSummary } from "./common";

/** The plan's latest signature (any decision), or null. */
export async function latestSignature(opts: { labId: string; planId: string }, t?: Transaction): Promise<PlanSignature | null> {
  return PlanSignature.findOne({ where: { labId: opts.labId, planId: opts.planId }, order: [["signedAt", "DESC"], ["id", "DESC"]], transaction: t });
}

/** Every signature of the plan, oldest first. */
export async function planSignatures(opts: { labId: string; planId: string }, t?: Transaction): Promise<PlanSignature[]> {
  return PlanSignature.findAll({ where: { labId: opts.labId, planId: opts.planId }, order: [["signedAt", "ASC"], ["id", "ASC"]], transaction: t });
}

/** The reservations tied to the plan (held, consumed and released), oldest first. */
export async function planReservationLines(opts: { labId: string; planId: string }, t?: Transaction): Promise<PlanReservationLine[]> {
  const rows = await Reservation.findAll({
    where: { labId: opts.labId, planId: opts.planId },
    include: [{ model: Container, as: "container", required: true, where: { labId: opts.labId }, include: [{ model: Chemical, as: "chemical", required: true }] }],
    order: [["createdAt", "ASC"], ["id", "ASC"]],
    transaction: t,
  });
  return rows.map((r) => {
    const c = r.container!;
    return {
      id: r.id,
      containerId: c.id,
      chemicalId: c.chemicalId,
      status: r.status,
      // In the amount's natural unit (16.015 mL rather than 0.016 L of a litre bottle): what a plan takes is small beside its container.
      amount: amountView(r.amountBase, c.dimension),
      barcode: c.barcode,
      chemicalName: c.chemical?.name ?? "",
    };
  });
}

/** What review and release add to the plan's GET shape: its latest signature (valid or not), reservations and submission time. */
export async function loadPlanReview(plan: Plan, t?: Transaction): Promise<PlanReviewState> {
  const signature = await latestSignature({ labId: plan.labId, planId: plan.id }, t);
  const reservations = await planReservationLines({ labId: plan.labId, planId: plan.id }, t);
  return {
    signature: signatureView(signature, { contentHash: plan.contentHash, signatureId: plan.signatureId ?? null }),
    reservations,
    submittedAt: plan.submittedAt ? plan.submittedAt.toISOString() : null,
  };
}

/** The plan's GET shape with its signature and reservations. */
export async function fullPlanView(plan: Plan, evaluation: PlanEvaluation, t?: Transaction): Promise<PlanView> {
  return planView(planSummary(plan), plan.document, evaluation, await loadPlanReview(plan, t));
}
