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

/** An e-signature on the plan's content (CONTRACT.md): valid while its hash equals the plan's. */
export interface PlanSignature {
  signerName: string;
  signedAt: string;
  meaning: string;
  contentHash: string;
  valid: boolean;
}

/** A reservation line of the plan (held, consumed or released), filled in by release. */
export interface PlanReservationLine {
  id: string;
  containerId: string;
  chemicalId: string;
  status: "held" | "consumed" | "released";
  amount: { base: string; display: string };
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
    signature: PlanSignature | null;
    reservations: PlanReservationLine[];
  };

/** Puts a plan's stored row and its evaluation together into the GET shape. */
export function planView(summary: PlanSummary, document: PlanDocument, evaluation: PlanEvaluation): PlanView {
  return {
    ...summary,
    document,
    ...evaluation,
    computedWith: {
      vessel: document.vessel,
      block: document.block ?? null,
      equipment: document.equipment,
      dispensing: document.dispensing,
      thresholds: document.thresholds,
    },
    signature: null,
    reservations: [],
  };
}
