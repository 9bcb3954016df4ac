/**
 * The e-signature of a plan review (issue 11 "The e-signature"), pure: the three
 * decisions, what a signature of each means, and whether a signature still applies.
 *
 * A signature binds to the plan's content: it records the SHA-256 of the plan document's
 * RFC 8785 canonical JSON (lib/plans/content-hash.ts) at signing. It is valid while that
 * hash equals the plan's current content hash AND no edit has voided it since (an edit
 * clears the plan's current signature, so content edited away and back stays unsigned).
 */
import type { PlanSignature as PlanSignatureView } from "./view";

export const REVIEW_DECISIONS = ["approve", "request_changes", "reject"] as const;
export type ReviewDecision = (typeof REVIEW_DECISIONS)[number];

/** What a signature of each decision means, as the signature record and the prep sheet state it. */
export const SIGNATURE_MEANINGS: Record<ReviewDecision, string> = {
  approve: "approved for execution as planned",
  request_changes: "changes requested",
  reject: "rejected",
};

/** The button and dialog labels of the decisions. */
export const DECISION_LABELS: Record<ReviewDecision, string> = {
  approve: "Approve",
  request_changes: "Request changes",
  reject: "Reject",
};

/** A stored signature as far as validity needs it. */
export interface SignatureRecord {
  id: string;
  signerName: string;
  signedAt: Date | string;
  decision: ReviewDecision;
  meaning: string;
  contentHash: string;
}

/**
 * Whether `signature` applies to the plan now: it is the plan's current signature (no
 * edit voided it) and its hash equals the plan's content hash.
 */
export function signatureApplies(signature: SignatureRecord, plan: { contentHash: string; signatureId: string | null }): boolean {
  return plan.signatureId === signature.id && plan.contentHash === signature.contentHash;
}

/**
 * Whether the plan carries a valid approval (the table's `valid_signature` guard of the
 * move approved → released): its current signature approves exactly this content.
 */
export function hasValidApproval(latest: SignatureRecord | null, plan: { contentHash: string; signatureId: string | null }): boolean {
  return !!latest && latest.decision === "approve" && signatureApplies(latest, plan);
}

/** The plan GET's `signature` (CONTRACT.md): the latest signature, with whether it still applies. */
export function signatureView(signature: SignatureRecord | null, plan: { contentHash: string; signatureId: string | null }): PlanSignatureView | null {
  if (!signature) return null;
  return {
    signerName: signature.signerName,
    signedAt: new Date(signature.signedAt).toISOString(),
    meaning: signature.meaning,
    contentHash: signature.contentHash,
    valid: signatureApplies(signature, plan),
    decision: signature.decision,
  };
}
