import "server-only";
import type { Transaction } from "sequelize";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { confirmPassword } from "@/lib/auth/authenticate";
import { enqueueMail } from "@/lib/jobs/mail/enqueue-mail";
import { inTransaction } from "@/lib/server/db";
import { PlanSignature, User } from "@/lib/server/models";
import { refuseAuthor, refuseUnready } from "../guards";
import { planPaths, reviewDecisionMail } from "../notifications";
import { planReviewSchema } from "../review-schemas";
import { SIGNATURE_MEANINGS } from "../signature";
import { requireMove } from "../states";
import type { PlanView } from "../view";
import { findPlan } from "./common";
import { evaluateStoredPlan } from "./evaluate-stored-plan";
import { fullPlanView } from "./load-plan-review";
import { applyMove, lockPlanForMove, requireMovePermission } from "./move-plan";
import { appLink, labOf } from "./plan-mail";

/**
 * A safety officer's review of a plan in review, with an e-signature (CONTRACT.md
 * `POST /plans/{plan}/review` `{ decision, comment, password }`): the move in_review →
 * approved | changes_requested | rejected of lib/plans/states.ts.
 *
 * First, without holding the plan, the move must exist (409), the role must hold
 * `plans.review` (403) and the reviewer must not be the author (403); then the password is
 * checked with sign-in's lockout (lib/auth/authenticate.ts `confirmPassword`: 422 naming
 * `password`, 429 when locked out), so no row waits on bcrypt. Then in one transaction
 * with the plan row locked, everything is checked again (the plan may have moved) and an
 * approval also needs no blocking caution; the signature is written (append-only: signer
 * id and name, time, meaning, comment, the plan's SHA-256 content hash, version and
 * document as signed) and becomes the plan's current signature; the plan moves, its
 * version goes up, the audit log records it and the author is told by e-mail.
 * @throws AppError invalid_input (`decision`, `comment`, `password`), not_found,
 *   conflict, forbidden, rate_limited.
 */
export async function reviewPlan(opts: { labId: string; actorUserId: string; planId: string; input: unknown; appUrl?: string }, t?: Transaction): Promise<PlanView> {
  const body = parseOrThrow(planReviewSchema, opts.input, "The review is not valid.");
  await inTransaction(t, async (tx) => {
    const plan = await findPlan({ labId: opts.labId, planId: opts.planId }, tx);
    const move = requireMove(plan.state, body.decision);
    await requireMovePermission({ labId: opts.labId, actorUserId: opts.actorUserId, move }, tx);
    refuseAuthor(plan, opts.actorUserId);
  });
  await confirmPassword({ userId: opts.actorUserId, password: body.password });

  return inTransaction(t, async (tx) => {
    const { plan, move } = await lockPlanForMove({ labId: opts.labId, actorUserId: opts.actorUserId, planId: opts.planId, action: body.decision }, tx);
    refuseAuthor(plan, opts.actorUserId);
    const evaluation = await evaluateStoredPlan({ labId: opts.labId, document: plan.document }, tx);
    if (move.guards.includes("no_blocking_caution")) refuseUnready(evaluation, move);
    const signer = await User.findByPk(opts.actorUserId, { attributes: ["id", "name"], transaction: tx });
    if (!signer) throw new AppError("unauthenticated", "Sign in first.");
    const meaning = SIGNATURE_MEANINGS[body.decision];
    const signature = await PlanSignature.create(
      {
        labId: opts.labId,
        planId: plan.id,
        signerId: signer.id,
        signerName: signer.name,
        decision: body.decision,
        meaning,
        comment: body.comment,
        contentHash: plan.contentHash,
        planVersion: plan.version,
        document: plan.document,
      },
      { transaction: tx },
    );
    await applyMove(
      {
        labId: opts.labId,
        actorUserId: opts.actorUserId,
        plan,
        move,
        details: { signatureId: signature.id, signerName: signer.name, meaning, comment: body.comment || null, signedContentHash: plan.contentHash },
        set: (p) => {
          p.signatureId = signature.id;
        },
      },
      tx,
    );
    const lab = await labOf(opts.labId, tx);
    const author = await User.findByPk(plan.authorId, { attributes: ["email"], transaction: tx });
    if (author) {
      const mail = reviewDecisionMail({
        labName: lab.name,
        planName: plan.name,
        decision: body.decision,
        signerName: signer.name,
        comment: body.comment,
        link: appLink(planPaths.plan(lab.slug, plan.studyId, plan.id), opts.appUrl),
      });
      await enqueueMail({ to: author.email, ...mail }, tx);
    }
    return fullPlanView(plan, evaluation, tx);
  });
}
