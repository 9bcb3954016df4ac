/**
 * The lab's navigation: only sections that exist, each shown to the roles whose
 * permission it needs. Entries are single links or menus of links (a menu is shown only
 * when the role may open at least one of its links). Later features add their entries
 * here: Studies, Plans and Review sit between Overview and Inventory; lab settings grow
 * inside the Settings menu.
 */
import { can, type Permission } from "./auth/permissions";
import type { Role } from "./auth/roles";

export interface NavItem {
  label: string;
  /** Path below /labs/[lab]; "" is the lab's overview. */
  path: string;
  permission: Permission;
}

export interface NavMenu {
  label: string;
  items: readonly NavItem[];
}

export type NavEntry = NavItem | NavMenu;

export const isNavMenu = (entry: NavEntry): entry is NavMenu => "items" in entry;

/** The lab settings pages (under /settings, plus members): the settings overview for everyone (read-only for most), members and tokens for lab admins. */
export const SETTINGS_NAV: NavMenu = {
  label: "Settings",
  items: [
    { label: "Lab settings", path: "/settings", permission: "settings.read" },
    { label: "Members", path: "/members", permission: "members.manage" },
    { label: "API tokens", path: "/settings/tokens", permission: "tokens.manage" },
  ],
};

export const LAB_NAV: readonly NavEntry[] = [
  { label: "Overview", path: "", permission: "lab.read" },
  { label: "Studies", path: "/studies", permission: "studies.read" },
  { label: "Review", path: "/review", permission: "plans.review" },
  {
    label: "Inventory",
    items: [
      { label: "Containers", path: "/inventory/containers", permission: "stock.read" },
      { label: "Chemicals", path: "/inventory/chemicals", permission: "chemicals.read" },
      { label: "Reservations", path: "/inventory/reservations", permission: "stock.read" },
      { label: "Shortfalls", path: "/inventory/alerts", permission: "stock.read" },
      { label: "Import CSV", path: "/inventory/import", permission: "stock.manage" },
    ],
  },
  { label: "Audit log", path: "/audit", permission: "audit.read" },
  SETTINGS_NAV,
];

/** The entries `role` sees, menus trimmed to the links it may open (empty menus dropped). */
export function navMenuFor(role: Role, entries: readonly NavEntry[] = LAB_NAV): NavEntry[] {
  return entries.flatMap((entry): NavEntry[] => {
    if (!isNavMenu(entry)) return can(role, entry.permission) ? [entry] : [];
    const items = entry.items.filter((item) => can(role, item.permission));
    return items.length ? [{ label: entry.label, items }] : [];
  });
}

/** Every link `role` may open, menus flattened, in navigation order. */
export function navFor(role: Role): NavItem[] {
  return navMenuFor(role).flatMap((entry) => (isNavMenu(entry) ? [...entry.items] : [entry]));
}
