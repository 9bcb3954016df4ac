import "server-only";
import type { Transaction } from "sequelize";
import { diffDocuments, type DocumentChange } from "../diff";
import type { ReviewDecision } from "../signature";
import type { PlanView } from "../view";
import { getPlan } from "./get-plan";
import { planSignatures } from "./load-plan-review";

export interface ReviewHistoryItem {
  signerName: string;
  signedAt: string;
  decision: ReviewDecision;
  meaning: string;
  comment: string;
  contentHash: string;
  planVersion: number;
}

export interface PlanReviewPage {
  plan: PlanView;
  /** Every review of the plan, oldest first. */
  history: ReviewHistoryItem[];
  /** What changed since the last review (null when it was never reviewed): the document then → now. */
  sinceLastReview: { reviewedVersion: number; reviewedHash: string; changes: DocumentChange[] } | null;
}

/**
 * What the review page shows: the plan (run sheet, cautions, per-run pressures), every
 * earlier review, and the document's changes since the last one (the document each
 * signature kept, diffed against the current one: lib/plans/diff.ts).
 * @throws AppError not_found.
 */
export async function getPlanReview(opts: { labId: string; planId: string }, t?: Transaction): Promise<PlanReviewPage> {
  const plan = await getPlan(opts, t);
  const signatures = await planSignatures(opts, t);
  const last = signatures[signatures.length - 1];
  return {
    plan,
    history: signatures.map((s) => ({
      signerName: s.signerName,
      signedAt: s.signedAt.toISOString(),
      decision: s.decision,
      meaning: s.meaning,
      comment: s.comment,
      contentHash: s.contentHash,
      planVersion: s.planVersion,
    })),
    sinceLastReview: last ? { reviewedVersion: last.planVersion, reviewedHash: last.contentHash, changes: diffDocuments(last.document, plan.document) } : null,
  };
}
