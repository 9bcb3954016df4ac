import "server-only";
import type { Transaction } from "sequelize";
import { AppError } from "@/lib/errors/app-error";
import { inTransaction } from "@/lib/server/db";
import { audit } from "@/lib/server/audit";
import { Membership } from "@/lib/server/models";
import { assertAnotherAdmin } from "./change-member-role";

/** Removes a member from a lab (their account stays), audited. Never the last lab admin. In the caller's transaction `t` when given. */
export async function removeMember(opts: { labId: string; actorUserId: string; membershipId: string }, t?: Transaction) {
  return inTransaction(t, async (t) => {
    const m = await Membership.findOne({ where: { id: opts.membershipId, labId: opts.labId }, transaction: t, lock: t.LOCK.UPDATE });
    if (!m) throw new AppError("not_found", "No such member in this lab.");
    if (m.role === "lab_admin") await assertAnotherAdmin(opts.labId, m.id, t);
    const before = { userId: m.userId, role: m.role };
    await m.destroy({ transaction: t });
    await audit({ labId: opts.labId, actorUserId: opts.actorUserId, action: "membership.removed", entityType: "membership", entityId: m.id, before, after: null }, t);
    return { id: m.id };
  });
}
