import "server-only";
import type { Transaction } from "sequelize";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { changePasswordSchema } from "@/lib/members/schemas";
import { hashPassword, verifyPassword } from "@/lib/auth/authenticate";
import { inTransaction } from "@/lib/server/db";
import { audit } from "@/lib/server/audit";
import { User } from "@/lib/server/models";

/**
 * Changes the signed-in user's password after checking the current one, and raises the
 * user's session version so every other session of theirs ends (lib/auth/options.ts
 * checks it on each request); the caller re-issues the current session with the returned
 * version. Audited (no hashes logged). In the caller's transaction `t` when given.
 * @throws AppError invalid_input (wrong current password, weak new one), unauthenticated.
 */
export async function changePassword(opts: { userId: string; input: unknown }, t?: Transaction): Promise<{ ok: true; sessionVersion: number }> {
  const { currentPassword, newPassword } = parseOrThrow(changePasswordSchema, opts.input);
  const passwordHash = await hashPassword(newPassword);
  return inTransaction(t, async (t) => {
    const user = await User.findByPk(opts.userId, { transaction: t, lock: t.LOCK.UPDATE });
    if (!user) throw new AppError("unauthenticated", "Sign in first.");
    if (!user.passwordHash || !(await verifyPassword(currentPassword, user.passwordHash))) {
      throw new AppError("invalid_input", "The current password is wrong.", [{ path: "currentPassword", message: "wrong password" }]);
    }
    await user.update({ passwordHash, passwordChangedAt: new Date(), sessionVersion: user.sessionVersion + 1 }, { transaction: t });
    await audit({ labId: null, actorUserId: user.id, action: "user.password_changed", entityType: "user", entityId: user.id, after: { otherSessionsEnded: true } }, t);
    return { ok: true as const, sessionVersion: user.sessionVersion };
  });
}
