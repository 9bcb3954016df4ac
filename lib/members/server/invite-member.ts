import "server-only";
import { createHash, randomBytes } from "node:crypto";
import type { Transaction } from "sequelize";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { inviteMemberSchema } from "@/lib/members/schemas";
import { inTransaction } from "@/lib/server/db";
import { audit } from "@/lib/server/audit";
import { enqueueMail } from "@/lib/jobs/mail/enqueue-mail";
import { Invitation, Lab, Membership, User } from "@/lib/server/models";

export const INVITATION_DAYS = 7;

export function hashToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

/**
 * Invites someone to a lab by e-mail with a role: stores the hash of a random token,
 * audits it, and queues (in the same transaction) the e-mail with a link where the invitee
 * sets a password; the job worker sends it. Refuses (conflict) an address that is already
 * a member. In the caller's transaction `t` when given (the mail is queued in it too, so
 * it is sent only if the caller commits).
 */
export async function inviteMember(opts: { labId: string; actorUserId: string; appUrl: string; input: unknown }, t?: Transaction) {
  const { email, role } = parseOrThrow(inviteMemberSchema, opts.input);
  const token = randomBytes(32).toString("base64url");
  const link = `${opts.appUrl.replace(/\/$/, "")}/invite/${token}`;
  const { invitation } = await inTransaction(t, async (t) => {
    const lab = await Lab.findByPk(opts.labId, { transaction: t });
    if (!lab) throw new AppError("not_found", "No such lab.");
    const existing = await User.findOne({ where: { email }, transaction: t });
    if (existing && (await Membership.findOne({ where: { labId: opts.labId, userId: existing.id }, transaction: t }))) {
      throw new AppError("conflict", `${email} is already a member of ${lab.name}.`, [{ path: "email", message: "already a member" }]);
    }
    const invitation = await Invitation.create(
      { labId: opts.labId, email, role, tokenHash: hashToken(token), invitedBy: opts.actorUserId, expiresAt: new Date(Date.now() + INVITATION_DAYS * 86_400_000), acceptedAt: null },
      { transaction: t },
    );
    await audit({ labId: opts.labId, actorUserId: opts.actorUserId, action: "invitation.created", entityType: "invitation", entityId: invitation.id, after: { email, role } }, t);
    await enqueueMail({ to: email, render: "invitation", input: { labName: lab.name, role, link, validDays: INVITATION_DAYS } }, t);
    return { invitation };
  });
  return { id: invitation.id, email, role, expiresAt: invitation.expiresAt.toISOString() };
}
