/**
 * The plan as `GET /plans/{plan}` shows it (CONTRACT.md "Plans"): the stored plan, its
 * run sheet and cautions as the `plan` verb computes them, whether it may be released and
 * needs sign-off, the values it was computed with, and (from the review issue on) its
 * signature and reservations.
 */
import type { PlanDocument } from "../chemistry/plan-document";
import type { Block } from "../hazards/thresholds";
import type { VesselType } from "../hazards/vessels";
import type { PlanEvaluation } from "./evaluate";
import type { PlanSummary } from "./schemas";
import type { ReviewDecision } from "./signature";

/** An e-signature on the plan's content (CONTRACT.md): valid while its hash equals the plan's. */
export interface PlanSignature {
  signerName: string;
  signedAt: string;
  meaning: string;
  contentHash: string;
  valid: boolean;
  /** The decision signed (the meaning says it in words). */
  decision?: ReviewDecision;
}

/** A reservation line of the plan (held, consumed or released), filled in by release. */
export interface PlanReservationLine {
  id: string;
  containerId: string;
  chemicalId: string;
  status: "held" | "consumed" | "released";
  amount: { base: string; display: string };
  /** The container's barcode and the chemical's name, for people. */
  barcode: string;
  chemicalName: string;
}

/** What review and release add to a plan: its latest signature, its reservations and when it was submitted. */
export interface PlanReviewState {
  signature: PlanSignature | null;
  reservations: PlanReservationLine[];
  submittedAt: string | null;
}

/** The settings the run sheet and cautions were computed with, as stored in the document. */
export interface PlanComputedWith {
  vessel: VesselType | string;
  block: Block | null;
  equipment: PlanDocument["equipment"];
  dispensing: PlanDocument["dispensing"];
  thresholds: PlanDocument["thresholds"];
}

export type PlanView = PlanSummary &
  PlanEvaluation & {
    document: PlanDocument;
    computedWith: PlanComputedWith;
  } & PlanReviewState;

/** The settings a stored document's run sheet and cautions are computed with (they live in the document). */
export function computedWithOf(document: PlanDocument): PlanComputedWith {
  return {
    vessel: document.vessel,
    block: document.block ?? null,
    equipment: document.equipment,
    dispensing: document.dispensing,
    thresholds: document.thresholds,
  };
}

/**
 * Puts a plan's stored row and its evaluation together into the GET shape; `review` is
 * the signature and reservations (lib/plans/server/load-plan-review.ts), none when omitted.
 */
export function planView(summary: PlanSummary, document: PlanDocument, evaluation: PlanEvaluation, review?: PlanReviewState): PlanView {
  return {
    ...summary,
    document,
    ...evaluation,
    computedWith: computedWithOf(document),
    signature: review?.signature ?? null,
    reservations: review?.reservations ?? [],
    submittedAt: review?.submittedAt ?? null,
  };
}
