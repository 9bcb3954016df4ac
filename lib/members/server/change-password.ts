import "server-only";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { changePasswordSchema } from "@/lib/members/schemas";
import { hashPassword, verifyPassword } from "@/lib/auth/authenticate";
import { audit } from "@/lib/server/audit";
import { User } from "@/lib/server/models";

/** Changes the signed-in user's password after checking the current one; audited (no hashes logged). */
export async function changePassword(opts: { userId: string; input: unknown }) {
  const { currentPassword, newPassword } = parseOrThrow(changePasswordSchema, opts.input);
  const user = await User.findByPk(opts.userId);
  if (!user) throw new AppError("unauthenticated", "Sign in first.");
  if (!user.passwordHash || !(await verifyPassword(currentPassword, user.passwordHash))) {
    throw new AppError("invalid_input", "The current password is wrong.", [{ path: "currentPassword", message: "wrong password" }]);
  }
  await user.update({ passwordHash: await hashPassword(newPassword), passwordChangedAt: new Date() });
  await audit({ labId: null, actorUserId: user.id, action: "user.password_changed", entityType: "user", entityId: user.id });
  return { ok: true };
}
