/**
 * Lab API tokens through the real route handlers and the real database. Only the request
 * context is replaced: `next/headers` returns the headers of the Request under test (so
 * `Authorization: Bearer …` reaches requireLabAccess exactly as in the server), and the
 * session is a chosen demo user or none.
 */
import { createHash, randomUUID } from "node:crypto";
import { beforeEach, describe, expect, it, vi } from "vitest";
import { SEED } from "../support/integration";

const ctxState = vi.hoisted(() => ({ user: null as null | { id: string; email: string; name: string }, headers: new Headers() }));
vi.mock("@/lib/auth/session", () => ({
  currentUser: async () => ctxState.user,
  requireUser: async () => {
    if (!ctxState.user) {
      const { AppError } = await import("@/lib/errors/app-error");
      throw new AppError("unauthenticated", "Sign in first.");
    }
    return ctxState.user;
  },
}));
vi.mock("next/headers", () => ({ headers: async () => ctxState.headers }));

const { AuditEntry, ApiToken, Membership, User } = await import("@/lib/server/models");
const { createApiToken } = await import("@/lib/api-tokens/server/create-api-token");
const { listAudit } = await import("@/lib/members/server/list-audit");
const tokens = await import("@/app/api/labs/[lab]/tokens/route");
const tokenOne = await import("@/app/api/labs/[lab]/tokens/[tokenId]/route");
const containers = await import("@/app/api/labs/[lab]/containers/route");
const reservations = await import("@/app/api/labs/[lab]/reservations/route");
const chemicals = await import("@/app/api/labs/[lab]/chemicals/route");
const members = await import("@/app/api/labs/[lab]/members/route");

type Handler<P> = (req: Request, ctx: { params: Promise<P> }) => Promise<Response>;
const KESTREL = SEED.labs.kestrel.slug as string;
const KB101 = "c0a10000-0000-4000-8000-000000000001"; // seeded 4-bromoanisole, 100 mL

/** Calls a handler as the server would: the Request's headers are what next/headers returns. */
async function call<P extends { lab: string }>(handler: Handler<P>, init: { method?: string; bearer?: string; body?: unknown; params?: Omit<P, "lab">; lab?: string }) {
  const headers = new Headers({ "content-type": "application/json" });
  if (init.bearer !== undefined) headers.set("authorization", `Bearer ${init.bearer}`);
  const req = new Request("http://test.invalid/api", { method: init.method ?? "GET", headers, body: init.body === undefined ? undefined : JSON.stringify(init.body) });
  ctxState.headers = req.headers;
  const params = { lab: init.lab ?? KESTREL, ...(init.params ?? {}) } as P;
  const res = await handler(req, { params: Promise.resolve(params) });
  return { status: res.status, body: (await res.json()) as Record<string, unknown> & { error?: { code: string; message: string; issues: Array<{ path: string }> } } };
}

const asUser = (u: { id: string; email: string } | null) => {
  ctxState.user = u ? { id: u.id, email: u.email, name: u.email } : null;
};

/** Creates a token as the seeded lab admin through the route; returns its id and secret. */
async function adminToken(role: string, name = `${role}-${randomUUID().slice(0, 8)}`, expiresInDays = 30) {
  asUser(SEED.users.admin);
  const res = await call(tokens.POST, { method: "POST", body: { name, role, expiresInDays } });
  expect(res.status).toBe(201);
  asUser(null);
  const created = res.body as unknown as { token: { id: string; name: string }; secret: string };
  return { id: created.token.id, name: created.token.name, secret: created.secret };
}

beforeEach(() => {
  asUser(null);
  ctxState.headers = new Headers();
});

describe("creating and listing tokens", () => {
  it("a lab admin creates a token: 201 with the secret once; only its SHA-256 is stored", async () => {
    asUser(SEED.users.admin);
    const res = await call(tokens.POST, { method: "POST", body: { name: "nightly stock export", role: "viewer", expiresInDays: 90 } });
    expect(res.status).toBe(201);
    const { token, secret } = res.body as unknown as { token: { id: string; selector: string; role: string; expiresAt: string }; secret: string };
    // 32 random bytes in base64url are 43 characters (RFC 4648 §5, no padding), after the trl_ prefix.
    expect(secret).toMatch(/^trl_[A-Za-z0-9_-]{43}$/);
    expect(token.selector).toBe(secret.slice(0, 12));
    expect(token.role).toBe("viewer");
    // 90 days after now, within the test's own run time.
    expect(Math.abs(Date.parse(token.expiresAt) - (Date.now() + 90 * 86_400_000))).toBeLessThan(60_000);
    const row = await ApiToken.findByPk(token.id);
    // SHA-256 computed here with Node's crypto, independently of lib/api-tokens.
    expect(row!.secretHash).toBe(createHash("sha256").update(secret).digest("hex"));
    expect(JSON.stringify(row!.toJSON())).not.toContain(secret.slice(12));

    const list = await call(tokens.GET, {});
    expect(list.status).toBe(200);
    const listed = (list.body.tokens as Array<{ id: string; state: string; createdBy: string }>).find((k) => k.id === token.id);
    expect(listed).toMatchObject({ state: "active", createdBy: "Gareth Lune" });
    expect(JSON.stringify(list.body)).not.toContain(secret);
  });

  it("bad input is 422 naming each field; a second live token with the same name is 409 naming name", async () => {
    asUser(SEED.users.admin);
    const bad = await call(tokens.POST, { method: "POST", body: { name: "  ", role: "wizard", expiresInDays: 400 } });
    expect(bad.status).toBe(422);
    expect(bad.body.error!.issues.map((i) => i.path).sort()).toEqual(["expiresInDays", "name", "role"]);
    const name = `dup-${randomUUID().slice(0, 8)}`;
    expect((await call(tokens.POST, { method: "POST", body: { name, role: "chemist", expiresInDays: 7 } })).status).toBe(201);
    const dup = await call(tokens.POST, { method: "POST", body: { name: name.toUpperCase(), role: "chemist", expiresInDays: 7 } });
    expect(dup.status).toBe(409);
    expect(dup.body.error!.issues[0]!.path).toBe("name");
  });

  it("members without tokens.manage cannot list or create tokens (403)", async () => {
    for (const u of [SEED.users.chemist, SEED.users.stockkeeper, SEED.users.safety, SEED.users.viewer]) {
      asUser(u);
      expect((await call(tokens.GET, {})).status).toBe(403);
      expect((await call(tokens.POST, { method: "POST", body: { name: "x", role: "viewer", expiresInDays: 7 } })).status).toBe(403);
    }
  });
});

describe("using a token (Authorization: Bearer)", () => {
  it("a chemist token reads stock but cannot manage it (403), and nothing changes", async () => {
    const { secret } = await adminToken("chemist");
    const list = await call(containers.GET, { bearer: secret });
    expect(list.status).toBe(200);
    expect((list.body.total as number) > 0).toBe(true);
    const before = await AuditEntry.count();
    const reserve = await call(reservations.POST, { method: "POST", bearer: secret, body: { planRef: "token-chemist", lines: [{ containerId: KB101, amount: "1", unit: "mL" }] } });
    expect(reserve.status).toBe(403);
    expect(reserve.body.error!.message).toMatch(/its role \(chemist\)/);
    expect((await call(chemicals.POST, { method: "POST", bearer: secret, body: { name: "Not allowed" } })).status).toBe(403);
    expect(await AuditEntry.count()).toBe(before);
  });

  it("a stockkeeper token reserves stock, and the audit entry names the token", async () => {
    const { id, name, secret } = await adminToken("stockkeeper");
    const planRef = `token-${randomUUID().slice(0, 8)}`;
    const res = await call(reservations.POST, { method: "POST", bearer: secret, body: { planRef, lines: [{ containerId: KB101, amount: "0.5", unit: "mL" }] } });
    expect(res.status).toBe(201);
    const entry = await AuditEntry.findOne({ where: { action: "reservation.created", actorTokenId: id } });
    expect(entry).not.toBeNull();
    expect((entry!.after as { planRef: string }).planRef).toBe(planRef);
    // The token acts on behalf of the admin who created it.
    expect(entry!.actorUserId).toBe(SEED.users.admin.id);
    const shown = (await listAudit({ labId: SEED.labs.kestrel.id, query: { pageSize: 20 } })).entries.find((e) => e.id === String(entry!.id));
    expect(shown?.actor).toMatchObject({ kind: "token", name });
    // Its last use is recorded.
    expect((await ApiToken.findByPk(id))!.lastUsedAt).not.toBeNull();
  });

  it("a token only works for its own lab: another lab's slug is 404", async () => {
    const { secret } = await adminToken("lab_admin");
    const res = await call(containers.GET, { bearer: secret, lab: SEED.labs.harrow.slug });
    expect(res.status).toBe(404);
    // The admin is a member of Harrow Fen too, but the token belongs to Kestrel Bay.
    expect((await call(members.GET, { bearer: secret, lab: SEED.labs.harrow.slug })).status).toBe(404);
  });

  it("an expired token is 401", async () => {
    const created = await createApiToken({ labId: SEED.labs.kestrel.id, actorUserId: SEED.users.admin.id, actorRole: "lab_admin", input: { name: `expired-${randomUUID().slice(0, 8)}`, role: "viewer", expiresInDays: 1 }, now: new Date(Date.now() - 2 * 86_400_000) });
    const res = await call(containers.GET, { bearer: created.secret });
    expect(res.status).toBe(401);
    expect(res.body.error!.message).toMatch(/expired/);
  });

  it("a revoked token is 401 from the moment it is revoked; revoking is audited", async () => {
    const { id, secret } = await adminToken("viewer");
    expect((await call(containers.GET, { bearer: secret })).status).toBe(200);
    asUser(SEED.users.admin);
    const revoked = await call(tokenOne.DELETE, { method: "DELETE", params: { tokenId: id } });
    expect(revoked.status).toBe(200);
    expect((revoked.body.token as { state: string }).state).toBe("revoked");
    asUser(null);
    const res = await call(containers.GET, { bearer: secret });
    expect(res.status).toBe(401);
    expect(res.body.error!.message).toMatch(/revoked/);
    expect(await AuditEntry.count({ where: { action: "api_token.revoked", entityId: id } })).toBe(1);
  });

  it("a secret that is not a token's is 401, whether malformed or well-formed; a Bearer header never falls back to the session", async () => {
    expect((await call(containers.GET, { bearer: "not-a-token" })).status).toBe(401);
    expect((await call(containers.GET, { bearer: `trl_${"A".repeat(43)}` })).status).toBe(401);
    const { secret } = await adminToken("viewer");
    // Same selector, different secret: the hash comparison refuses it.
    expect((await call(containers.GET, { bearer: `${secret.slice(0, 12)}${"B".repeat(secret.length - 12)}` })).status).toBe(401);
    asUser(SEED.users.admin);
    expect((await call(containers.GET, { bearer: "not-a-token" })).status).toBe(401);
  });

  it("a token cannot create tokens unless its role may", async () => {
    const chemist = await adminToken("chemist");
    expect((await call(tokens.POST, { method: "POST", bearer: chemist.secret, body: { name: "from a chemist token", role: "viewer", expiresInDays: 7 } })).status).toBe(403);
    const admin = await adminToken("lab_admin");
    const made = await call(tokens.POST, { method: "POST", bearer: admin.secret, body: { name: `child-${randomUUID().slice(0, 8)}`, role: "viewer", expiresInDays: 7 } });
    expect(made.status).toBe(201);
    const childId = (made.body.token as { id: string }).id;
    const entry = await AuditEntry.findOne({ where: { action: "api_token.created", entityId: childId } });
    expect(entry!.actorTokenId).toBe(admin.id);
  });

  it("a token never does more than its creator may now, and stops when its creator leaves the lab", async () => {
    const user = await User.create({ email: `temp-admin-${randomUUID().slice(0, 8)}@kestrelbay.example`, name: "Temporary Admin", passwordHash: null, passwordChangedAt: null });
    const membership = await Membership.create({ labId: SEED.labs.kestrel.id, userId: user.id, role: "lab_admin" });
    const { secret } = await createApiToken({ labId: SEED.labs.kestrel.id, actorUserId: user.id, actorRole: "lab_admin", input: { name: `temp-${user.id.slice(0, 8)}`, role: "stockkeeper", expiresInDays: 7 } });
    const reserve = () => call(reservations.POST, { method: "POST", bearer: secret, body: { planRef: "creator-check", lines: [{ containerId: KB101, amount: "0.1", unit: "mL" }] } });
    expect((await reserve()).status).toBe(201);
    await membership.update({ role: "viewer" });
    const demoted = await reserve();
    expect(demoted.status).toBe(403);
    expect(demoted.body.error!.message).toMatch(/creator's role \(viewer\)/);
    expect((await call(containers.GET, { bearer: secret })).status).toBe(200);
    await membership.destroy();
    expect((await call(containers.GET, { bearer: secret })).status).toBe(401);
  });

  it("another lab's token cannot be revoked (404), and a token id that is not a UUID is refused naming tokenId", async () => {
    // A Harrow Fen token, made directly by the domain operation as a fixture.
    const { token } = await createApiToken({ labId: SEED.labs.harrow.id, actorUserId: SEED.users.admin.id, actorRole: "lab_admin", input: { name: `harrow-${randomUUID().slice(0, 8)}`, role: "viewer", expiresInDays: 7 } });
    asUser(SEED.users.admin);
    expect((await call(tokenOne.DELETE, { method: "DELETE", params: { tokenId: token.id } })).status).toBe(404);
    const notId = await call(tokenOne.DELETE, { method: "DELETE", params: { tokenId: "nope" } });
    expect(notId.status).toBe(422);
    expect(notId.body.error!.issues[0]!.path).toBe("tokenId");
    expect((await ApiToken.findByPk(token.id))!.revokedAt).toBeNull();
  });
});
