/**
 * Sign-in under attack: the lockout holds for parallel attempts, unknown e-mails cost the
 * same bcrypt work as known ones, and a password change ends the user's other sessions.
 * The lockout rule (10 failures within 15 minutes) is LOCKOUT in lib/auth/authenticate.ts,
 * a common practice (OWASP Authentication Cheat Sheet, "Account lockout").
 */
import { afterAll, afterEach, beforeEach, describe, expect, it, vi } from "vitest";
import bcrypt from "bcryptjs";
import type { User as NextAuthUser } from "next-auth";
import type { JWT } from "next-auth/jwt";
import { SEED } from "../support/integration";
import { authenticate, LOCKOUT } from "@/lib/auth/authenticate";
import { authOptions } from "@/lib/auth/options";
import { changePassword } from "@/lib/members/server/change-password";
import { AppError } from "@/lib/errors/app-error";
import { SignInAttempt, User } from "@/lib/server/models";

async function codeOf(p: Promise<unknown>): Promise<string> {
  try {
    await p;
    return "ok";
  } catch (e) {
    if (e instanceof AppError) return e.code;
    throw e;
  }
}

/** The jwt callback as next-auth calls it on every later request (no `user`). */
async function checkToken(token: JWT): Promise<JWT> {
  const jwt = authOptions.callbacks!.jwt!;
  return jwt({ token, user: undefined as unknown as NextAuthUser, account: null });
}

beforeEach(async () => {
  await SignInAttempt.destroy({ where: {} });
});
afterEach(() => {
  vi.restoreAllMocks();
});
afterAll(async () => {
  await SignInAttempt.destroy({ where: {} }); // leave no account locked for the suites after this one
});

describe("lockout under parallel attempts", () => {
  it(`30 parallel wrong passwords: ${LOCKOUT.maxFailures} are checked and recorded, 20 are refused, and the account is then locked`, async () => {
    const email = SEED.users.safety.email;
    const codes = await Promise.all(Array.from({ length: 30 }, (_, i) => codeOf(authenticate({ email, password: `wrong-${i}` }))));
    expect(codes.filter((c) => c === "unauthenticated")).toHaveLength(LOCKOUT.maxFailures);
    expect(codes.filter((c) => c === "rate_limited")).toHaveLength(30 - LOCKOUT.maxFailures);
    expect(await SignInAttempt.count({ where: { email } })).toBe(LOCKOUT.maxFailures);
    // Locked: even the right password is refused now.
    expect(await codeOf(authenticate({ email, password: SEED.password }))).toBe("rate_limited");
  });
});

describe("sign-in timing does not reveal which e-mails exist", () => {
  it("an unknown e-mail is checked with bcrypt against a hash, like a known one", async () => {
    const compare = vi.spyOn(bcrypt, "compare");
    expect(await codeOf(authenticate({ email: "nobody-here@kestrelbay.example", password: "guess-one" }))).toBe("unauthenticated");
    expect(await codeOf(authenticate({ email: SEED.users.chemist.email, password: "guess-two" }))).toBe("unauthenticated");
    expect(compare).toHaveBeenCalledTimes(2);
    const [unknownCall, knownCall] = compare.mock.calls;
    // Both compared the typed password with a bcrypt hash of the same cost ($2b$10$… or $2a$10$…).
    expect(unknownCall?.[0]).toBe("guess-one");
    expect(String(unknownCall?.[1]).slice(3, 7)).toBe(String(knownCall?.[1]).slice(3, 7));
  });

  it("refuses an e-mail longer than an address can be (RFC 5321: 254 characters in practice), naming the field", async () => {
    const err = await authenticate({ email: `${"a".repeat(300)}@kestrelbay.example`, password: "x" }).catch((e: unknown) => e);
    expect((err as AppError).code).toBe("invalid_input");
    expect((err as AppError).issues.map((i) => i.path)).toEqual(["email"]);
    expect(await SignInAttempt.count()).toBe(0);
  });
});

describe("a password change ends the user's other sessions", () => {
  it("a token issued before the change is emptied by the jwt callback; one with the new session version stays", async () => {
    const email = SEED.users.viewer.email;
    const signedIn = await authenticate({ email, password: SEED.password });
    const oldToken: JWT = { uid: signedIn.id, sv: signedIn.sessionVersion };
    // A good token comes back with the user's current name and e-mail (the session's one read of the user).
    const current = { name: signedIn.name, email: signedIn.email };
    expect(await checkToken(oldToken)).toEqual({ ...oldToken, ...current });
    // Renamed meanwhile: the next request's session has the new name, from the database, not the token.
    await User.update({ name: "Renamed for the test" }, { where: { id: signedIn.id } });
    try {
      expect(await checkToken({ ...oldToken, ...current })).toEqual({ ...oldToken, ...current, name: "Renamed for the test" });
    } finally {
      await User.update({ name: signedIn.name }, { where: { id: signedIn.id } }); // the demo name back for the other suites
    }
    const newPassword = "a-new-password-for-the-test";
    const { sessionVersion } = await changePassword({ userId: signedIn.id, input: { currentPassword: SEED.password, newPassword, confirmPassword: newPassword } });
    expect(sessionVersion).toBe(signedIn.sessionVersion + 1);
    expect(await checkToken(oldToken)).toEqual({});
    expect(await checkToken({ uid: signedIn.id, sv: sessionVersion })).toEqual({ uid: signedIn.id, sv: sessionVersion, ...current });
    // Put the demo password back for the other suites (it raises the version once more).
    await changePassword({ userId: signedIn.id, input: { currentPassword: newPassword, newPassword: SEED.password, confirmPassword: SEED.password } });
    expect((await User.findByPk(signedIn.id))?.sessionVersion).toBe(sessionVersion + 1);
  });
});
