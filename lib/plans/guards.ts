/**
 * The conditions of lib/plans/states.ts's moves that need the plan's computed data
 * (`PlanGuard`), as checks that throw the 409 / 403 of CONTRACT.md. Pure: the operations
 * in lib/plans/server pass what they read. One module, so submit, review and release
 * refuse a plan for the same reasons in the same words.
 */
import { AppError } from "../errors/app-error";
import { CAUTION_RULES, compareCautions, type Caution } from "../hazards/caution-rules";
import type { PlanEvaluation } from "./evaluate";
import { PLAN_STATE_LABELS, type PlanMove } from "./states";

/** The plan's blocking cautions, worst first. */
export function blockingCautions(evaluation: Pick<PlanEvaluation, "cautions">): Caution[] {
  return evaluation.cautions.filter((c) => c.severity === "blocking").sort(compareCautions);
}

const ruleTitle = (code: string) => (CAUTION_RULES as Record<string, { title: string } | undefined>)[code]?.title ?? code;

/**
 * `no_blocking_caution`, and a plan whose amounts cannot work (no run sheet) cannot move on either.
 * @throws AppError conflict naming `cautions` (each blocking caution with its runs) or `document`.
 */
export function refuseUnready(evaluation: Pick<PlanEvaluation, "cautions" | "problem" | "runSheet">, move: PlanMove): void {
  const verb = move.action === "submit" ? "submitted for review" : move.action === "approve" ? "approved" : "released";
  if (evaluation.problem || !evaluation.runSheet) {
    throw new AppError("conflict", `The plan cannot be ${verb}: ${evaluation.problem?.message ?? "it has no run sheet"}`, [
      { path: "document", message: evaluation.problem?.code === "infeasible" ? "the amounts cannot work" : "the plan cannot be computed" },
    ]);
  }
  const blocking = blockingCautions(evaluation);
  if (blocking.length === 0) return;
  throw new AppError(
    "conflict",
    `The plan cannot be ${verb} while a caution blocks: ${blocking.map((c) => `${c.code} ${ruleTitle(c.code)} (runs ${c.runs.join(", ")})`).join("; ")}.`,
    blocking.map((c) => ({ path: "cautions", message: `${c.code} blocks (runs ${c.runs.join(", ")})` })),
  );
}

/** `not_author`: no one signs their own plan. @throws AppError forbidden. */
export function refuseAuthor(plan: { authorId: string }, actorUserId: string): void {
  if (plan.authorId === actorUserId) throw new AppError("forbidden", "No one signs their own plan: another safety officer must review it.", [{ path: "authorId", message: "you wrote this plan" }]);
}

/** `valid_signature`. @throws AppError conflict naming `signature`. */
export function refuseWithoutApproval(valid: boolean): void {
  if (!valid) {
    throw new AppError("conflict", "The plan has no valid approval: its signature was voided by an edit, or it was never approved. Submit it for review again.", [
      { path: "signature", message: "no valid approval of this content" },
    ]);
  }
}

/** `no_sign_off_required`: a draft goes straight to release only when no rule of the lab flags it. @throws AppError conflict naming `signOffRequired`. */
export function refuseSignOffRequired(evaluation: Pick<PlanEvaluation, "signOffRequired" | "signOffReasons">, state: keyof typeof PLAN_STATE_LABELS): void {
  if (!evaluation.signOffRequired) return;
  throw new AppError(
    "conflict",
    `This ${PLAN_STATE_LABELS[state].toLowerCase()} plan needs a safety officer's sign-off before release: ${evaluation.signOffReasons.join("; ")}. Submit it for review.`,
    [{ path: "signOffRequired", message: "sign-off is required" }],
  );
}
