import "server-only";
import { randomBytes } from "node:crypto";
import bcrypt from "bcryptjs";
import { Op, QueryTypes } from "sequelize";
import { AppError, parseOrThrow } from "@/lib/errors/app-error";
import { db, transaction } from "@/lib/server/db";
import { SignInAttempt, User } from "@/lib/server/models";
import { signInSchema } from "@/lib/members/schemas";

/** The lockout rule: this many failures in a row within the window refuse further attempts. */
export const LOCKOUT = { maxFailures: 10, windowMinutes: 15 } as const;

/** The bcrypt cost the project uses everywhere. */
const BCRYPT_COST = 10;

export interface AuthenticatedUser {
  id: string;
  email: string;
  name: string;
  /** Carried in the session token; a password change raises it (lib/auth/options.ts). */
  sessionVersion: number;
}

/**
 * A hash of a random secret at the project's cost, made once per process: an unknown
 * e-mail (or an account without a password) is checked against it, so a sign-in takes as
 * long whether or not the address exists.
 */
let dummyHash: Promise<string> | undefined;
function dummy(): Promise<string> {
  dummyHash ??= bcrypt.hash(randomBytes(16).toString("hex"), BCRYPT_COST);
  return dummyHash;
}

/**
 * Step one of a sign-in, under a transaction-scoped advisory lock on the e-mail (so
 * parallel attempts for one account are counted one after another): refuses when the
 * last LOCKOUT.maxFailures attempts in the window all failed, otherwise records this
 * attempt as a failure and returns its id. The password is checked after the lock is
 * released (bcrypt is slow; no connection waits on it), and the attempt is marked
 * succeeded only when it was right. So 30 parallel wrong passwords record 10 failures
 * and the other 20 are refused.
 */
async function admitAttempt(email: string, now: Date): Promise<string> {
  return transaction(async (t) => {
    await db().query("SELECT pg_advisory_xact_lock(hashtextextended(:key, 0))", { replacements: { key: `sign-in:${email}` }, type: QueryTypes.SELECT, transaction: t });
    const windowStart = new Date(now.getTime() - LOCKOUT.windowMinutes * 60_000);
    const recent = await SignInAttempt.findAll({
      where: { email, createdAt: { [Op.gte]: windowStart } },
      order: [["createdAt", "DESC"], ["id", "DESC"]],
      limit: LOCKOUT.maxFailures,
      transaction: t,
    });
    if (recent.length >= LOCKOUT.maxFailures && recent.every((a) => !a.succeeded)) {
      const oldest = recent[recent.length - 1]!;
      const until = new Date(oldest.createdAt.getTime() + LOCKOUT.windowMinutes * 60_000);
      throw new AppError(
        "rate_limited",
        `Too many failed sign-in attempts for this account. Try again after ${until.toISOString().slice(11, 16)} UTC, or ask your lab admin.`,
      );
    }
    const attempt = await SignInAttempt.create({ email, succeeded: false, createdAt: now }, { transaction: t });
    return String(attempt.id);
  });
}

/**
 * Checks an e-mail and password. After LOCKOUT.maxFailures failed attempts for one
 * account within LOCKOUT.windowMinutes, refuses further attempts (rate_limited) until the
 * oldest of those failures leaves the window; refused attempts are not counted. Counting
 * and recording happen under a lock on the e-mail, so parallel attempts cannot pass the
 * limit. Unknown e-mails cost the same bcrypt work as known ones.
 * Throws AppError unauthenticated for a wrong e-mail or password (same message for both).
 */
export async function authenticate(input: unknown, now: Date = new Date()): Promise<AuthenticatedUser> {
  const { email, password } = parseOrThrow(signInSchema, input);
  const attemptId = await admitAttempt(email, now);
  const user = await User.findOne({ where: { email } });
  const hash = user?.passwordHash ?? (await dummy());
  const matches = await bcrypt.compare(password, hash);
  const ok = matches && !!user?.passwordHash;
  if (!user || !ok) throw new AppError("unauthenticated", "Wrong e-mail or password.");
  await SignInAttempt.update({ succeeded: true }, { where: { id: attemptId } });
  return { id: user.id, email: user.email, name: user.name, sessionVersion: user.sessionVersion };
}

/**
 * Checks the password of a signed-in user who enters it again (the e-signature of a plan
 * review), under the same lockout as sign-in and counted with it: the attempt is recorded
 * against the user's e-mail first (in a transaction of its own, so a failure counts even
 * when the caller's flow stops there), and after LOCKOUT.maxFailures failures in the
 * window further attempts are refused (rate_limited), for sign-in too.
 * @throws AppError invalid_input naming `field` (default `password`) when it is wrong,
 *   rate_limited when locked out, unauthenticated when the user is gone.
 */
export async function confirmPassword(opts: { userId: string; password: string; field?: string }, now: Date = new Date()): Promise<void> {
  const user = await User.findByPk(opts.userId);
  if (!user) throw new AppError("unauthenticated", "Sign in first.");
  const attemptId = await admitAttempt(user.email, now);
  const matches = await bcrypt.compare(opts.password, user.passwordHash ?? (await dummy()));
  if (!matches || !user.passwordHash) {
    const field = opts.field ?? "password";
    throw new AppError("invalid_input", "The password is wrong; enter your own password to sign.", [{ path: field, message: "wrong password" }]);
  }
  await SignInAttempt.update({ succeeded: true }, { where: { id: attemptId } });
}

/** A bcrypt hash at the cost the project uses everywhere. */
export function hashPassword(password: string): Promise<string> {
  return bcrypt.hash(password, BCRYPT_COST);
}

export function verifyPassword(password: string, hash: string): Promise<boolean> {
  return bcrypt.compare(password, hash);
}
