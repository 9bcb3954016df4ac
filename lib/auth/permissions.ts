/**
 * Permissions are data: every `resource.action` that exists, and which roles hold it.
 * Pages, route handlers and server actions all ask `can(role, permission)` (through
 * `requireLabAccess` in lib/auth/access.ts); nothing else decides.
 */
import type { Role } from "./roles";

export const PERMISSIONS = [
  "lab.read", // see the lab and its records at all
  "members.read", // see who is in the lab
  "members.manage", // invite, change roles, remove members
  "audit.read", // read the lab's audit log
  "chemicals.read", // see the chemical catalogue
  "chemicals.manage", // add and edit chemicals, upload safety data sheets
  "stock.read", // see containers, locations, the ledger, reservations and shortfalls
  "stock.manage", // receive, adjust, import and export containers; release stale reservations
  "tokens.manage", // create, list and revoke the lab's API tokens
] as const;
export type Permission = (typeof PERMISSIONS)[number];

const ALL_READ: Permission[] = ["lab.read", "members.read", "chemicals.read", "stock.read"];

export const ROLE_PERMISSIONS: Record<Role, readonly Permission[]> = {
  chemist: [...ALL_READ],
  safety_officer: [...ALL_READ, "audit.read"],
  stockkeeper: [...ALL_READ, "chemicals.manage", "stock.manage"],
  lab_admin: [...ALL_READ, "members.manage", "audit.read", "chemicals.manage", "stock.manage", "tokens.manage"],
  viewer: [...ALL_READ, "audit.read"],
};

/** Whether `role` holds `permission`. */
export function can(role: Role, permission: Permission): boolean {
  return ROLE_PERMISSIONS[role].includes(permission);
}

/** Whether `role` holds every permission of `other` (a role never hands out more than it holds). */
export function covers(role: Role, other: Role): boolean {
  return ROLE_PERMISSIONS[other].every((p) => can(role, p));
}
