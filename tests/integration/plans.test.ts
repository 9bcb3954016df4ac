/**
 * Plans through the real route handlers and PostgreSQL (only the session is replaced):
 * CONTRACT.md "Plans" — create, read, update with the version check, duplicate, delete a
 * draft, list with filters; roles (viewers read, stockkeepers cannot edit) and labs (another
 * lab's plan is 404); a bad document field is a 422 naming `document.<path>` and stores
 * nothing; the saved plan's run sheet and cautions equal the `plan` verb's output for the
 * same document (lib/cli/verbs/plan.ts run in-process); the content hash is the SHA-256 of
 * the RFC 8785 canonical JSON, recomputed here with the `canonicalize` package and
 * node:crypto. The document is the demo's Suzuki–Miyaura screen (examples/plan-suzuki.json).
 */
import { createHash, randomUUID } from "node:crypto";
import { readFileSync } from "node:fs";
import canonicalize from "canonicalize";
import { beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { run as planVerb } from "@/lib/cli/verbs/plan";
import { applyInventoryFacts, linkedChemicalIds } from "@/lib/chemistry/inventory-facts";
import type { PlanDocumentInput } from "@/lib/chemistry/plan-document";
import { planHazardFacts } from "@/inventory/server/plan-hazard-facts";
import { AuditEntry, Plan } from "@/lib/server/models";
import { SEED } from "../support/integration";
import { routeCtx, signInAs } from "../support/fake-session";

vi.mock("@/lib/auth/session", () => import("../support/fake-session"));

const studies = await import("@/app/api/labs/[lab]/studies/route");
const studyOne = await import("@/app/api/labs/[lab]/studies/[studyId]/route");
const studyPlans = await import("@/app/api/labs/[lab]/studies/[studyId]/plans/route");
const plans = await import("@/app/api/labs/[lab]/plans/route");
const planOne = await import("@/app/api/labs/[lab]/plans/[planId]/route");
const duplicate = await import("@/app/api/labs/[lab]/plans/[planId]/duplicate/route");

const as = signInAs;
const ctx = routeCtx;
const req = (path: string, method = "GET", body?: unknown) =>
  new Request(`http://test.invalid${path}`, { method, headers: body === undefined ? {} : { "content-type": "application/json" }, body: body === undefined ? undefined : JSON.stringify(body) });

type Json = Record<string, unknown>;
interface PlanJson {
  id: string;
  studyId: string;
  name: string;
  state: string;
  version: number;
  contentHash: string;
  document: Json & { design: Json; factors: Array<Json> };
  runSheet: (Json & { runs: unknown[] }) | null;
  cautions: Array<{ code: string; severity: string; runs: number[] }>;
  releasable: boolean;
  signOffRequired: boolean;
  signOffReasons: string[];
  perRun: unknown[];
  notice: string;
  signature: unknown;
  reservations: unknown[];
  problem: { code: string; issues: Array<{ path: string }> } | null;
  runCount: number | null;
  computedWith: Json;
  derivedFromPlanId: string | null;
  derivation: string | null;
}
const example = (): Json => JSON.parse(readFileSync(new URL("../../examples/plan-suzuki.json", import.meta.url), "utf8")) as Json;
const issuePaths = async (res: Response) => ((await res.json()) as { error: { issues: Array<{ path: string }> } }).error.issues.map((i) => i.path).sort();
const tag = randomUUID().slice(0, 8);
let studyId = "";

async function createPlan(document: Json, user: { id: string; email: string } = SEED.users.chemist): Promise<PlanJson> {
  as(user);
  const res = await studyPlans.POST(req("/x", "POST", { document }), ctx({ studyId: studyId }));
  expect(res.status).toBe(201);
  return ((await res.json()) as { plan: PlanJson }).plan;
}

beforeAll(async () => {
  as(SEED.users.chemist);
  const res = await studies.POST(req("/x", "POST", { name: `Plans ${tag}`, responses: [{ name: "yield", unit: "%", goal: "maximize" }] }), ctx({}));
  studyId = ((await res.json()) as { study: { id: string } }).study.id;
});

beforeEach(() => {
  signInAs(null);
});

describe("plans API", () => {
  it("a chemist creates a draft (201) and reads it back in the GET shape of CONTRACT.md", async () => {
    const created = await createPlan(example());
    expect(created).toMatchObject({ studyId, state: "draft", version: 1, signature: null, reservations: [], problem: null, runCount: 18 });
    as(SEED.users.viewer);
    const res = await planOne.GET(req("/x"), ctx({ planId: created.id }));
    expect(res.status).toBe(200);
    const { plan } = (await res.json()) as { plan: PlanJson };
    for (const key of ["id", "studyId", "name", "state", "version", "contentHash", "document", "runSheet", "cautions", "releasable", "signOffRequired", "signature", "reservations"]) expect(plan).toHaveProperty(key);
    expect(plan.name).toBe(example().name);
    expect(plan.runSheet?.runs).toHaveLength(18); // 2^(5−1) = 16 runs + 2 centre points
    expect(plan.computedWith).toMatchObject({ vessel: example().vessel, dispensing: example().dispensing, equipment: example().equipment });
    // The study lists it with its run count and author.
    const { plans: listed } = (await (await studyOne.GET(req("/x"), ctx({ studyId: studyId }))).json()) as { plans: Array<{ id: string; runCount: number; authorName: string; state: string }> };
    expect(listed.find((p) => p.id === plan.id)).toMatchObject({ runCount: 18, state: "draft" });
  });

  it("the content hash is the SHA-256 of the stored document's RFC 8785 canonical JSON", async () => {
    const created = await createPlan(example());
    expect(created.contentHash).toBe(createHash("sha256").update(canonicalize(created.document)!, "utf8").digest("hex"));
    const stored = await Plan.findByPk(created.id);
    expect(stored?.contentHash).toBe(created.contentHash);
    expect(createHash("sha256").update(canonicalize(stored?.document)!, "utf8").digest("hex")).toBe(created.contentHash);
  });

  it("runSheet and cautions equal the plan verb's output for the same document", async () => {
    const created = await createPlan(example());
    as(SEED.users.chemist);
    const { plan } = (await (await planOne.GET(req("/x"), ctx({ planId: created.id }))).json()) as { plan: PlanJson };
    const verb = JSON.parse(JSON.stringify(await planVerb(plan.document))) as Json;
    const { cautions, signOffRequired, signOffReasons, releasable, perRun, notice, ...runSheet } = verb;
    expect(plan.runSheet).toEqual(runSheet);
    expect(plan.cautions).toEqual(cautions);
    expect({ signOffRequired: plan.signOffRequired, signOffReasons: plan.signOffReasons, releasable: plan.releasable, perRun: plan.perRun, notice: plan.notice }).toEqual({ signOffRequired, signOffReasons, releasable, perRun, notice });
    // Storing changed nothing the run sheet depends on: the verb on the example as written gives the same sheet.
    const { cautions: _c, signOffRequired: _s, signOffReasons: _r, releasable: _l, perRun: _p, notice: _n, ...original } = JSON.parse(JSON.stringify(await planVerb(example()))) as Json;
    expect(plan.runSheet).toEqual(original);
  });

  it("export → import → store gives the same content hash", async () => {
    const first = await createPlan(example());
    const exported = JSON.parse(JSON.stringify(first.document)) as Json;
    const imported = await createPlan(exported);
    expect(imported.contentHash).toBe(first.contentHash);
    expect(imported.document).toEqual(first.document);
  });

  it("a bad document field is 422 naming document.<path>, and nothing is stored", async () => {
    const before = await Plan.count();
    const doc = example() as Json & { factors: Array<Json> };
    doc.factors[0]!.high = "hot";
    as(SEED.users.chemist);
    const res = await studyPlans.POST(req("/x", "POST", { document: doc }), ctx({ studyId: studyId }));
    expect(res.status).toBe(422);
    expect(await issuePaths(res)).toEqual(["document.factors.0.high"]);
    // A design option only the design engine knows is named under document.design.
    const badAlpha = { ...example(), design: { design: "central-composite", alpha: "wobbly" }, factors: (example().factors as Json[]).slice(0, 2) };
    const res2 = await studyPlans.POST(req("/x", "POST", { document: badAlpha }), ctx({ studyId: studyId }));
    expect(res2.status).toBe(422);
    expect(await issuePaths(res2)).toEqual(["document.design.alpha"]);
    const res3 = await studyPlans.POST(req("/x", "POST", { document: "not an object" }), ctx({ studyId: studyId }));
    expect(await issuePaths(res3)).toEqual(["document"]);
    expect(await Plan.count()).toBe(before);
  });

  it("a valid plan whose amounts cannot work is saved, with the problem named and no run sheet", async () => {
    const doc = example() as Json & { recipe: Json };
    doc.recipe.scaleMmol = 2; // 2 mmol at 0.2 M is 10 mL, past the 4 mL vial's 2 mL working volume
    const created = await createPlan(doc);
    expect(created.runSheet).toBeNull();
    expect(created.releasable).toBe(false);
    expect(created.problem?.code).toBe("infeasible");
    expect(created.runCount).toBe(18);
  });

  it("updates with the version check; a stale version is 409 naming version and changes nothing; audited with hash and version", async () => {
    const created = await createPlan(example());
    const doc = { ...created.document, factors: created.document.factors.map((f, i) => (i === 0 ? { ...f, high: 95 } : f)) };
    as(SEED.users.chemist);
    const ok = await planOne.PUT(req("/x", "PUT", { document: doc, version: 1 }), ctx({ planId: created.id }));
    expect(ok.status).toBe(200);
    const updated = ((await ok.json()) as { plan: PlanJson }).plan;
    expect(updated.version).toBe(2);
    expect(updated.contentHash).not.toBe(created.contentHash);
    expect(updated.document.factors[0]!.high).toBe(95);

    const stale = await planOne.PUT(req("/x", "PUT", { document: example(), version: 1 }), ctx({ planId: created.id }));
    expect(stale.status).toBe(409);
    expect(await issuePaths(stale)).toEqual(["version"]);
    const row = await Plan.findByPk(created.id);
    expect(row?.version).toBe(2);
    expect(row?.contentHash).toBe(updated.contentHash);

    const entries = await AuditEntry.findAll({ where: { entityType: "plan", entityId: created.id }, order: [["id", "ASC"]] });
    expect(entries.map((e) => e.action)).toEqual(["plan.created", "plan.updated"]);
    expect(entries[1]!.before).toMatchObject({ version: 1, contentHash: created.contentHash });
    expect(entries[1]!.after).toMatchObject({ version: 2, contentHash: updated.contentHash });

    // A save that changes nothing is not a new version.
    const same = await planOne.PUT(req("/x", "PUT", { document: updated.document, version: 2 }), ctx({ planId: created.id }));
    expect(((await same.json()) as { plan: PlanJson }).plan.version).toBe(2);

    // A bad field in an update is 422 and changes nothing.
    const bad = await planOne.PUT(req("/x", "PUT", { document: { ...updated.document, recipe: { ...(updated.document.recipe as Json), scaleMmol: 0 } }, version: 2 }), ctx({ planId: created.id }));
    expect(bad.status).toBe(422);
    expect(await issuePaths(bad)).toEqual(["document.recipe.scaleMmol"]);
    expect((await Plan.findByPk(created.id))?.version).toBe(2);
  });

  it("only editable states take an edit; an approved plan returns to draft with its signature void", async () => {
    const created = await createPlan(example());
    await Plan.update({ state: "in_review" }, { where: { id: created.id } });
    as(SEED.users.chemist);
    const frozen = await planOne.PUT(req("/x", "PUT", { document: { ...created.document, name: "Changed" }, version: 1 }), ctx({ planId: created.id }));
    expect(frozen.status).toBe(409);
    expect(await issuePaths(frozen)).toEqual(["state"]);
    await Plan.update({ state: "approved" }, { where: { id: created.id } });
    const edited = await planOne.PUT(req("/x", "PUT", { document: { ...created.document, name: "Changed after approval" }, version: 1 }), ctx({ planId: created.id }));
    expect(edited.status).toBe(200);
    expect(((await edited.json()) as { plan: PlanJson }).plan).toMatchObject({ state: "draft", version: 2, name: "Changed after approval" });
    const entry = await AuditEntry.findOne({ where: { entityType: "plan", entityId: created.id, action: "plan.updated" } });
    expect(entry?.before).toMatchObject({ state: "approved" });
    expect(entry?.after).toMatchObject({ state: "draft", signatureVoided: true });
  });

  it("duplicates into a new draft derived from the original, and deletes only drafts", async () => {
    const created = await createPlan(example());
    as(SEED.users.chemist);
    const res = await duplicate.POST(req("/x", "POST", {}), ctx({ planId: created.id }));
    expect(res.status).toBe(201);
    const copy = ((await res.json()) as { plan: PlanJson }).plan;
    expect(copy).toMatchObject({ state: "draft", version: 1, derivedFromPlanId: created.id, derivation: "duplicate", name: `Copy of ${created.name}` });
    expect(copy.document.design.seed).toBe(created.document.design.seed);

    const del = await planOne.DELETE(req("/x", "DELETE"), ctx({ planId: copy.id }));
    expect(del.status).toBe(200);
    expect(await Plan.findByPk(copy.id)).toBeNull();
    expect(await AuditEntry.count({ where: { entityType: "plan", entityId: copy.id, action: "plan.deleted" } })).toBe(1);

    await Plan.update({ state: "released" }, { where: { id: created.id } });
    const refused = await planOne.DELETE(req("/x", "DELETE"), ctx({ planId: created.id }));
    expect(refused.status).toBe(409);
    expect(await Plan.findByPk(created.id)).not.toBeNull();
  });

  it("lists with filters by state, author and study, paged on the server", async () => {
    const a = await createPlan({ ...example(), name: `List ${tag} A` });
    const b = await createPlan({ ...example(), name: `List ${tag} B` }, SEED.users.admin);
    await Plan.update({ state: "in_review" }, { where: { id: b.id } });
    as(SEED.users.chemist);
    const get = async (qs: string) => (await (await plans.GET(req(`/x?${qs}`), ctx({}))).json()) as { plans: Array<{ id: string; name: string; state: string }>; total: number };
    expect((await get(`q=List ${tag}&study=${studyId}`)).total).toBe(2);
    expect((await get(`q=List ${tag}&state=in_review`)).plans.map((p) => p.id)).toEqual([b.id]);
    expect((await get(`q=List ${tag}&state=draft,in_review&sort=name&dir=asc`)).plans.map((p) => p.id)).toEqual([a.id, b.id]);
    expect((await get(`q=List ${tag}&author=me`)).plans.map((p) => p.id)).toEqual([a.id]);
    expect((await get(`q=List ${tag}&author=${SEED.users.admin.id}`)).plans.map((p) => p.id)).toEqual([b.id]);
    const paged = await get(`q=List ${tag}&sort=name&dir=asc&pageSize=1&page=2`);
    expect(paged.plans.map((p) => p.id)).toEqual([b.id]);
    expect(paged.total).toBe(2);
    const bad = await plans.GET(req("/x?state=finished"), ctx({}));
    expect(bad.status).toBe(422);
    expect(await issuePaths(bad)).toEqual(["state.0"]);
  });

  it("viewers read but may not create or edit (403); stockkeepers cannot edit either; nothing changes", async () => {
    const created = await createPlan(example());
    for (const u of [SEED.users.viewer, SEED.users.stockkeeper, SEED.users.safety]) {
      as(u);
      expect((await planOne.GET(req("/x"), ctx({ planId: created.id }))).status).toBe(200);
      expect((await studyPlans.POST(req("/x", "POST", { document: example() }), ctx({ studyId: studyId }))).status).toBe(403);
      expect((await planOne.PUT(req("/x", "PUT", { document: { ...created.document, name: "No" }, version: 1 }), ctx({ planId: created.id }))).status).toBe(403);
      expect((await duplicate.POST(req("/x", "POST", {}), ctx({ planId: created.id }))).status).toBe(403);
      expect((await planOne.DELETE(req("/x", "DELETE"), ctx({ planId: created.id }))).status).toBe(403);
    }
    const row = await Plan.findByPk(created.id);
    expect(row).toMatchObject({ version: 1, contentHash: created.contentHash });
  });

  it("components linked to the inventory take their hazard facts from it; runSheet and cautions equal the plan verb on the linked document", async () => {
    // Study B's halogen–lithium exchange on the seeded demo inventory (seeders/20261201001000-demo-inventory.cjs):
    // n-butyllithium linked to its record (H250, H260, EUH014) while the document types no statement,
    // THF linked to the bottle the inventory proposes first (opened long ago) while the document types a fresh test date.
    const seeded = (n: number) => `c4e10000-0000-4000-8000-${String(n).padStart(12, "0")}`;
    const studyB = (): Json => ({
      name: `Study B ${tag}`,
      recipe: {
        limitingReagent: "arBr",
        scaleMmol: 0.5,
        concentrationM: 0.5,
        temperatureC: -78,
        components: [
          { id: "arBr", name: "3-bromoanisole", role: "reagent", chemicalId: seeded(8), formula: "C7H7BrO", form: { state: "liquid", densityGPerMl: 1.477, purityWtPercent: 98 } },
          { id: "buli", name: "n-butyllithium 2.5 M in hexanes", role: "reagent", chemicalId: seeded(9), formula: "C4H9Li", equivalents: 1.1, form: { state: "solution", molarityM: 2.5 }, hazards: { ghs: [], openedOn: "2026-11-30" } },
        ],
        solvents: [{ name: "tetrahydrofuran", volumeFraction: 1, chemicalId: seeded(10), openedOn: "2026-11-30", peroxideTestedOn: "2026-11-30" }],
      },
      design: { runs: [{ standardOrder: 1 }] },
      vessel: "vial-4ml-screw-septum",
      block: "block-cool-24",
    });
    const created = await createPlan(studyB());
    const facts = await planHazardFacts({ labId: SEED.labs.kestrel.id, chemicalIds: linkedChemicalIds(created.document as unknown as PlanDocumentInput) });
    const linked = applyInventoryFacts(created.document as unknown as PlanDocumentInput, facts).document;
    const verb = JSON.parse(JSON.stringify(await planVerb(linked))) as Json;
    const { cautions, signOffRequired, signOffReasons: _r, releasable: _l, perRun: _p, notice: _n, ...runSheet } = verb;
    expect(created.runSheet).toEqual(runSheet);
    expect(created.cautions).toEqual(cautions);
    expect(created.signOffRequired).toBe(signOffRequired);
    // The record's facts were used: TL-R01 for the pyrophoric reagent, TL-X01 for the THF bottle past its test, neither typed.
    expect(created.cautions.map((c) => c.code)).toEqual(expect.arrayContaining(["TL-R01", "TL-X01"]));
    const unlinked = (await planVerb(created.document)) as { cautions: Array<{ code: string }> };
    expect(unlinked.cautions.map((c) => c.code)).not.toContain("TL-X01");
    // The stored document keeps what the chemist typed; the facts are applied when the plan is computed.
    expect((created.document.recipe as { solvents: Array<Json> }).solvents[0]!.peroxideTestedOn).toBe("2026-11-30");

    // A chemical of another lab (Harrow Fen's THF) is refused at its path, and nothing is stored.
    const before = await Plan.count();
    const foreign = studyB() as { recipe: { solvents: Array<Json> } };
    foreign.recipe.solvents[0]!.chemicalId = seeded(19);
    as(SEED.users.chemist);
    const res = await studyPlans.POST(req("/x", "POST", { document: foreign }), ctx({ studyId }));
    expect(res.status).toBe(422);
    expect(await issuePaths(res)).toEqual(["document.recipe.solvents.0.chemicalId"]);
    expect(await Plan.count()).toBe(before);
  });

  it("another lab's plan is 404 (read, edit, delete); an id that cannot exist is 422 naming planId", async () => {
    const created = await createPlan(example());
    as(SEED.users.harrowChemist);
    const harrow = <P extends Record<string, string>>(params: P) => ctx(params, SEED.labs.harrow.slug);
    expect((await planOne.GET(req("/x"), harrow({ planId: created.id }))).status).toBe(404);
    expect((await planOne.PUT(req("/x", "PUT", { document: example(), version: 1 }), harrow({ planId: created.id }))).status).toBe(404);
    expect((await planOne.DELETE(req("/x", "DELETE"), harrow({ planId: created.id }))).status).toBe(404);
    expect((await studyPlans.POST(req("/x", "POST", { document: example() }), harrow({ studyId: studyId }))).status).toBe(404);
    expect((await planOne.GET(req("/x"), ctx({ planId: created.id }))).status).toBe(404); // not a member of Kestrel Bay
    as(SEED.users.chemist);
    const malformed = await planOne.GET(req("/x"), ctx({ planId: "12345" }));
    expect(malformed.status).toBe(422);
    expect(await issuePaths(malformed)).toEqual(["planId"]);
    expect(await Plan.findByPk(created.id)).toMatchObject({ version: 1 });
  });
});
