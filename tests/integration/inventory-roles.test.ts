/**
 * Role checks through the real route handlers (real database; only the session is
 * replaced, so each call runs as a chosen demo user): stockkeepers and lab admins change
 * stock, everyone else reads, and another lab's records are 404.
 */
import { beforeEach, describe, expect, it, vi } from "vitest";
import { SEED } from "../support/integration";
import { routeCtx, signInAs } from "../support/fake-session";

vi.mock("@/lib/auth/session", () => import("../support/fake-session"));

const containers = await import("@/app/api/labs/[lab]/containers/route");
const containerOne = await import("@/app/api/labs/[lab]/containers/[containerId]/route");
const adjust = await import("@/app/api/labs/[lab]/containers/[containerId]/adjust/route");
const reservations = await import("@/app/api/labs/[lab]/reservations/route");
const chemicals = await import("@/app/api/labs/[lab]/chemicals/route");

const as = signInAs;
const ctx = routeCtx;
const get = (path: string) => new Request(`http://test.invalid${path}`);
const post = (path: string, body: unknown) => new Request(`http://test.invalid${path}`, { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) });

const KB101 = "c0a10000-0000-4000-8000-000000000001"; // seeded 4-bromoanisole, 100 mL

beforeEach(() => {
  signInAs(null);
});

describe("inventory role checks (route handlers)", () => {
  it("no session is 401", async () => {
    const res = await containers.GET(get("/api/labs/kestrel-bay/containers"), ctx({}));
    expect(res.status).toBe(401);
  });

  it("every role reads containers, the ledger and reservations", async () => {
    for (const u of [SEED.users.viewer, SEED.users.chemist, SEED.users.safety, SEED.users.stockkeeper, SEED.users.admin]) {
      as(u);
      const list = await containers.GET(get("/api/labs/kestrel-bay/containers?q=KB-000101"), ctx({}));
      expect(list.status).toBe(200);
      expect(((await list.json()) as { total: number }).total).toBe(1);
      expect((await containerOne.GET(get(`/api/labs/kestrel-bay/containers/${KB101}`), ctx({ containerId: KB101 }))).status).toBe(200);
      expect((await reservations.GET(get("/api/labs/kestrel-bay/reservations"), ctx({}))).status).toBe(200);
    }
  });

  it("viewers, chemists and safety officers may not change stock (403); nothing changes", async () => {
    for (const u of [SEED.users.viewer, SEED.users.chemist, SEED.users.safety]) {
      as(u);
      const adj = await adjust.POST(post("/x", { amount: "1", unit: "mL", reason: "not allowed" }), ctx({ containerId: KB101 }));
      expect(adj.status).toBe(403);
      const res = await reservations.POST(post("/x", { planRef: "forbidden", lines: [{ containerId: KB101, amount: "1", unit: "mL" }] }), ctx({}));
      expect(res.status).toBe(403);
      const chem = await chemicals.POST(post("/x", { name: "Forbidden reagent" }), ctx({}));
      expect(chem.status).toBe(403);
    }
    as(SEED.users.viewer);
    const body = (await (await containerOne.GET(get("/x"), ctx({ containerId: KB101 }))).json()) as { container: { amount: { base: string } } };
    expect(body.container.amount.base).toBe("100000000");
  });

  it("stockkeepers and lab admins change stock", async () => {
    for (const u of [SEED.users.stockkeeper, SEED.users.admin]) {
      as(u);
      const res = await reservations.POST(post("/x", { planRef: `role-${u.email}`, lines: [{ containerId: KB101, amount: "0.5", unit: "mL" }] }), ctx({}));
      expect(res.status).toBe(201);
    }
  });

  it("invalid input is 422 with field paths", async () => {
    as(SEED.users.stockkeeper);
    const res = await reservations.POST(post("/x", { planRef: "bad", lines: [{ containerId: KB101, amount: "-1", unit: "pints" }] }), ctx({}));
    expect(res.status).toBe(422);
    const body = (await res.json()) as { error: { issues: Array<{ path: string }> } };
    expect(body.error.issues.map((i) => i.path).sort()).toEqual(["lines.0.amount", "lines.0.unit"]);
  });

  it("another lab's container is 404, and a non-member's lab is 404", async () => {
    as(SEED.users.harrowChemist);
    const res = await containerOne.GET(get("/x"), { params: Promise.resolve({ lab: SEED.labs.harrow.slug, containerId: KB101 }) });
    expect(res.status).toBe(404);
    expect((await containers.GET(get("/x"), ctx({}))).status).toBe(404);
  });
});
