import "server-only";
import type { Transaction } from "sequelize";
import { enqueueMail } from "@/lib/jobs/mail/enqueue-mail";
import { inTransaction } from "@/lib/server/db";
import { refuseUnready } from "../guards";
import { planPaths, reviewRequestedMail } from "../notifications";
import type { PlanView } from "../view";
import { evaluateStoredPlan } from "./evaluate-stored-plan";
import { fullPlanView } from "./load-plan-review";
import { applyMove, lockPlanForMove } from "./move-plan";
import { appLink, labOf, membersWith } from "./plan-mail";

/**
 * Submits a plan for safety review (CONTRACT.md `POST /plans/{plan}/submit`): the move
 * draft | changes_requested → in_review of lib/plans/states.ts, in one transaction with the
 * plan row locked. Refused while any caution blocks (or the amounts cannot work). Records
 * the submission time (the review queue's age), raises the version, audits, and queues an
 * e-mail to each of the lab's safety officers (`plans.review`) with a link to the review
 * page — inside the transaction, so nothing is sent if the move rolls back.
 * @throws AppError not_found, conflict (state, blocking caution), forbidden (role).
 */
export async function submitPlan(opts: { labId: string; actorUserId: string; planId: string; appUrl?: string; now?: Date }, t?: Transaction): Promise<PlanView> {
  return inTransaction(t, async (tx) => {
    const { plan, move } = await lockPlanForMove({ ...opts, action: "submit" }, tx);
    const evaluation = await evaluateStoredPlan({ labId: opts.labId, document: plan.document }, tx);
    refuseUnready(evaluation, move);
    await applyMove(
      {
        labId: opts.labId,
        actorUserId: opts.actorUserId,
        plan,
        move,
        details: { cautions: evaluation.cautions.map((c) => c.code), signOffRequired: evaluation.signOffRequired },
        set: (p) => {
          p.submittedAt = opts.now ?? new Date();
        },
      },
      tx,
    );
    const lab = await labOf(opts.labId, tx);
    const officers = await membersWith({ labId: opts.labId, permission: "plans.review", except: plan.authorId }, tx);
    const mail = reviewRequestedMail({
      labName: lab.name,
      planName: plan.name,
      studyName: plan.study?.name ?? "",
      authorName: plan.author?.name ?? "",
      runCount: plan.runCount,
      cautions: evaluation.cautions,
      signOffReasons: evaluation.signOffReasons,
      link: appLink(planPaths.review(lab.slug, plan.id), opts.appUrl),
    });
    for (const officer of officers) await enqueueMail({ to: officer.email, ...mail }, tx);
    return fullPlanView(plan, evaluation, tx);
  });
}
