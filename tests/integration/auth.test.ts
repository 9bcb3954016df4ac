import { beforeEach, describe, expect, it } from "vitest";
import { SEED } from "../support/integration";
import { authenticate, LOCKOUT } from "@/lib/auth/authenticate";
import { authorizeLab } from "@/lib/auth/access";
import { changeMemberRole } from "@/lib/members/server/change-member-role";
import { AppError } from "@/lib/errors/app-error";
import { AuditEntry, Membership, SignInAttempt } from "@/lib/server/models";

async function codeOf(p: Promise<unknown>): Promise<string> {
  try {
    await p;
    return "ok";
  } catch (e) {
    if (e instanceof AppError) return e.code;
    throw e;
  }
}

describe("sign-in", () => {
  beforeEach(async () => {
    await SignInAttempt.destroy({ where: {} });
  });

  it("accepts the seeded demo password and returns the user id", async () => {
    const user = await authenticate({ email: SEED.users.chemist.email, password: SEED.password });
    expect(user.id).toBe(SEED.users.chemist.id);
  });

  it("matches the e-mail case-insensitively", async () => {
    const user = await authenticate({ email: "Chemist@KestrelBay.example", password: SEED.password });
    expect(user.id).toBe(SEED.users.chemist.id);
  });

  it("refuses a wrong password and an unknown account with the same code", async () => {
    expect(await codeOf(authenticate({ email: SEED.users.chemist.email, password: "wrong-password" }))).toBe("unauthenticated");
    expect(await codeOf(authenticate({ email: "nobody@kestrelbay.example", password: SEED.password }))).toBe("unauthenticated");
  });

  it("refuses a malformed e-mail as invalid input naming the field", async () => {
    const err = await authenticate({ email: "not-an-email", password: "x" }).catch((e: unknown) => e);
    expect(err).toBeInstanceOf(AppError);
    expect((err as AppError).issues[0]?.path).toBe("email");
  });

  it(`locks the account after ${LOCKOUT.maxFailures} failures within ${LOCKOUT.windowMinutes} minutes, even for the right password`, async () => {
    const email = SEED.users.viewer.email;
    for (let i = 0; i < LOCKOUT.maxFailures - 1; i++) {
      expect(await codeOf(authenticate({ email, password: `wrong-${i}` }))).toBe("unauthenticated");
    }
    // Nine failures: the right password still works and resets the run of failures.
    expect(await codeOf(authenticate({ email, password: SEED.password }))).toBe("ok");
    for (let i = 0; i < LOCKOUT.maxFailures; i++) await codeOf(authenticate({ email, password: `wrong-${i}` }));
    const locked = await authenticate({ email, password: SEED.password }).catch((e: unknown) => e);
    expect((locked as AppError).code).toBe("rate_limited");
    expect((locked as AppError).message).toMatch(/Too many failed sign-in attempts/);
    // Other accounts are not affected.
    expect(await codeOf(authenticate({ email: SEED.users.chemist.email, password: SEED.password }))).toBe("ok");
  });

  it("lifts the lock once the failures are older than the window", async () => {
    const email = SEED.users.viewer.email;
    const past = new Date(Date.now() - (LOCKOUT.windowMinutes + 1) * 60_000);
    for (let i = 0; i < LOCKOUT.maxFailures; i++) await codeOf(authenticate({ email, password: "wrong" }, past));
    expect(await codeOf(authenticate({ email, password: SEED.password }))).toBe("ok");
  });
});

describe("lab isolation and roles", () => {
  it("a member of one lab gets not_found (404) for the other lab", async () => {
    expect(await codeOf(authorizeLab({ userId: SEED.users.harrowChemist.id, labSlug: SEED.labs.kestrel.slug }))).toBe("not_found");
    expect(await codeOf(authorizeLab({ userId: SEED.users.chemist.id, labSlug: SEED.labs.harrow.slug }))).toBe("not_found");
    expect(await codeOf(authorizeLab({ userId: SEED.users.chemist.id, labSlug: SEED.labs.kestrel.slug }))).toBe("ok");
  });

  it("a role without the permission gets forbidden (403)", async () => {
    expect(await codeOf(authorizeLab({ userId: SEED.users.chemist.id, labSlug: SEED.labs.kestrel.slug, permission: "members.manage" }))).toBe("forbidden");
    expect(await codeOf(authorizeLab({ userId: SEED.users.admin.id, labSlug: SEED.labs.kestrel.slug, permission: "members.manage" }))).toBe("ok");
  });

  it("another lab's membership cannot be changed through this lab (404)", async () => {
    const harrowMember = await Membership.findOne({ where: { labId: SEED.labs.harrow.id, userId: SEED.users.harrowChemist.id } });
    expect(harrowMember).not.toBeNull();
    expect(await codeOf(changeMemberRole({ labId: SEED.labs.kestrel.id, actorUserId: SEED.users.admin.id, membershipId: harrowMember!.id, input: { role: "viewer" } }))).toBe("not_found");
  });

  it("a role change is audited with who, what, before and after — and the log refuses edits", async () => {
    const m = await Membership.findOne({ where: { labId: SEED.labs.kestrel.id, userId: SEED.users.safety.id } });
    const before = await AuditEntry.count({ where: { labId: SEED.labs.kestrel.id, action: "membership.role_changed" } });
    await changeMemberRole({ labId: SEED.labs.kestrel.id, actorUserId: SEED.users.admin.id, membershipId: m!.id, input: { role: "chemist" } });
    await changeMemberRole({ labId: SEED.labs.kestrel.id, actorUserId: SEED.users.admin.id, membershipId: m!.id, input: { role: "safety_officer" } });
    const entries = await AuditEntry.findAll({ where: { labId: SEED.labs.kestrel.id, action: "membership.role_changed", entityId: m!.id }, order: [["id", "ASC"]] });
    expect(entries.length - before).toBeGreaterThanOrEqual(2);
    const first = entries[entries.length - 2]!;
    expect(first.actorUserId).toBe(SEED.users.admin.id);
    expect(first.before).toEqual({ role: "safety_officer" });
    expect(first.after).toEqual({ role: "chemist" });
    await expect(first.update({ action: "tampered" })).rejects.toThrow(/append-only/);
    await expect(first.destroy()).rejects.toThrow(/append-only/);
  });

  it("refuses an unknown role naming the field, and changes nothing", async () => {
    const m = await Membership.findOne({ where: { labId: SEED.labs.kestrel.id, userId: SEED.users.chemist.id } });
    const err = await changeMemberRole({ labId: SEED.labs.kestrel.id, actorUserId: SEED.users.admin.id, membershipId: m!.id, input: { role: "overlord" } }).catch((e: unknown) => e);
    expect((err as AppError).issues[0]?.path).toBe("role");
    expect((await m!.reload()).role).toBe("chemist");
  });

  it("never leaves a lab without a lab admin", async () => {
    const admin = await Membership.findOne({ where: { labId: SEED.labs.kestrel.id, userId: SEED.users.admin.id } });
    expect(await codeOf(changeMemberRole({ labId: SEED.labs.kestrel.id, actorUserId: SEED.users.admin.id, membershipId: admin!.id, input: { role: "viewer" } }))).toBe("conflict");
  });
});
