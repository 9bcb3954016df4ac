/**
 * The editor's live preview through the real route handler and PostgreSQL (only the session
 * is replaced): `POST /api/labs/{lab}/plans/preview` answers with the run sheet and cautions
 * that the `plan` verb computes for the stored form of the document (lib/cli/verbs/plan.ts
 * run in-process) and that `GET /plans/{plan}` shows once it is saved; it writes nothing
 * (no plan, no audit entry); a bad field is a 422 at `document.<path>`; everyone in the lab
 * may preview, another lab's slug is a 404. `GET …/preview?chemicals=` names the container
 * the inventory would use — checked against the demo inventory's seed
 * (seeders/20261201001000-demo-inventory.cjs: 4-bromoanisole KB-000102, opened, expires
 * first, 98.5 %). The document is the demo's Suzuki–Miyaura screen (examples/plan-suzuki.json).
 */
import { randomUUID } from "node:crypto";
import { readFileSync } from "node:fs";
import { beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { run as planVerb } from "@/lib/cli/verbs/plan";
import { AuditEntry, Plan } from "@/lib/server/models";
import { SEED } from "../support/integration";
import { routeCtx, signInAs } from "../support/fake-session";

vi.mock("@/lib/auth/session", () => import("../support/fake-session"));

const studies = await import("@/app/api/labs/[lab]/studies/route");
const studyPlans = await import("@/app/api/labs/[lab]/studies/[studyId]/plans/route");
const planOne = await import("@/app/api/labs/[lab]/plans/[planId]/route");
const preview = await import("@/app/api/labs/[lab]/plans/preview/route");

const as = signInAs;
const lab = SEED.labs.kestrel.slug;
const ctx = (labSlug: string = lab) => routeCtx({}, labSlug);
const req = (path: string, method = "GET", body?: unknown) =>
  new Request(`http://test.invalid${path}`, { method, headers: body === undefined ? {} : { "content-type": "application/json" }, body: body === undefined ? undefined : JSON.stringify(body) });
type Json = Record<string, unknown>;
const example = (): Json => JSON.parse(readFileSync(new URL("../../examples/plan-suzuki.json", import.meta.url), "utf8")) as Json;
const BROMOANISOLE = "c4e10000-0000-4000-8000-000000000001";
let studyId = "";

beforeAll(async () => {
  as(SEED.users.chemist);
  const res = await studies.POST(req("/x", "POST", { name: `Preview ${randomUUID().slice(0, 8)}`, responses: [{ name: "yield", unit: "%", goal: "maximize" }] }), ctx());
  studyId = ((await res.json()) as { study: { id: string } }).study.id;
});
beforeEach(() => {
  signInAs(null);
});

describe("POST /plans/preview", () => {
  it("answers with the plan verb's run sheet and cautions for the stored document, the same GET /plans shows after saving, and writes nothing", async () => {
    as(SEED.users.chemist);
    const plansBefore = await Plan.count();
    const auditBefore = await AuditEntry.count();
    const res = await preview.POST(req("/x", "POST", { document: example() }), ctx());
    expect(res.status).toBe(200);
    const { preview: p } = (await res.json()) as { preview: Json & { document: Json; runSheet: Json & { runs: unknown[] }; cautions: unknown[]; contentHash: string; designRuns: unknown } };
    expect(await Plan.count()).toBe(plansBefore);
    expect(await AuditEntry.count()).toBe(auditBefore);
    expect(p.runSheet.runs).toHaveLength(18); // 2^(5−1) + 2 centre points
    expect(p.designRuns).toBeNull();

    const verb = JSON.parse(JSON.stringify(await planVerb(p.document))) as Json;
    const { cautions, signOffRequired, signOffReasons, releasable, perRun, notice, ...runSheet } = verb;
    expect(p.runSheet).toEqual(runSheet);
    expect({ cautions: p.cautions, signOffRequired: p.signOffRequired, signOffReasons: p.signOffReasons, releasable: p.releasable, perRun: p.perRun, notice: p.notice }).toEqual({ cautions, signOffRequired, signOffReasons, releasable, perRun, notice });

    // Saving the previewed document gives the same hash, run sheet and cautions.
    const created = await studyPlans.POST(req("/x", "POST", { document: p.document }), routeCtx({ studyId }));
    const { plan } = (await created.json()) as { plan: { id: string } };
    const got = (await (await planOne.GET(req("/x"), routeCtx({ planId: plan.id }))).json()) as { plan: Json };
    expect(got.plan.contentHash).toBe(p.contentHash);
    expect(got.plan.runSheet).toEqual(p.runSheet);
    expect(got.plan.cautions).toEqual(p.cautions);
  });

  it("a bad field is a 422 naming document.<path>", async () => {
    as(SEED.users.chemist);
    const doc = example();
    (doc.factors as Array<Json>)[0]!.high = 10;
    const res = await preview.POST(req("/x", "POST", { document: doc }), ctx());
    expect(res.status).toBe(422);
    const body = (await res.json()) as { error: { issues: Array<{ path: string }> } };
    expect(body.error.issues.map((i) => i.path)).toContain("document.factors.0.high");
  });

  it("amounts that cannot work are a preview with the problem and the design's runs", async () => {
    as(SEED.users.chemist);
    const doc = example();
    // 0.2 mmol at 0.05 M is 4000 µL a vial, twice the 2 mL the example's vial holds.
    (doc.recipe as Json).concentrationM = 0.05;
    const res = await preview.POST(req("/x", "POST", { document: doc }), ctx());
    expect(res.status).toBe(200);
    const { preview: p } = (await res.json()) as { preview: { runSheet: unknown; problem: { code: string; issues: Array<{ path: string }> } | null; designRuns: unknown[] | null } };
    expect(p.runSheet).toBeNull();
    expect(p.problem?.code).toBe("infeasible");
    expect(p.problem?.issues.map((i) => i.path)).toEqual(["document.recipe.scaleMmol"]);
    expect(p.designRuns).toHaveLength(18); // the design still has its 2^(5−1) + 2 runs
  });

  it("viewers may preview; another lab's slug is a 404; no session is a 401", async () => {
    as(SEED.users.viewer);
    expect((await preview.POST(req("/x", "POST", { document: example() }), ctx())).status).toBe(200);
    as(SEED.users.harrowChemist);
    expect((await preview.POST(req("/x", "POST", { document: example() }), ctx())).status).toBe(404);
    signInAs(null);
    expect((await preview.POST(req("/x", "POST", { document: example() }), ctx())).status).toBe(401);
  });
});

describe("GET /plans/preview?chemicals=", () => {
  it("names the container the inventory would use, with its assay", async () => {
    as(SEED.users.chemist);
    const res = await preview.GET(req(`/x?chemicals=${BROMOANISOLE}`), ctx());
    expect(res.status).toBe(200);
    const { inventory } = (await res.json()) as { inventory: Record<string, { name: string; container: { barcode: string; purityPercent: number | null } | null }> };
    expect(inventory[BROMOANISOLE]).toMatchObject({ name: "4-Bromoanisole", container: { barcode: "KB-000102", purityPercent: 98.5 } });
  });

  it("refuses a list that is not of chemical ids (422) and another lab's chemical (404)", async () => {
    as(SEED.users.chemist);
    expect((await preview.GET(req("/x?chemicals=not-an-id"), ctx())).status).toBe(422);
    expect((await preview.GET(req(`/x?chemicals=${randomUUID()}`), ctx())).status).toBe(404);
  });
});
