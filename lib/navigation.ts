/**
 * The lab's navigation: only sections that exist, each shown to the roles whose
 * permission it needs. Later features add their entries here.
 */
import { can, type Permission } from "./auth/permissions";
import type { Role } from "./auth/roles";

export interface NavItem {
  label: string;
  /** Path below /labs/[lab]; "" is the lab's overview. */
  path: string;
  permission: Permission;
}

export const LAB_NAV: readonly NavItem[] = [
  { label: "Overview", path: "", permission: "lab.read" },
  { label: "Studies", path: "/studies", permission: "studies.read" },
  { label: "Containers", path: "/inventory/containers", permission: "stock.read" },
  { label: "Chemicals", path: "/inventory/chemicals", permission: "chemicals.read" },
  { label: "Reservations", path: "/inventory/reservations", permission: "stock.read" },
  { label: "Shortfalls", path: "/inventory/alerts", permission: "stock.read" },
  { label: "Members", path: "/members", permission: "members.manage" },
  { label: "Audit log", path: "/audit", permission: "audit.read" },
  { label: "Settings", path: "/settings", permission: "settings.read" },
];

export function navFor(role: Role): NavItem[] {
  return LAB_NAV.filter((item) => can(role, item.permission));
}
