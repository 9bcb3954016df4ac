import "server-only";
import type { Transaction } from "sequelize";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { changeRoleSchema } from "@/lib/members/schemas";
import { inTransaction } from "@/lib/server/db";
import { audit } from "@/lib/server/audit";
import { Membership } from "@/lib/server/models";

/**
 * Changes one member's role in a lab, audited with before and after. The lab always
 * keeps at least one lab admin. Throws not_found for a membership of another lab. In the
 * caller's transaction `t` when given.
 */
export async function changeMemberRole(opts: { labId: string; actorUserId: string; membershipId: string; input: unknown }, t?: Transaction) {
  const { role } = parseOrThrow(changeRoleSchema, opts.input);
  return inTransaction(t, async (t) => {
    const m = await Membership.findOne({ where: { id: opts.membershipId, labId: opts.labId }, transaction: t, lock: t.LOCK.UPDATE });
    if (!m) throw new AppError("not_found", "No such member in this lab.");
    if (m.role === role) return { id: m.id, role };
    if (m.role === "lab_admin") await assertAnotherAdmin(opts.labId, m.id, t);
    const before = { role: m.role };
    m.role = role;
    await m.save({ transaction: t });
    await audit({ labId: opts.labId, actorUserId: opts.actorUserId, action: "membership.role_changed", entityType: "membership", entityId: m.id, before, after: { role } }, t);
    return { id: m.id, role };
  });
}

/** Refuses to leave a lab with no lab admin. */
export async function assertAnotherAdmin(labId: string, exceptMembershipId: string, t: Transaction) {
  const admins = await Membership.findAll({ where: { labId, role: "lab_admin" }, transaction: t, lock: t.LOCK.UPDATE });
  if (!admins.some((a) => a.id !== exceptMembershipId)) {
    throw new AppError("conflict", "A lab needs at least one lab admin: make someone else lab admin first.", [{ path: "role", message: "last lab admin" }]);
  }
}
