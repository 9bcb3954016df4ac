import "server-only";
import { Op, type Transaction } from "sequelize";
import { ROLES } from "@/lib/auth/roles";
import { can, type Permission } from "@/lib/auth/permissions";
import { serverEnv } from "@/lib/server/env";
import { Lab, Membership, User } from "@/lib/server/models";

/** The lab's name and slug (for a mail's wording and links). */
export async function labOf(labId: string, t?: Transaction): Promise<{ name: string; slug: string }> {
  const lab = await Lab.findByPk(labId, { attributes: ["name", "slug"], transaction: t });
  return { name: lab?.name ?? "your lab", slug: lab?.slug ?? "" };
}

/**
 * The members of the lab whose role holds `permission` (lib/auth/permissions.ts): who a
 * notification goes to — `plans.review` for the safety officers, `stock.manage` for the
 * stockkeepers. Sorted by e-mail; `except` leaves someone out.
 */
export async function membersWith(opts: { labId: string; permission: Permission; except?: string }, t?: Transaction): Promise<Array<{ id: string; email: string; name: string }>> {
  const roles = ROLES.filter((r) => can(r, opts.permission));
  const rows = await Membership.findAll({
    where: { labId: opts.labId, role: { [Op.in]: roles } },
    include: [{ model: User, as: "user", required: true, attributes: ["id", "email", "name"] }],
    transaction: t,
  });
  return rows
    .map((m) => ({ id: m.user!.id, email: m.user!.email, name: m.user!.name }))
    .filter((u) => u.id !== opts.except)
    .sort((a, b) => a.email.localeCompare(b.email));
}

/** An absolute link into the app (`APP_URL` + path). */
export function appLink(path: string, appUrl?: string): string {
  return `${(appUrl ?? serverEnv().APP_URL).replace(/\/+$/, "")}${path}`;
}
