/**
 * A plan's states and the moves between them, as data (issue 11 "The plan's states";
 * CONTRACT.md "States"): the one table every operation that changes a plan's state
 * asks, through `findMove` / `requireMove`. Any move not listed here is refused (409).
 *
 *     draft → in_review → approved | changes_requested | rejected
 *     changes_requested → in_review (resubmitted after edits)
 *     approved → released → running → results_entered → closed
 *     draft → released, only when no rule of the lab asks for sign-off
 *     approved → draft, by an edit (the signature is voided)
 *     any state before running → cancelled
 *
 * Each move names the permission it takes (lib/auth/permissions.ts) and the conditions
 * the operation making it must check (`guards`).
 */
import type { Permission } from "../auth/permissions";
import { AppError } from "../errors/app-error";

export const PLAN_STATES = [
  "draft",
  "in_review",
  "changes_requested",
  "approved",
  "rejected",
  "released",
  "running",
  "results_entered",
  "closed",
  "cancelled",
] as const;
export type PlanState = (typeof PLAN_STATES)[number];

export const PLAN_STATE_LABELS: Record<PlanState, string> = {
  draft: "Draft",
  in_review: "In review",
  changes_requested: "Changes requested",
  approved: "Approved",
  rejected: "Rejected",
  released: "Released",
  running: "Running",
  results_entered: "Results entered",
  closed: "Closed",
  cancelled: "Cancelled",
};

/** The actions that move a plan; the review decisions use the names of CONTRACT.md `review`. */
export type PlanAction =
  | "submit"
  | "approve"
  | "request_changes"
  | "reject"
  | "release"
  | "start"
  | "enter_results"
  | "close"
  | "edit"
  | "cancel";

/**
 * Conditions checked by the operation that makes the move (they need the plan's data):
 * - `no_blocking_caution`: no caution of the plan blocks;
 * - `not_author`: the person moving it is not the plan's author (no one signs their own plan);
 * - `password`: the person enters their password again (the e-signature);
 * - `valid_signature`: the plan carries a signature whose content hash equals the plan's;
 * - `no_sign_off_required`: no rule of the lab asks for a safety officer's sign-off;
 * - `stock_reserved`: every component naming a chemical is reserved in the same transaction;
 * - `releases_reservations`: the plan's held reservations are released in the same transaction;
 * - `voids_signature`: the signature no longer applies (the content changed).
 */
export type PlanGuard =
  | "no_blocking_caution"
  | "not_author"
  | "password"
  | "valid_signature"
  | "no_sign_off_required"
  | "stock_reserved"
  | "releases_reservations"
  | "voids_signature";

export interface PlanMove {
  from: PlanState;
  to: PlanState;
  action: PlanAction;
  permission: Permission;
  guards: readonly PlanGuard[];
}

const BEFORE_RUNNING: readonly PlanState[] = ["draft", "in_review", "changes_requested", "approved", "rejected", "released"];

/** Every allowed move. */
export const PLAN_MOVES: readonly PlanMove[] = [
  { from: "draft", to: "in_review", action: "submit", permission: "plans.edit", guards: ["no_blocking_caution"] },
  { from: "changes_requested", to: "in_review", action: "submit", permission: "plans.edit", guards: ["no_blocking_caution"] },
  { from: "in_review", to: "approved", action: "approve", permission: "plans.review", guards: ["not_author", "password", "no_blocking_caution"] },
  { from: "in_review", to: "changes_requested", action: "request_changes", permission: "plans.review", guards: ["not_author", "password"] },
  { from: "in_review", to: "rejected", action: "reject", permission: "plans.review", guards: ["not_author", "password"] },
  { from: "approved", to: "released", action: "release", permission: "plans.release", guards: ["no_blocking_caution", "valid_signature", "stock_reserved"] },
  { from: "draft", to: "released", action: "release", permission: "plans.release", guards: ["no_blocking_caution", "no_sign_off_required", "stock_reserved"] },
  { from: "approved", to: "draft", action: "edit", permission: "plans.edit", guards: ["voids_signature"] },
  { from: "released", to: "running", action: "start", permission: "plans.execute", guards: [] },
  { from: "running", to: "results_entered", action: "enter_results", permission: "plans.execute", guards: [] },
  { from: "results_entered", to: "closed", action: "close", permission: "plans.execute", guards: [] },
  ...BEFORE_RUNNING.map(
    (from): PlanMove => ({ from, to: "cancelled", action: "cancel", permission: "plans.release", guards: from === "released" ? ["releases_reservations"] : [] }),
  ),
];

/**
 * States whose document may be edited, and the state an edit leaves the plan in: a draft
 * stays a draft, a plan sent back for changes stays there until resubmitted, and an
 * edit of an approved plan returns it to draft (the move `approved → draft` above,
 * which voids the signature). Every other state is frozen (409).
 */
export const EDITABLE_STATES: Readonly<Partial<Record<PlanState, PlanState>>> = {
  draft: "draft",
  changes_requested: "changes_requested",
  approved: "draft",
};

/**
 * States whose results may be entered (issue 12; CONTRACT.md `PUT /plans/{plan}/results`):
 * a released plan (its first results move it to running, the move `released → running`),
 * a running one (the result that completes it moves it to results_entered, the move
 * `running → results_entered`), and one whose results are entered, for corrections (it
 * stays there). Every other state refuses results (409).
 */
export const RESULTS_STATES: readonly PlanState[] = ["released", "running", "results_entered"];

/** Only drafts can be deleted; anything further along is cancelled instead, so its history stays. */
export const DELETABLE_STATES: readonly PlanState[] = ["draft"];

/** The move from `from` to `to`, or undefined when there is none. */
export function findMove(from: PlanState, to: PlanState): PlanMove | undefined {
  return PLAN_MOVES.find((m) => m.from === from && m.to === to);
}

/** The move `action` makes from `from`, or undefined. */
export function findMoveByAction(from: PlanState, action: PlanAction): PlanMove | undefined {
  return PLAN_MOVES.find((m) => m.from === from && m.action === action);
}

/**
 * The move `action` makes from `from`.
 * @throws AppError("conflict") naming `state` when the plan's state does not allow it.
 */
export function requireMove(from: PlanState, action: PlanAction): PlanMove {
  const move = findMoveByAction(from, action);
  if (!move) {
    throw new AppError("conflict", `A plan that is ${PLAN_STATE_LABELS[from].toLowerCase()} cannot be ${ACTION_PAST[action]}.`, [
      { path: "state", message: `${from} does not allow ${action}` },
    ]);
  }
  return move;
}

/**
 * The state an edit of a plan in `state` leaves it in.
 * @throws AppError("conflict") naming `state` when a plan in that state cannot be edited.
 */
export function stateAfterEdit(state: PlanState): { state: PlanState; voidsSignature: boolean } {
  const next = EDITABLE_STATES[state];
  if (next === undefined) {
    throw new AppError("conflict", `A plan that is ${PLAN_STATE_LABELS[state].toLowerCase()} cannot be edited; duplicate it to change it.`, [
      { path: "state", message: `${state} is not editable` },
    ]);
  }
  return { state: next, voidsSignature: next !== state && (findMove(state, next)?.guards.includes("voids_signature") ?? false) };
}

const ACTION_PAST: Record<PlanAction, string> = {
  submit: "submitted for review",
  approve: "approved",
  request_changes: "sent back for changes",
  reject: "rejected",
  release: "released",
  start: "started",
  enter_results: "given results",
  close: "closed",
  edit: "edited",
  cancel: "cancelled",
};
