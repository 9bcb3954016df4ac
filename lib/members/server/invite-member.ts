import "server-only";
import { createHash, randomBytes } from "node:crypto";
import type { Transaction } from "sequelize";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { inviteMemberSchema } from "@/lib/members/schemas";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { inTransaction } from "@/lib/server/db";
import { audit } from "@/lib/server/audit";
import { sendMail } from "@/lib/server/mail";
import { Invitation, Lab, Membership, User } from "@/lib/server/models";

export const INVITATION_DAYS = 7;

export function hashToken(token: string): string {
  return createHash("sha256").update(token).digest("hex");
}

/**
 * Invites someone to a lab by e-mail with a role: stores the hash of a random token,
 * audits it, and mails a link where the invitee sets a password. Refuses (conflict)
 * an address that is already a member. The records are written in the caller's
 * transaction `t` when given.
 */
export async function inviteMember(opts: { labId: string; actorUserId: string; appUrl: string; input: unknown }, t?: Transaction) {
  const { email, role } = parseOrThrow(inviteMemberSchema, opts.input);
  const token = randomBytes(32).toString("base64url");
  const { invitation, lab } = await inTransaction(t, async (t) => {
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
    return { invitation, lab };
  });
  const link = `${opts.appUrl.replace(/\/$/, "")}/invite/${token}`;
  await sendMail({
    to: email,
    subject: `You are invited to ${lab.name} on Tareline`,
    text: [
      `You have been invited to join ${lab.name} on Tareline as ${ROLE_LABELS[role].toLowerCase()}.`,
      "",
      `Open this link to set your password and join (valid for ${INVITATION_DAYS} days):`,
      link,
      "",
      "If you did not expect this, ignore this message.",
    ].join("\n"),
  });
  return { id: invitation.id, email, role, expiresAt: invitation.expiresAt.toISOString() };
}
