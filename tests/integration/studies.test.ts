/**
 * Studies through the real route handlers and PostgreSQL (only the session is replaced):
 * create (CONTRACT.md `POST /studies` → 201 `{ study }`), list with a name filter and server
 * paging, read with its plans, update with the version check, archive; roles and labs.
 */
import { randomUUID } from "node:crypto";
import { beforeEach, describe, expect, it, vi } from "vitest";
import { AuditEntry, Study } from "@/lib/server/models";
import { SEED } from "../support/integration";
import { routeCtx, signInAs } from "../support/fake-session";

vi.mock("@/lib/auth/session", () => import("../support/fake-session"));

const studies = await import("@/app/api/labs/[lab]/studies/route");
const studyOne = await import("@/app/api/labs/[lab]/studies/[studyId]/route");

const as = signInAs;
const lab = SEED.labs.kestrel.slug;
const ctx = routeCtx;
const req = (path: string, method = "GET", body?: unknown) =>
  new Request(`http://test.invalid${path}`, { method, headers: body === undefined ? {} : { "content-type": "application/json" }, body: body === undefined ? undefined : JSON.stringify(body) });

interface StudyBody {
  study: { id: string; name: string; version: number; responses: Array<{ name: string }>; authorName: string; planCount: number; archivedAt: string | null };
}
const tag = randomUUID().slice(0, 8);
const newStudy = (name: string) => ({
  name,
  goal: "Maximise assay yield of the biaryl; keep the homocoupling impurity under 2 area %.",
  targetProduct: "4-isopropyl-biaryl (invented)",
  responses: [
    { name: "yield", unit: "%", goal: "maximize" },
    { name: "homocoupling", unit: "area %", goal: "target", target: 0.5, low: 0, high: 2 },
  ],
});

beforeEach(() => {
  signInAs(null);
});

describe("studies API", () => {
  it("no session is 401", async () => {
    expect((await studies.GET(req(`/api/labs/${lab}/studies`), ctx({}))).status).toBe(401);
  });

  it("a chemist creates a study (201, audited) and reads it back with no plans", async () => {
    as(SEED.users.chemist);
    const res = await studies.POST(req("/x", "POST", newStudy(`Suzuki ${tag}`)), ctx({}));
    expect(res.status).toBe(201);
    const { study } = (await res.json()) as StudyBody;
    expect(study).toMatchObject({ name: `Suzuki ${tag}`, version: 1, planCount: 0, archivedAt: null });
    expect(study.responses.map((r) => r.name)).toEqual(["yield", "homocoupling"]);
    const got = await studyOne.GET(req("/x"), ctx({ studyId: study.id }));
    expect(got.status).toBe(200);
    expect(await got.json()).toMatchObject({ study: { id: study.id, name: `Suzuki ${tag}` }, plans: [] });
    const entry = await AuditEntry.findOne({ where: { entityType: "study", entityId: study.id, action: "study.created" } });
    expect(entry?.actorUserId).toBe(SEED.users.chemist.id);
  });

  it("a bad study is 422 naming each field, and nothing is stored", async () => {
    as(SEED.users.chemist);
    const before = await Study.count();
    const res = await studies.POST(req("/x", "POST", { name: "", responses: [{ name: "yield", goal: "target", target: 5, low: 10, high: 20 }, { name: "Yield", goal: "maximize" }] }), ctx({}));
    expect(res.status).toBe(422);
    const body = (await res.json()) as { error: { issues: Array<{ path: string }> } };
    expect(body.error.issues.map((i) => i.path).sort()).toEqual(["name", "responses.0.target", "responses.1.name"]);
    expect(await Study.count()).toBe(before);
  });

  it("lists with a name filter, sorting and server paging", async () => {
    as(SEED.users.chemist);
    for (const n of ["Alpha", "Beta", "Gamma"]) expect((await studies.POST(req("/x", "POST", newStudy(`Paging ${tag} ${n}`)), ctx({}))).status).toBe(201);
    const page1 = (await (await studies.GET(req(`/x?q=paging ${tag}&sort=name&dir=asc&pageSize=2&page=1`), ctx({}))).json()) as { studies: Array<{ name: string }>; total: number };
    expect(page1.total).toBe(3);
    expect(page1.studies.map((s) => s.name)).toEqual([`Paging ${tag} Alpha`, `Paging ${tag} Beta`]);
    const page2 = (await (await studies.GET(req(`/x?q=paging ${tag}&sort=name&dir=asc&pageSize=2&page=2`), ctx({}))).json()) as { studies: Array<{ name: string }> };
    expect(page2.studies.map((s) => s.name)).toEqual([`Paging ${tag} Gamma`]);
    const bad = await studies.GET(req("/x?sort=colour"), ctx({}));
    expect(bad.status).toBe(422);
  });

  it("updates with the version check: a stale version is 409 naming version and changes nothing", async () => {
    as(SEED.users.chemist);
    const { study } = (await (await studies.POST(req("/x", "POST", newStudy(`Versioned ${tag}`)), ctx({}))).json()) as StudyBody;
    const ok = await studyOne.PATCH(req("/x", "PATCH", { version: 1, goal: "Minimise the impurity." }), ctx({ studyId: study.id }));
    expect(ok.status).toBe(200);
    expect(((await ok.json()) as StudyBody).study.version).toBe(2);
    const stale = await studyOne.PATCH(req("/x", "PATCH", { version: 1, name: "Lost update" }), ctx({ studyId: study.id }));
    expect(stale.status).toBe(409);
    expect(((await stale.json()) as { error: { issues: Array<{ path: string }> } }).error.issues.map((i) => i.path)).toEqual(["version"]);
    expect((await Study.findByPk(study.id))?.name).toBe(`Versioned ${tag}`);
  });

  it("archives a study out of the default list and restores it", async () => {
    as(SEED.users.admin);
    const { study } = (await (await studies.POST(req("/x", "POST", newStudy(`Archive ${tag}`)), ctx({}))).json()) as StudyBody;
    expect(((await (await studyOne.DELETE(req("/x", "DELETE"), ctx({ studyId: study.id }))).json()) as StudyBody).study.archivedAt).not.toBeNull();
    const listed = (await (await studies.GET(req(`/x?q=Archive ${tag}`), ctx({}))).json()) as { total: number };
    expect(listed.total).toBe(0);
    const archived = (await (await studies.GET(req(`/x?q=Archive ${tag}&archived=only`), ctx({}))).json()) as { total: number };
    expect(archived.total).toBe(1);
    expect(((await (await studyOne.DELETE(req("/x?restore=1", "DELETE"), ctx({ studyId: study.id }))).json()) as StudyBody).study.archivedAt).toBeNull();
  });

  it("viewers, stockkeepers and safety officers read studies but may not create them (403)", async () => {
    for (const u of [SEED.users.viewer, SEED.users.stockkeeper, SEED.users.safety]) {
      as(u);
      expect((await studies.GET(req("/x"), ctx({}))).status).toBe(200);
      expect((await studies.POST(req("/x", "POST", newStudy(`Forbidden ${tag}`)), ctx({}))).status).toBe(403);
    }
    expect(await Study.count({ where: { name: `Forbidden ${tag}` } })).toBe(0);
  });

  it("another lab's study is 404; an id that cannot exist is 422 naming studyId", async () => {
    as(SEED.users.chemist);
    const { study } = (await (await studies.POST(req("/x", "POST", newStudy(`Private ${tag}`)), ctx({}))).json()) as StudyBody;
    as(SEED.users.harrowChemist);
    expect((await studyOne.GET(req("/x"), ctx({ studyId: study.id }, SEED.labs.harrow.slug))).status).toBe(404);
    const list = (await (await studies.GET(req(`/x?q=Private ${tag}`), ctx({}, SEED.labs.harrow.slug))).json()) as { total: number };
    expect(list.total).toBe(0);
    as(SEED.users.chemist);
    const malformed = await studyOne.GET(req("/x"), ctx({ studyId: "not-a-uuid" }));
    expect(malformed.status).toBe(422);
    expect(((await malformed.json()) as { error: { issues: Array<{ path: string }> } }).error.issues.map((i) => i.path)).toEqual(["studyId"]);
  });
});
