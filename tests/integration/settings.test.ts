/**
 * Lab settings through the real route handlers and PostgreSQL (only the session is
 * replaced): everyone reads them (defaults when the lab saved nothing); lab admins edit
 * vessels, blocks and dispensing limits, safety officers the hazard thresholds
 * (PRODUCT.md "People and roles"); a stale version is 409; every change is audited
 * before → after; a new plan takes what its document does not give from the settings
 * and shows the values it was computed with.
 */
import { randomUUID } from "node:crypto";
import { readFileSync } from "node:fs";
import { afterAll, beforeEach, describe, expect, it, vi } from "vitest";
import { DEFAULT_LAB_THRESHOLDS } from "@/lib/hazards/thresholds";
import { AuditEntry, Lab } from "@/lib/server/models";
import { SEED } from "../support/integration";
import { routeCtx, signInAs } from "../support/fake-session";

vi.mock("@/lib/auth/session", () => import("../support/fake-session"));

const settings = await import("@/app/api/labs/[lab]/settings/route");
const section = await import("@/app/api/labs/[lab]/settings/[section]/route");
const studies = await import("@/app/api/labs/[lab]/studies/route");
const studyPlans = await import("@/app/api/labs/[lab]/studies/[studyId]/plans/route");

const as = signInAs;
const ctx = routeCtx;
const req = (method = "GET", body?: unknown) =>
  new Request("http://test.invalid/x", { method, headers: body === undefined ? {} : { "content-type": "application/json" }, body: body === undefined ? undefined : JSON.stringify(body) });

type Json = Record<string, unknown>;
interface SettingsJson {
  version: number;
  settings: {
    vessels: { defaultId: string; types: Array<Json & { id: string; ratedBar: number }> };
    blocks: { defaultId: string; types: Array<Json & { id: string; minC: number; maxC: number }> };
    dispensing: Json & { minPipetteVolumeUl: number };
    thresholds: typeof DEFAULT_LAB_THRESHOLDS;
  };
}
const read = async (): Promise<SettingsJson> => {
  as(SEED.users.viewer);
  return (await (await settings.GET(req(), ctx({}))).json()) as SettingsJson;
};
const put = (name: string, body: unknown) => section.PUT(req("PUT", body), ctx({ section: name }));
const original = { settings: null as SettingsJson["settings"] | null };

beforeEach(() => {
  signInAs(null);
});

afterAll(async () => {
  // Leave the demo lab's settings as they were, for the suites that run after this one.
  if (!original.settings) return;
  for (const [name, user] of [["thresholds", SEED.users.safety], ["vessels", SEED.users.admin], ["dispensing", SEED.users.admin]] as const) {
    const { version } = await read();
    as(user);
    await put(name, { version, value: original.settings[name] });
  }
});

describe("lab settings API", () => {
  it("everyone in the lab reads the settings, complete with defaults; another lab's are 404", async () => {
    const s = await read();
    original.settings = s.settings;
    expect(s.version).toBeGreaterThanOrEqual(1);
    expect(Object.keys(s.settings).sort()).toEqual(["blocks", "dispensing", "thresholds", "vessels"]);
    for (const u of [SEED.users.chemist, SEED.users.stockkeeper, SEED.users.safety, SEED.users.admin]) {
      as(u);
      expect((await settings.GET(req(), ctx({}))).status).toBe(200);
    }
    as(SEED.users.harrowChemist);
    expect((await settings.GET(req(), ctx({}))).status).toBe(404);
  });

  it("a chemist cannot edit any section (403) and nothing changes", async () => {
    const before = await read();
    as(SEED.users.chemist);
    for (const name of ["vessels", "blocks", "dispensing", "thresholds"] as const) {
      expect((await put(name, { version: before.version, value: before.settings[name] })).status).toBe(403);
    }
    expect((await read()).version).toBe(before.version);
  });

  it("a safety officer edits the thresholds but not the vessels; the change is audited before → after", async () => {
    const before = await read();
    as(SEED.users.safety);
    const value = { ...before.settings.thresholds, safetyFactor: 0.4, signOffTemperatureC: 100 };
    const res = await put("thresholds", { version: before.version, value });
    expect(res.status).toBe(200);
    const after = (await res.json()) as SettingsJson;
    expect(after.version).toBe(before.version + 1);
    expect(after.settings.thresholds).toMatchObject({ safetyFactor: 0.4, signOffTemperatureC: 100 });
    const entry = await AuditEntry.findOne({ where: { labId: SEED.labs.kestrel.id, action: "lab_settings.updated" }, order: [["id", "DESC"]] });
    expect(entry?.actorUserId).toBe(SEED.users.safety.id);
    expect(entry?.before).toMatchObject({ section: "thresholds", version: before.version, value: { safetyFactor: before.settings.thresholds.safetyFactor } });
    expect(entry?.after).toMatchObject({ section: "thresholds", version: before.version + 1, value: { safetyFactor: 0.4 } });

    const vessels = await put("vessels", { version: after.version, value: after.settings.vessels });
    expect(vessels.status).toBe(403);
    // The inventory reads the same thresholds (its peroxide intervals come from settings.thresholds).
    expect(((await Lab.findByPk(SEED.labs.kestrel.id))?.settings as { thresholds: Json }).thresholds).toMatchObject({ safetyFactor: 0.4 });
  });

  it("a lab admin edits vessels, blocks and limits but not the thresholds", async () => {
    let s = await read();
    as(SEED.users.admin);
    const vessels = { ...s.settings.vessels, types: s.settings.vessels.types.map((v) => (v.id === "vial-4ml-screw-septum" ? { ...v, ratedBar: 2.5, source: "Kestrel Bay pressure test 2026 (invented)", confirmWithSupplier: false } : v)) };
    const res = await put("vessels", { version: s.version, value: vessels });
    expect(res.status).toBe(200);
    s = (await res.json()) as SettingsJson;
    expect(s.settings.vessels.types.find((v) => v.id === "vial-4ml-screw-septum")).toMatchObject({ ratedBar: 2.5, confirmWithSupplier: false });
    const dispensing = await put("dispensing", { version: s.version, value: { ...s.settings.dispensing, minPipetteVolumeUl: 5 } });
    expect(dispensing.status).toBe(200);
    s = (await dispensing.json()) as SettingsJson;
    expect((await put("thresholds", { version: s.version, value: s.settings.thresholds })).status).toBe(403);
  });

  it("a stale version is 409 naming version; a bad value is 422 naming the field; neither changes anything", async () => {
    const s = await read();
    as(SEED.users.admin);
    const stale = await put("dispensing", { version: s.version - 1, value: { ...s.settings.dispensing, minPipetteVolumeUl: 1 } });
    expect(stale.status).toBe(409);
    expect(((await stale.json()) as { error: { issues: Array<{ path: string }> } }).error.issues.map((i) => i.path)).toEqual(["version"]);
    const bad = await put("blocks", { version: s.version, value: { ...s.settings.blocks, types: [{ ...s.settings.blocks.types[0]!, positions: 30 }] } });
    expect(bad.status).toBe(422);
    expect(((await bad.json()) as { error: { issues: Array<{ path: string }> } }).error.issues.map((i) => i.path)).toContain("value.types.0.positions");
    expect((await put("colours", { version: s.version, value: {} })).status).toBe(404);
    expect(await read()).toEqual(s);
  });

  it("a new plan takes the lab's settings where its document gives none, and shows the values it was computed with", async () => {
    const s = await read();
    as(SEED.users.chemist);
    const study = ((await (await studies.POST(req("POST", { name: `Settings ${randomUUID().slice(0, 6)}`, responses: [{ name: "yield", unit: "%", goal: "maximize" }] }), ctx({}))).json()) as { study: { id: string } }).study;
    const doc = JSON.parse(readFileSync(new URL("../../examples/plan-suzuki.json", import.meta.url), "utf8")) as Json;
    delete doc.vessel;
    delete doc.thresholds;
    delete doc.dispensing;
    delete doc.equipment;
    doc.block = "block-al-24";
    const res = await studyPlans.POST(req("POST", { document: doc }), ctx({ studyId: study.id }));
    expect(res.status).toBe(201);
    const { plan } = (await res.json()) as { plan: { computedWith: Json; document: Json; runSheet: { vessel: Json } } };
    const block = s.settings.blocks.types.find((b) => b.id === "block-al-24")!;
    expect(plan.computedWith).toMatchObject({
      vessel: s.settings.vessels.types.find((v) => v.id === s.settings.vessels.defaultId),
      block: { id: "block-al-24", positions: 24 },
      equipment: { blockMaxC: block.maxC, coolingMinC: block.minC },
      dispensing: s.settings.dispensing,
      thresholds: s.settings.thresholds,
    });
    expect(plan.runSheet.vessel).toEqual(plan.computedWith.vessel);
    expect(plan.document.thresholds).toEqual(s.settings.thresholds);
  });
});
