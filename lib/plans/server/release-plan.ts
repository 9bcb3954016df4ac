import "server-only";
import type { Transaction } from "sequelize";
import { AppError } from "@/lib/errors/app-error";
import { checkAvailability } from "@/inventory/server/availability";
import { reserveStock } from "@/inventory/server/reserve-stock";
import type { Dimension } from "@/inventory/units";
import { enqueueMail } from "@/lib/jobs/mail/enqueue-mail";
import { inTransaction, transaction } from "@/lib/server/db";
import { Plan, User } from "@/lib/server/models";
import { refuseSignOffRequired, refuseUnready, refuseWithoutApproval } from "../guards";
import { planPaths, shortfallMail, type ShortfallLine } from "../notifications";
import { planRequirements, type PlanRequirement } from "../requirements";
import { hasValidApproval } from "../signature";
import type { PlanView } from "../view";
import { evaluateStoredPlan } from "./evaluate-stored-plan";
import { fullPlanView, latestSignature } from "./load-plan-review";
import { applyMove, lockPlanForMove } from "./move-plan";
import { appLink, labOf, membersWith } from "./plan-mail";

/** The text reference a release writes on its reservations and ledger lines (the plan row is the foreign key). */
export const planRefOf = (plan: { name: string }) => plan.name.slice(0, 100);

/** A base-unit amount (µg or nL) as an exact decimal in the unit reserveStock takes (µg or µL). */
function pickAmount(base: bigint, dimension: Dimension): { amount: string; unit: "µg" | "µL" } {
  if (dimension === "mass") return { amount: base.toString(), unit: "µg" };
  const frac = (base % 1000n).toString().padStart(3, "0").replace(/0+$/, "");
  return { amount: frac ? `${base / 1000n}.${frac}` : `${base / 1000n}`, unit: "µL" };
}

/** What is short, per requirement, in the body of the 409 (CONTRACT.md): needed and available in the requirement's unit. */
function shortfallLines(requirements: PlanRequirement[], lines: Array<{ requirement: number; chemicalId: string; chemicalName: string; shortfall: { amount: number; unit: string } | null }>): ShortfallLine[] {
  return lines.flatMap((l) => {
    if (!l.shortfall) return [];
    const needed = Number(requirements[l.requirement]!.amount);
    return [{ chemicalId: l.chemicalId, name: l.chemicalName, needed, available: Math.max(0, needed - l.shortfall.amount), unit: l.shortfall.unit }];
  });
}

/**
 * Releases a plan (CONTRACT.md `POST /plans/{plan}/release`): the move approved → released
 * (with a valid signature) or draft → released (only when no rule of the lab asks for
 * sign-off) of lib/plans/states.ts, in ONE transaction with the plan row locked:
 *
 * 1. no caution may block, and the plan must compute;
 * 2. every component and solvent naming a chemical is reserved for the run sheet's totals
 *    with overage and dead volume (lib/plans/requirements.ts): the containers of those
 *    chemicals are locked in id order, the inventory proposes containers (first to expire
 *    first, opened before sealed: inventory/availability.ts) and reserveStock holds them,
 *    tied to the plan by its id, in this transaction;
 * 3. the plan moves (version + 1, audited) and the author is sent the release mail with the
 *    prep sheet and worklist attached (built in the job worker).
 *
 * When stock is short nothing is reserved: a 409 whose body has `shortfalls` (chemical,
 * needed, available, unit), and the stockkeepers are e-mailed in a transaction of its own
 * — the release rolled back, the notice must still go.
 * @throws AppError not_found, forbidden, conflict (state, blocking caution, no valid
 *   signature, sign-off required, shortfall).
 */
export async function releasePlan(opts: { labId: string; actorUserId: string; planId: string; appUrl?: string; today?: string }, t?: Transaction): Promise<PlanView> {
  try {
    return await inTransaction(t, (tx) => release(opts, tx));
  } catch (e) {
    if (e instanceof AppError && Array.isArray(e.details?.shortfalls)) await notifyShortfall(opts, e.details.shortfalls as ShortfallLine[]);
    throw e;
  }
}

async function release(opts: { labId: string; actorUserId: string; planId: string; appUrl?: string; today?: string }, tx: Transaction): Promise<PlanView> {
  const { plan, move } = await lockPlanForMove({ ...opts, action: "release" }, tx);
  const evaluation = await evaluateStoredPlan({ labId: opts.labId, document: plan.document }, tx);
  refuseUnready(evaluation, move);
  if (move.guards.includes("valid_signature")) {
    const signature = await latestSignature({ labId: opts.labId, planId: plan.id }, tx);
    refuseWithoutApproval(hasValidApproval(signature, { contentHash: plan.contentHash, signatureId: plan.signatureId ?? null }));
  }
  if (move.guards.includes("no_sign_off_required")) refuseSignOffRequired(evaluation, plan.state);

  const requirements = planRequirements(plan.document, evaluation.runSheet!);
  let reserved = 0;
  if (requirements.length > 0) {
    const availability = await checkAvailability(
      { labId: opts.labId, input: { requirements: requirements.map(({ chemicalId, amount, unit, label }) => ({ chemicalId, amount, unit, label })) }, today: opts.today, lock: true },
      tx,
    );
    const shortfalls = shortfallLines(requirements, availability.lines);
    if (shortfalls.length > 0) {
      throw new AppError(
        "conflict",
        `Not enough stock to release this plan: ${shortfalls.map((s) => `${s.name} (${s.needed.toPrecision(4)} ${s.unit} needed, ${s.available.toPrecision(4)} ${s.unit} available)`).join("; ")}. Nothing was reserved; the stockkeepers have been told.`,
        shortfalls.map((s) => ({ path: "shortfalls", message: `${s.name}: short` })),
        { shortfalls },
      );
    }
    const lines = availability.lines.flatMap((l) => l.picks.filter((p) => BigInt(p.amountBase) > 0n).map((p) => ({ containerId: p.containerId, ...pickAmount(BigInt(p.amountBase), p.dimension) })));
    if (lines.length > 0) {
      const rows = await reserveStock({ labId: opts.labId, actorUserId: opts.actorUserId, planId: plan.id, input: { planRef: planRefOf(plan), note: `Release of plan ${plan.id}`, lines } }, tx);
      reserved = rows.length;
    }
  }

  await applyMove({ labId: opts.labId, actorUserId: opts.actorUserId, plan, move, details: { reservations: reserved, signatureId: plan.signatureId ?? null } }, tx);
  const author = await User.findByPk(plan.authorId, { attributes: ["email"], transaction: tx });
  if (author) await enqueueMail({ to: author.email, render: "plan-released", input: { labId: opts.labId, planId: plan.id, appUrl: opts.appUrl } }, tx);
  return fullPlanView(plan, evaluation, tx);
}

/** Tells the stockkeepers (`stock.manage`) what a release found short, in a transaction of its own. */
async function notifyShortfall(opts: { labId: string; actorUserId: string; planId: string; appUrl?: string }, shortfalls: ShortfallLine[]): Promise<void> {
  await transaction(async (t) => {
    const lab = await labOf(opts.labId, t);
    const actor = await User.findByPk(opts.actorUserId, { attributes: ["name"], transaction: t });
    const plan = await Plan.findOne({ where: { id: opts.planId, labId: opts.labId }, attributes: ["id", "name", "studyId"], transaction: t });
    if (!plan) return;
    const mail = shortfallMail({
      labName: lab.name,
      planName: plan.name,
      requestedBy: actor?.name ?? "Someone",
      shortfalls,
      link: appLink(planPaths.plan(lab.slug, plan.studyId, plan.id), opts.appUrl),
    });
    for (const keeper of await membersWith({ labId: opts.labId, permission: "stock.manage" }, t)) await enqueueMail({ to: keeper.email, ...mail }, t);
  });
}
