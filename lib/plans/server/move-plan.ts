import "server-only";
import type { Transaction } from "sequelize";
import { AppError } from "@/lib/errors/app-error";
import { can } from "@/lib/auth/permissions";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { audit } from "@/lib/server/audit";
import { Membership, type Plan } from "@/lib/server/models";
import { requireMove, type PlanAction, type PlanMove, type PlanState } from "../states";
import { findPlan } from "./common";

/** The audit action of each move (`plan.submitted`, `plan.approved`, …). */
export const MOVE_AUDIT_ACTIONS: Record<PlanAction, string> = {
  submit: "plan.submitted",
  approve: "plan.approved",
  request_changes: "plan.changes_requested",
  reject: "plan.rejected",
  release: "plan.released",
  start: "plan.started",
  enter_results: "plan.results_entered",
  close: "plan.closed",
  edit: "plan.updated",
  cancel: "plan.cancelled",
};

/**
 * The table's rule for who may make `move` (lib/plans/states.ts names the permission;
 * lib/auth/permissions.ts which roles hold it), checked against the actor's role in the
 * lab, so a script calling the operation directly is held to the same rule as the route.
 * @throws AppError forbidden.
 */
export async function requireMovePermission(opts: { labId: string; actorUserId: string; move: PlanMove }, t?: Transaction): Promise<void> {
  const membership = await Membership.findOne({ where: { labId: opts.labId, userId: opts.actorUserId }, attributes: ["role"], transaction: t });
  if (!membership) throw new AppError("forbidden", "You are not a member of this lab.");
  if (!can(membership.role, opts.move.permission)) {
    throw new AppError("forbidden", `A ${ROLE_LABELS[membership.role].toLowerCase()} may not do this (${opts.move.permission}).`, [{ path: "state", message: `${opts.move.action} needs ${opts.move.permission}` }]);
  }
}

/**
 * Step one of every move: locks the plan row (FOR UPDATE, in the caller's transaction),
 * finds the move `action` makes from its state in the one table (409 naming `state` when
 * there is none: nothing has changed) and checks the actor may make it.
 * @throws AppError not_found, conflict, forbidden.
 */
export async function lockPlanForMove(opts: { labId: string; actorUserId: string; planId: string; action: PlanAction }, t: Transaction): Promise<{ plan: Plan; move: PlanMove }> {
  const plan = await findPlan({ labId: opts.labId, planId: opts.planId, lock: true }, t);
  const move = requireMove(plan.state, opts.action);
  await requireMovePermission({ labId: opts.labId, actorUserId: opts.actorUserId, move }, t);
  return { plan, move };
}

/**
 * The last step of every move: the plan takes the move's state and one more version
 * (with any other column changes `set` makes), and the audit log records the state and
 * version before → after with `details`, in the same transaction.
 */
export async function applyMove(
  opts: { labId: string; actorUserId: string; plan: Plan; move: PlanMove; details?: Record<string, unknown>; set?: (plan: Plan) => void },
  t: Transaction,
): Promise<Plan> {
  const { plan, move } = opts;
  const before: { state: PlanState; version: number } = { state: plan.state, version: plan.version };
  plan.state = move.to;
  plan.version = plan.version + 1;
  opts.set?.(plan);
  await plan.save({ transaction: t });
  await audit(
    {
      labId: opts.labId,
      actorUserId: opts.actorUserId,
      action: MOVE_AUDIT_ACTIONS[move.action],
      entityType: "plan",
      entityId: plan.id,
      before,
      after: { state: plan.state, version: plan.version, contentHash: plan.contentHash, ...opts.details },
    },
    t,
  );
  return plan;
}

/**
 * For an operation that records the moves it makes in an audit entry of its own (results
 * entry: one entry with the cells changed and the state before → after): moves the locked
 * `plan` by each of `actions` in turn — every one found in the one table from the state the
 * one before left (409 naming `state` when there is none) and checked against the actor's
 * permission, as `lockPlanForMove` checks a single move — and saves it with one more
 * version when it moved. Nothing is saved when a move is refused.
 * @throws AppError conflict, forbidden.
 */
export async function makeMoves(opts: { labId: string; actorUserId: string; plan: Plan; actions: readonly PlanAction[] }, t: Transaction): Promise<PlanMove[]> {
  const moves: PlanMove[] = [];
  let state: PlanState = opts.plan.state;
  for (const action of opts.actions) {
    const move = requireMove(state, action);
    await requireMovePermission({ labId: opts.labId, actorUserId: opts.actorUserId, move }, t);
    moves.push(move);
    state = move.to;
  }
  if (moves.length > 0) {
    opts.plan.state = state;
    opts.plan.version = opts.plan.version + 1;
    await opts.plan.save({ transaction: t });
  }
  return moves;
}
