import { describe, expect, it } from "vitest";
import { PERMISSIONS, can, type Permission } from "@/lib/auth/permissions";
import { ROLES, type Role } from "@/lib/auth/roles";
import { isNavMenu, navFor, navMenuFor } from "@/lib/navigation";

/**
 * The expected table, written out by hand from the roles in ../shared/PRODUCT.md
 * ("People and roles"): a viewer reads everything and changes nothing; a lab admin
 * manages members and API tokens; a stockkeeper manages the catalogue and containers; a safety officer
 * and an auditor-viewer read the audit log. If a permission is added to lib/auth/permissions.ts
 * without a row here, the "covers every permission" test fails.
 */
const EXPECTED: Record<Permission, Role[]> = {
  "lab.read": ["chemist", "safety_officer", "stockkeeper", "lab_admin", "viewer"],
  "members.read": ["chemist", "safety_officer", "stockkeeper", "lab_admin", "viewer"],
  "members.manage": ["lab_admin"],
  "audit.read": ["safety_officer", "lab_admin", "viewer"],
  "chemicals.read": ["chemist", "safety_officer", "stockkeeper", "lab_admin", "viewer"],
  "chemicals.manage": ["stockkeeper", "lab_admin"],
  "stock.read": ["chemist", "safety_officer", "stockkeeper", "lab_admin", "viewer"],
  "stock.manage": ["stockkeeper", "lab_admin"],
  // Studies, plans and lab settings (issue 10): chemists and lab admins plan; everyone reads;
  // safety officers review and edit the hazard thresholds; lab admins edit equipment and limits.
  "studies.read": ["chemist", "safety_officer", "stockkeeper", "lab_admin", "viewer"],
  "studies.manage": ["chemist", "lab_admin"],
  "plans.read": ["chemist", "safety_officer", "stockkeeper", "lab_admin", "viewer"],
  "plans.edit": ["chemist", "lab_admin"],
  "plans.review": ["safety_officer"],
  "plans.release": ["chemist", "lab_admin"],
  "plans.execute": ["chemist", "lab_admin"],
  "settings.read": ["chemist", "safety_officer", "stockkeeper", "lab_admin", "viewer"],
  "settings.equipment": ["lab_admin"],
  "settings.thresholds": ["safety_officer"],
  "tokens.manage": ["lab_admin"],
};

describe("permission table", () => {
  it("covers every permission that exists", () => {
    expect(Object.keys(EXPECTED).sort()).toEqual([...PERMISSIONS].sort());
  });

  for (const permission of PERMISSIONS) {
    for (const role of ROLES) {
      const expected = EXPECTED[permission].includes(role);
      it(`${role} ${expected ? "holds" : "does not hold"} ${permission}`, () => {
        expect(can(role, permission)).toBe(expected);
      });
    }
  }

  it("a viewer changes nothing: holds no *.manage permission", () => {
    expect(PERMISSIONS.filter((p) => p.endsWith(".manage") && can("viewer", p))).toEqual([]);
  });

  it("navigation shows only sections the role may open", () => {
    for (const role of ROLES) {
      for (const item of navFor(role)) expect(can(role, item.permission)).toBe(true);
    }
    expect(navFor("chemist").map((n) => n.label)).not.toContain("Members");
    expect(navFor("lab_admin").map((n) => n.label)).toContain("Members");
    expect(navFor("lab_admin").map((n) => n.label)).toContain("API tokens");
  });

  it("the header groups inventory pages in one menu and shows a menu only when one of its links may be opened", () => {
    const top = (role: (typeof ROLES)[number]) => navMenuFor(role).map((e) => (isNavMenu(e) ? `${e.label} ▾` : e.label));
    expect(top("chemist")).toEqual(["Overview", "Studies", "Inventory ▾", "Settings ▾"]);
    expect(top("viewer")).toEqual(["Overview", "Studies", "Inventory ▾", "Audit log", "Settings ▾"]);
    expect(top("lab_admin")).toEqual(["Overview", "Studies", "Inventory ▾", "Audit log", "Settings ▾"]);
    // Everyone opens the lab settings overview (read-only unless the role edits a section); members and tokens are the lab admin's.
    expect(navMenuFor("chemist").filter(isNavMenu).find((m) => m.label === "Settings")!.items.map((i) => i.label)).toEqual(["Lab settings"]);
    const inventory = navMenuFor("chemist").find(isNavMenu)!;
    expect(inventory.items.map((i) => i.label)).toEqual(["Containers", "Chemicals", "Reservations", "Shortfalls"]);
    const stockkeeper = navMenuFor("stockkeeper").find(isNavMenu)!;
    expect(stockkeeper.items.map((i) => i.label)).toContain("Import CSV");
  });
});
