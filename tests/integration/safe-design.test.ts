/**
 * `POST /api/labs/{lab}/plans/alternatives` through the real route handler and PostgreSQL
 * (only the session is replaced): the blocking runs and the alternatives of a plan document
 * as it would be stored — the lab's defaults filled in and the inventory's hazard facts of
 * linked chemicals applied —, a bad document refused at `document.<path>`, and nothing
 * written either way. The document is the demo's Suzuki–Miyaura screen
 * (examples/plan-suzuki.json) with its design made a rotatable CCD.
 */
import { readFileSync } from "node:fs";
import { beforeEach, describe, expect, it, vi } from "vitest";
import { AuditEntry, Plan } from "@/lib/server/models";
import { routeCtx, signInAs } from "../support/fake-session";
import { SEED } from "../support/integration";

vi.mock("@/lib/auth/session", () => import("../support/fake-session"));

const alternatives = await import("@/app/api/labs/[lab]/plans/alternatives/route");

type Json = Record<string, unknown>;
interface Report {
  blockingRuns: Array<{ run: number; standardOrder: number; runOrder: number; natural: Record<string, number>; findings: Array<{ code: string; severity: string; message: string }> }>;
  alternatives: Array<{ kind: string; available: boolean; runCount: number | null; nothingBlocks: boolean | null; dEfficiency: number | null; changes: string[]; document: Json | null }>;
  notComputed: string[];
}
const as = signInAs;
const post = (body: unknown) => alternatives.POST(new Request("http://test.invalid/x", { method: "POST", headers: { "content-type": "application/json" }, body: JSON.stringify(body) }), routeCtx({}));
/** The seeded chemical n (seeders/20261201001000-demo-inventory.cjs). */
const seeded = (n: number) => `c4e10000-0000-4000-8000-${String(n).padStart(12, "0")}`;

function ccd(): Json & { factors: Json[]; recipe: Json & { components: Json[] } } {
  const d = JSON.parse(readFileSync(new URL("../../examples/plan-suzuki.json", import.meta.url), "utf8")) as Json & { factors: Json[]; recipe: Json & { components: Json[] } };
  d.factors = d.factors.slice(0, 3).map((f, i) => (i === 0 ? { ...f, low: 80, high: 120 } : f));
  d.recipe.components[1]!.solubilityMgPerMl = 200;
  d.design = { design: "central-composite", alpha: "rotatable", centerPoints: 3, seed: 7 };
  return d;
}

async function counts() {
  return { plans: await Plan.count(), audit: await AuditEntry.count() };
}

beforeEach(() => {
  signInAs(null);
});

describe("POST /plans/alternatives", () => {
  it("names the blocking run and offers the alternatives; writes nothing", async () => {
    const before = await counts();
    as(SEED.users.viewer);
    const res = await post({ document: ccd(), kinds: ["face-centered", "inscribed", "smaller-alpha", "narrower-range"] });
    expect(res.status).toBe(200);
    const r = (await res.json()) as Report;
    // +α on temperature: 100 + 1.682·20 = 133.6 °C, within the lab's 50 °C of 1,4-dioxane's
    // autoignition temperature (180 °C, REFERENCE.md §3, from memory): run 10 in standard order.
    expect(r.blockingRuns.map((b) => b.standardOrder)).toEqual([10]);
    expect(r.blockingRuns[0]!.findings.map((f) => f.code)).toEqual(["TL-F02"]);
    expect(r.alternatives.map((a) => a.kind)).toEqual(["face-centered", "inscribed", "smaller-alpha", "narrower-range"]);
    expect(r.alternatives.every((a) => a.nothingBlocks === true && a.runCount === 17)).toBe(true);
    expect(r.notComputed).toEqual(["d-optimal"]);
    expect(await counts()).toEqual(before);
  });

  it("judges the document with the inventory's hazard facts: n-butyllithium linked by chemicalId meets the water (TL-R04)", async () => {
    // Typed without hazards; the inventory records it pyrophoric and water-reactive (the seeded chemical 9).
    const d = ccd();
    d.recipe.components.push({ id: "buli", name: "n-butyllithium 2.5 M in hexanes", role: "additive", formula: "C4H9Li", equivalents: 0.05, chemicalId: seeded(9), form: { state: "solution", molarityM: 2.5, solvent: "hexanes" } });
    as(SEED.users.chemist);
    const r = (await (await post({ document: d, kinds: ["face-centered"] })).json()) as Report;
    expect(r.blockingRuns).toHaveLength(17);
    expect(r.blockingRuns.every((b) => b.findings.some((f) => f.code === "TL-R04"))).toBe(true);
    // No change of the design clears a reagent that meets water in every vial.
    expect(r.alternatives[0]!.nothingBlocks).toBe(false);
  });

  it("a bad document is a 422 at document.<path>; another lab's member gets 404; no session is 401", async () => {
    const before = await counts();
    as(SEED.users.chemist);
    const bad = ccd();
    bad.factors[0] = { ...bad.factors[0], high: "hot" };
    const res = await post({ document: bad });
    expect(res.status).toBe(422);
    const paths = ((await res.json()) as { error: { issues: Array<{ path: string }> } }).error.issues.map((i) => i.path);
    expect(paths).toContain("document.factors.0.high");
    const unknownChemical = ccd();
    unknownChemical.recipe.components[0] = { ...unknownChemical.recipe.components[0], chemicalId: seeded(17) }; // Harrow Fen's acetonitrile
    const res2 = await post({ document: unknownChemical });
    expect(res2.status).toBe(422);
    expect(((await res2.json()) as { error: { issues: Array<{ path: string }> } }).error.issues.map((i) => i.path)).toEqual(["document.recipe.components.0.chemicalId"]);
    as(SEED.users.harrowChemist);
    expect((await post({ document: ccd() })).status).toBe(404);
    signInAs(null);
    expect((await post({ document: ccd() })).status).toBe(401);
    expect(await counts()).toEqual(before);
  });
});
