import "server-only";
import { Op, type Transaction } from "sequelize";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { acceptInvitationSchema } from "@/lib/members/schemas";
import { hashPassword } from "@/lib/auth/authenticate";
import { inTransaction } from "@/lib/server/db";
import { audit } from "@/lib/server/audit";
import { Invitation, Lab, Membership, User } from "@/lib/server/models";
import { hashToken } from "./invite-member";

async function openInvitation(token: string, t?: Transaction) {
  const inv = await Invitation.findOne({
    where: { tokenHash: hashToken(token), acceptedAt: null, expiresAt: { [Op.gt]: new Date() } },
    include: [{ model: Lab, as: "lab", required: true }],
    transaction: t,
    lock: t ? { level: t.LOCK.UPDATE, of: Invitation } : undefined,
  });
  if (!inv) throw new AppError("not_found", "This invitation link is not valid: it may have expired or been used. Ask your lab admin for a new one.");
  return inv;
}

/** What the invitation page shows before the invitee accepts. */
export async function describeInvitation(token: string, t?: Transaction) {
  const inv = await openInvitation(token, t);
  return { email: inv.email, role: inv.role, labName: inv.lab!.name, labSlug: inv.lab!.slug };
}

/**
 * Accepts an invitation: creates the account (or sets the password of an account that
 * has none), adds the membership, marks the invitation used; audited. In the caller's
 * transaction `t` when given.
 */
export async function acceptInvitation(opts: { token: string; input: unknown }, t?: Transaction) {
  const { name, password } = parseOrThrow(acceptInvitationSchema, opts.input);
  const passwordHash = await hashPassword(password);
  return inTransaction(t, async (t) => {
    const inv = await openInvitation(opts.token, t);
    let user = await User.findOne({ where: { email: inv.email }, transaction: t, lock: t.LOCK.UPDATE });
    if (!user) {
      user = await User.create({ email: inv.email, name, passwordHash, passwordChangedAt: new Date() }, { transaction: t });
    } else if (!user.passwordHash) {
      await user.update({ name, passwordHash, passwordChangedAt: new Date() }, { transaction: t });
    }
    const membership = await Membership.findOne({ where: { labId: inv.labId, userId: user.id }, transaction: t, lock: t.LOCK.UPDATE });
    const m = membership ?? (await Membership.create({ labId: inv.labId, userId: user.id, role: inv.role }, { transaction: t }));
    await inv.update({ acceptedAt: new Date() }, { transaction: t });
    await audit({ labId: inv.labId, actorUserId: user.id, action: "membership.created", entityType: "membership", entityId: m.id, after: { userId: user.id, role: m.role, via: "invitation" } }, t);
    return { email: user.email, labSlug: inv.lab!.slug };
  });
}
