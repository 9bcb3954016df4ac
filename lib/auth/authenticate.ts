import "server-only";
import bcrypt from "bcryptjs";
import { Op } from "sequelize";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { SignInAttempt, User } from "@/lib/server/models";
import { signInSchema } from "@/lib/members/schemas";

/** The lockout rule: this many failures in a row within the window refuse further attempts. */
export const LOCKOUT = { maxFailures: 10, windowMinutes: 15 } as const;

export interface AuthenticatedUser {
  id: string;
  email: string;
  name: string;
}

/**
 * Checks an e-mail and password. After LOCKOUT.maxFailures failed attempts for one
 * account within LOCKOUT.windowMinutes, refuses further attempts (rate_limited) until the
 * oldest of those failures leaves the window; refused attempts are not counted.
 * Throws AppError unauthenticated for a wrong e-mail or password (same message for both).
 */
export async function authenticate(input: unknown, now: Date = new Date()): Promise<AuthenticatedUser> {
  const { email, password } = parseOrThrow(signInSchema, input);
  const windowStart = new Date(now.getTime() - LOCKOUT.windowMinutes * 60_000);
  const recent = await SignInAttempt.findAll({
    where: { email, createdAt: { [Op.gte]: windowStart } },
    order: [["createdAt", "DESC"], ["id", "DESC"]],
    limit: LOCKOUT.maxFailures,
  });
  if (recent.length >= LOCKOUT.maxFailures && recent.every((a) => !a.succeeded)) {
    const oldest = recent[recent.length - 1]!;
    const until = new Date(oldest.createdAt.getTime() + LOCKOUT.windowMinutes * 60_000);
    throw new AppError(
      "rate_limited",
      `Too many failed sign-in attempts for this account. Try again after ${until.toISOString().slice(11, 16)} UTC, or ask your lab admin.`,
    );
  }
  const user = await User.findOne({ where: { email } });
  const ok = user?.passwordHash ? await bcrypt.compare(password, user.passwordHash) : false;
  await SignInAttempt.create({ email, succeeded: ok, createdAt: now });
  if (!user || !ok) throw new AppError("unauthenticated", "Wrong e-mail or password.");
  return { id: user.id, email: user.email, name: user.name };
}

/** A bcrypt hash at the cost the project uses everywhere. */
export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, 10);
}

export function verifyPassword(password: string, hash: string): Promise<boolean> {
  return bcrypt.compare(password, hash);
}
