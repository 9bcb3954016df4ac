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
  "studies.read", // see the lab's studies
  "studies.manage", // create, edit and archive studies
  "plans.read", // see plans, their run sheets and cautions
  "plans.edit", // create, edit, duplicate and delete draft plans; submit them for review
  "plans.review", // approve, request changes or reject a plan under review (e-signature)
  "plans.release", // release a plan (reserve its stock) or cancel it
  "plans.execute", // mark a released plan running, enter its results, close it
  "settings.read", // see the lab's settings (vessels, blocks, dispensing limits, thresholds)
  "settings.equipment", // edit vessel types, heating and cooling blocks and dispensing limits
  "settings.thresholds", // edit the hazard thresholds
  "tokens.manage", // create, list and revoke the lab's API tokens
] as const;
export type Permission = (typeof PERMISSIONS)[number];

const ALL_READ: Permission[] = ["lab.read", "members.read", "chemicals.read", "stock.read", "studies.read", "plans.read", "settings.read"];
/** What chemists and lab admins do with studies and plans (PRODUCT.md "People and roles"). */
const PLANNING: Permission[] = ["studies.manage", "plans.edit", "plans.release", "plans.execute"];

export const ROLE_PERMISSIONS: Record<Role, readonly Permission[]> = {
  chemist: [...ALL_READ, ...PLANNING],
  safety_officer: [...ALL_READ, "audit.read", "plans.review", "settings.thresholds"],
  stockkeeper: [...ALL_READ, "chemicals.manage", "stock.manage"],
  lab_admin: [...ALL_READ, "members.manage", "audit.read", "chemicals.manage", "stock.manage", "tokens.manage", ...PLANNING, "settings.equipment"],
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
