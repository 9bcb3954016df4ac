/**
 * What the state table (lib/plans/states.ts) says about actions, for route handlers and
 * pages (pure): the permission an action takes, and the actions a role may take on a plan
 * in a given state. Derived from PLAN_MOVES, so nothing here can disagree with the table.
 */
import { can, type Permission } from "../auth/permissions";
import type { Role } from "../auth/roles";
import { PLAN_MOVES, type PlanAction, type PlanMove, type PlanState } from "./states";

/**
 * The permission `action` needs (the same from every state the table allows it from).
 * @throws Error when the table gives one action two permissions (a bug in the table).
 */
export function actionPermission(action: PlanAction): Permission {
  const permissions = [...new Set(PLAN_MOVES.filter((m) => m.action === action).map((m) => m.permission))];
  if (permissions.length !== 1) throw new Error(`lib/plans/states.ts: the action ${action} has ${permissions.length} permissions`);
  return permissions[0]!;
}

/** The moves from `state` that `role` holds the permission for (edits are made in the editor, not as a move). */
export function movesFor(state: PlanState, role: Role): PlanMove[] {
  return PLAN_MOVES.filter((m) => m.from === state && m.action !== "edit" && can(role, m.permission));
}
