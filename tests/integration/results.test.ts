/**
 * Results entry through the real route handlers and PostgreSQL (only the session is
 * replaced): CONTRACT.md `PUT /plans/{plan}/results` — states (only released, running and
 * results_entered plans take results; the first result moves a released plan to running,
 * the last to results_entered), bad values are a 422 naming `runs.<i>.responses.<name>` and
 * store nothing, a CSV with bad rows is refused naming each row and column and stores
 * nothing (preview and confirmation), warnings for yields outside 0–100 %, failed runs with
 * a reason, corrections audited before → after, roles and labs; runs left out of the
 * analysis and brought back (audited). The plan is the demo's Suzuki–Miyaura screen
 * (examples/plan-suzuki.json, 18 runs); its state is set by a test fixture
 * (tests/support/plan-fixtures.ts) where release is not what is tested.
 */
import { randomUUID } from "node:crypto";
import { readFileSync } from "node:fs";
import { beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { Op } from "sequelize";
import { AuditEntry, Plan, PlanResult, AnalysisExclusion, Container, Reservation, StockLedgerEntry } from "@/lib/server/models";
import { reserveStock } from "@/inventory/server/reserve-stock";
import { releaseReservation } from "@/inventory/server/close-reservation";
import { SEED } from "../support/integration";
import { signInAs } from "../support/fake-session";
import { ctxOf, forcePlanState, req, type Json } from "../support/plan-fixtures";
import { vialMap } from "@/lib/plans/vial-map";

vi.mock("@/lib/auth/session", () => import("../support/fake-session"));

const studies = await import("@/app/api/labs/[lab]/studies/route");
const studyPlans = await import("@/app/api/labs/[lab]/studies/[studyId]/plans/route");
const planOne = await import("@/app/api/labs/[lab]/plans/[planId]/route");
const results = await import("@/app/api/labs/[lab]/plans/[planId]/results/route");
const preview = await import("@/app/api/labs/[lab]/plans/[planId]/results/preview/route");
const exclusions = await import("@/app/api/labs/[lab]/plans/[planId]/exclusions/route");
const exclusionOne = await import("@/app/api/labs/[lab]/plans/[planId]/exclusions/[exclusionId]/route");

const as = (u: { id: string; email: string }) => signInAs(u);
const lab = SEED.labs.kestrel.slug;
const ctx = ctxOf(lab);
const tag = randomUUID().slice(0, 8);
let studyId = "";
const example = (): Json => JSON.parse(readFileSync(new URL("../../examples/plan-suzuki.json", import.meta.url), "utf8")) as Json;
type ErrorJson = { error: { code: string; message: string; issues: Array<{ path: string; message: string }> } };
type Answer = { plan: { state: string }; results: { cells: Array<{ run: number; response: string; value: number | null; failed: boolean; reason: string | null; enteredBy: { id: string } }>; missing: number; complete: boolean }; warnings: Array<{ path: string; message: string }>; changed: { set: number; moves: string[] } };

async function newPlan(): Promise<string> {
  as(SEED.users.chemist);
  const res = await studyPlans.POST(req("/x", "POST", { document: { ...example(), name: `Results ${tag} ${randomUUID().slice(0, 4)}` } }), ctx({ studyId }));
  expect(res.status).toBe(201);
  return ((await res.json()) as { plan: { id: string } }).plan.id;
}
const put = (planId: string, body: unknown) => results.PUT(req("/x", "PUT", body), ctx({ planId }));
const counts = async (planId: string) => ({ cells: await PlanResult.count({ where: { planId } }), state: (await Plan.findByPk(planId))!.state, audits: await AuditEntry.count({ where: { entityId: planId } }) });
/** Every run's yield and impurity, invented: 18 runs. */
const allRuns = (yieldOf = (run: number) => 50 + run, impurity = 1.2) => Array.from({ length: 18 }, (_, i) => ({ run: i + 1, responses: { yield: yieldOf(i + 1), impurity } }));

beforeAll(async () => {
  as(SEED.users.chemist);
  const res = await studies.POST(req("/x", "POST", { name: `Results ${tag}`, responses: [{ name: "yield", unit: "%", goal: "maximize" }, { name: "impurity", unit: "area %", goal: "minimize" }] }), ctx({}));
  studyId = ((await res.json()) as { study: { id: string } }).study.id;
});
beforeEach(() => {
  signInAs(null);
});

describe("results entry", () => {
  it("a draft plan takes no results (409 naming state), and nothing is stored", async () => {
    const planId = await newPlan();
    const res = await put(planId, { runs: [{ run: 1, responses: { yield: 72.1 } }] });
    expect(res.status).toBe(409);
    expect(((await res.json()) as ErrorJson).error.issues.map((i) => i.path)).toEqual(["state"]);
    expect(await PlanResult.count({ where: { planId } })).toBe(0);
  });

  it("the first result moves a released plan to running; who and when are recorded and audited", async () => {
    const planId = await newPlan();
    await forcePlanState(planId, "released");
    as(SEED.users.chemist);
    const res = await put(planId, { runs: [{ run: 3, responses: { yield: 72.1 } }] });
    expect(res.status).toBe(200);
    const body = (await res.json()) as Answer;
    expect(body.plan.state).toBe("running");
    expect(body.changed.moves).toEqual(["released → running"]);
    expect(body.results.cells).toEqual([expect.objectContaining({ run: 3, response: "yield", value: 72.1, failed: false, enteredBy: expect.objectContaining({ id: SEED.users.chemist.id }) })]);
    expect(body.results.missing).toBe(18 * 2 - 1);
    const entry = await AuditEntry.findOne({ where: { entityId: planId, action: "plan.results_entered" }, order: [["createdAt", "DESC"]] });
    expect(entry?.actorUserId).toBe(SEED.users.chemist.id);
    expect(entry?.before).toMatchObject({ state: "released", "run 3 yield": null });
    expect(entry?.after).toMatchObject({ state: "running", "run 3 yield": 72.1 });
  });

  it("bad values are a 422 naming runs.<i>.responses.<name> (numbers only) and store nothing", async () => {
    const planId = await newPlan();
    await forcePlanState(planId, "running");
    as(SEED.users.chemist);
    await put(planId, { runs: [{ run: 1, responses: { yield: 60 } }] });
    const before = await counts(planId);
    const cases: Array<[unknown, string[]]> = [
      [{ runs: [{ run: 1, responses: { yield: 61 } }, { run: 2, responses: { yield: 70 } }, { run: 3, responses: { yield: 71 } }, { run: 4, responses: { yield: "72.1" } }] }, ["runs.3.responses.yield"]],
      [{ runs: [{ run: 1, responses: { yeild: 61 } }] }, ["runs.0.responses.yeild"]],
      [{ runs: [{ run: 99, responses: { yield: 61 } }] }, ["runs.0.run"]],
      [{ runs: [{ run: 2, responses: { yield: 61 } }, { run: 2, responses: { yield: 62 } }] }, ["runs.1.run"]],
      [{ runs: [{ run: 2, responses: { yield: 61 }, reason: "vial cracked" }] }, ["runs.0.reason"]],
      [{ runs: [{ run: 2.5, responses: { yield: 61 } }] }, ["runs.0.run"]],
      [{ runs: [] }, ["runs"]],
    ];
    for (const [body, paths] of cases) {
      const res = await put(planId, body);
      expect(res.status, JSON.stringify(body)).toBe(422);
      expect(((await res.json()) as ErrorJson).error.issues.map((i) => i.path)).toEqual(paths);
    }
    expect(await counts(planId)).toEqual(before);
    // The value typed first is unchanged.
    expect((await PlanResult.findOne({ where: { planId, run: 1, response: "yield" } }))?.value).toBe(60);
  });

  it("a CSV with bad rows is refused naming each row and column; neither the preview nor the confirmation stores anything", async () => {
    const planId = await newPlan();
    await forcePlanState(planId, "released");
    as(SEED.users.chemist);
    const before = await counts(planId);
    // Row 2: a decimal comma; row 3: no such run; row 4: a word; row 5: run 1 again.
    const csv = ["Run,Yield (%),Impurity (area %)", "1,72.1,1.1", "2,\"68,4\",0.9", "42,70,1", "4,n/a,1.0", "1,66,1.2"].join("\n");
    const pre = await preview.POST(req("/x", "POST", { csv }), ctx({ planId }));
    expect(pre.status).toBe(200);
    const { preview: p } = (await pre.json()) as { preview: { mapBy: string; mapping: Json; issues: Array<{ row: number; column: string; message: string }>; runs: unknown[] } };
    expect(p.mapBy).toBe("run");
    expect(p.mapping).toMatchObject({ run: "Run", responses: { yield: "Yield (%)", impurity: "Impurity (area %)" } });
    expect(p.issues.map((i) => [i.row, i.column])).toEqual([
      [2, "Yield (%)"],
      [3, "Run"],
      [4, "Yield (%)"],
      [5, "Run"],
    ]);
    expect(p.issues[0]!.message).toContain("decimal mark");
    expect(p.runs).toEqual([]);
    expect(await counts(planId)).toEqual(before);

    const res = await put(planId, { csv });
    expect(res.status).toBe(422);
    const err = ((await res.json()) as ErrorJson).error;
    expect(err.issues.map((i) => i.path)).toEqual(["rows.2.yield", "rows.3.run", "rows.4.yield", "rows.5.run"]);
    expect(err.issues[1]!.message).toBe("row 3, column Run: the plan has no run 42");
    expect(err.message).toContain("nothing was stored");
    expect(await counts(planId)).toEqual(before);
  });

  it("a good CSV completes the plan: results_entered; a yield above 100 % is warned, not refused", async () => {
    const planId = await newPlan();
    await forcePlanState(planId, "released");
    as(SEED.users.chemist);
    const lines = ["run,yield,impurity", ...allRuns((r) => (r === 5 ? 104 : 55 + r)).map((r) => `${r.run},${r.responses.yield},${r.responses.impurity}`)];
    const res = await put(planId, { csv: lines.join("\r\n") });
    expect(res.status).toBe(200);
    const body = (await res.json()) as Answer;
    expect(body.plan.state).toBe("results_entered");
    expect(body.changed.moves).toEqual(["released → running", "running → results_entered"]);
    expect(body.results.complete).toBe(true);
    expect(body.warnings.map((w) => w.path)).toEqual(["rows.5.yield"]);
    expect(body.warnings[0]!.message).toContain("outside 0–100 %");
    expect(await PlanResult.count({ where: { planId } })).toBe(36);
  });

  it("a CSV mapped by vial position lands on the runs the vial map puts there; an unknown position is refused by row", async () => {
    const planId = await newPlan();
    await forcePlanState(planId, "running");
    as(SEED.users.chemist);
    const { plan } = (await (await planOne.GET(req("/x"), ctx({ planId }))).json()) as { plan: { document: { block: { positions: number } }; runSheet: { runs: Array<{ run: number; runOrder: number; temperatureC: number }> } } };
    // The positions as the plan page, prep sheet and worklist show them (lib/plans/vial-map.ts).
    const placements = vialMap(plan.runSheet.runs, { positions: plan.document.block.positions }).placements;
    const csv = ["Vial,Yield", ...placements.map((p) => `${p.vial},${40 + p.run}`)].join("\n");
    const pre = (await (await preview.POST(req("/x", "POST", { csv }), ctx({ planId }))).json()) as { preview: { mapBy: string; issues: unknown[]; runs: Array<{ run: number; responses: { yield: number } }> } };
    expect(pre.preview.mapBy).toBe("vial");
    expect(pre.preview.issues).toEqual([]);
    expect(pre.preview.runs.map((r) => [r.run, r.responses.yield]).sort((a, b) => a[0]! - b[0]!)).toEqual(plan.runSheet.runs.map((r) => [r.run, 40 + r.run]).sort((a, b) => a[0]! - b[0]!));
    const bad = await put(planId, { csv: `${csv}\nZ9,50` });
    expect(bad.status).toBe(422);
    expect(((await bad.json()) as ErrorJson).error.issues.map((i) => i.path)).toEqual([`rows.${placements.length + 1}.vial`]);
    expect(await PlanResult.count({ where: { planId } })).toBe(0);
    expect((await put(planId, { csv })).status).toBe(200);
    expect((await PlanResult.findOne({ where: { planId, run: 5, response: "yield" } }))?.value).toBe(45);
  });

  it("a failed run (null) with its reason counts as entered; a correction of an entered plan is audited; removing a result of it is refused", async () => {
    const planId = await newPlan();
    await forcePlanState(planId, "running");
    as(SEED.users.chemist);
    const runs = allRuns().map((r) => (r.run === 7 ? { run: 7, responses: null, reason: "septum failed, solvent lost" } : r));
    const res = await put(planId, { runs });
    expect(res.status).toBe(200);
    const body = (await res.json()) as Answer;
    expect(body.plan.state).toBe("results_entered");
    expect(body.results.cells.filter((c) => c.run === 7)).toEqual([
      expect.objectContaining({ response: "impurity", value: null, failed: true, reason: "septum failed, solvent lost" }),
      expect.objectContaining({ response: "yield", value: null, failed: true, reason: "septum failed, solvent lost" }),
    ]);
    as(SEED.users.admin);
    const fix = await put(planId, { runs: [{ run: 2, responses: { yield: 58.5 } }] });
    expect(fix.status).toBe(200);
    const entry = await AuditEntry.findOne({ where: { entityId: planId, action: "plan.results_corrected" } });
    expect(entry?.actorUserId).toBe(SEED.users.admin.id);
    expect(entry?.before).toMatchObject({ state: "results_entered", "run 2 yield": 52 });
    expect(entry?.after).toMatchObject({ state: "results_entered", "run 2 yield": 58.5 });
    const clear = await put(planId, { runs: [{ run: 2, clear: ["yield"] }] });
    expect(clear.status).toBe(409);
    expect((await PlanResult.findOne({ where: { planId, run: 2, response: "yield" } }))?.value).toBe(58.5);
  });

  it("roles and labs: a viewer may read but not enter (403); another lab's plan is 404", async () => {
    const planId = await newPlan();
    await forcePlanState(planId, "running");
    as(SEED.users.viewer);
    expect((await put(planId, { runs: [{ run: 1, responses: { yield: 1 } }] })).status).toBe(403);
    expect((await results.GET(req("/x"), ctx({ planId }))).status).toBe(200);
    as(SEED.users.harrowChemist);
    expect((await put(planId, { runs: [{ run: 1, responses: { yield: 1 } }] }, )).status).toBe(404);
    expect((await results.PUT(req("/x", "PUT", { runs: [{ run: 1, responses: { yield: 1 } }] }), ctx({ planId }, SEED.labs.harrow.slug))).status).toBe(404);
    expect(await PlanResult.count({ where: { planId } })).toBe(0);
  });
});

describe("stock follows results", () => {
  it("the results that complete a plan consume its reservations with the amounts used (planned by default), release an unused one, and the ledger balances", async () => {
    const planId = await newPlan();
    await forcePlanState(planId, "running");
    const boxes = await Container.findAll({ where: { labId: SEED.labs.kestrel.id, status: "available", dimension: "mass" }, order: [["id", "ASC"]], limit: 3 });
    expect(boxes).toHaveLength(3);
    const amountsBefore = boxes.map((b) => BigInt(b.amountBase));
    // Reserved as release reserves them: held for the plan (inventory/server/reserve-stock.ts).
    const held = await reserveStock({ labId: SEED.labs.kestrel.id, actorUserId: SEED.users.chemist.id, planId, input: { planRef: "results plan", lines: boxes.map((b) => ({ containerId: b.id, amount: "10", unit: "mg" })) } });
    // A reservation whose text reference merely names the plan is not the plan's (the foreign key decides): left held.
    const [other] = await reserveStock({ labId: SEED.labs.kestrel.id, actorUserId: SEED.users.chemist.id, input: { planRef: planId, lines: [{ containerId: boxes[0]!.id, amount: "1", unit: "mg" }] } });
    as(SEED.users.chemist);
    // Not complete yet: consumption is refused at its field, nothing is stored.
    const early = await put(planId, { runs: [{ run: 1, responses: { yield: 50 } }], consumption: [{ reservationId: held[0]!.id, amount: "8", unit: "mg" }] });
    expect(early.status).toBe(422);
    expect(((await early.json()) as ErrorJson).error.issues.map((i) => i.path)).toEqual(["consumption"]);
    const res = await put(planId, { runs: allRuns(), consumption: [{ reservationId: held[0]!.id, amount: "8.5", unit: "mg" }, { reservationId: held[2]!.id, amount: "0", unit: "mg" }] });
    expect(res.status).toBe(200);
    const body = (await res.json()) as Answer & { changed: { consumed: number; released: number } };
    expect(body.plan.state).toBe("results_entered");
    expect(body.changed).toMatchObject({ consumed: 2, released: 1 });
    const after = await Container.findAll({ where: { id: { [Op.in]: boxes.map((b) => b.id) } }, order: [["id", "ASC"]] });
    // 8.5 mg used of the first (1 mg = 1000 µg), the planned 10 mg of the second, nothing of the third.
    expect(after.map((b, i) => amountsBefore[i]! - BigInt(b.amountBase))).toEqual([8500n, 10000n, 0n]);
    const rs = await Reservation.findAll({ where: { id: { [Op.in]: held.map((h) => h.id) } } });
    expect(Object.fromEntries(rs.map((r) => [r.id, [r.status, r.consumedBase]]))).toEqual({ [held[0]!.id]: ["consumed", "8500"], [held[1]!.id]: ["consumed", "10000"], [held[2]!.id]: ["released", null] });
    expect((await Reservation.findByPk(other!.id))!.status).toBe("held");
    await releaseReservation({ labId: SEED.labs.kestrel.id, actorUserId: SEED.users.chemist.id, reservationId: other!.id, input: { reason: "test over" } });
    // The ledger balances: per container, the deltas of the plan's lines add up to the change of amount, and nothing is still held.
    for (const [i, b] of boxes.entries()) {
      const lines = await StockLedgerEntry.findAll({ where: { containerId: b.id, reservationId: held[i]!.id } });
      expect(lines.reduce((s, l) => s + BigInt(l.deltaBase), 0n)).toBe(BigInt(after[i]!.amountBase) - amountsBefore[i]!);
      expect(lines.reduce((s, l) => s + BigInt(l.heldDeltaBase), 0n)).toBe(0n);
    }
    // A second completion does not consume again (corrections leave the stock alone).
    expect((await put(planId, { runs: [{ run: 3, responses: { yield: 60 } }] })).status).toBe(200);
    expect((await Container.findByPk(boxes[1]!.id))!.amountBase).toBe(after[1]!.amountBase);
  });
});

describe("runs left out of the analysis", () => {
  it("a run is left out with a reason, refused twice, brought back; both audited", async () => {
    const planId = await newPlan();
    await forcePlanState(planId, "running");
    as(SEED.users.chemist);
    const res = await exclusions.POST(req("/x", "POST", { run: 4, reason: "stirrer bar stuck" }), ctx({ planId }));
    expect(res.status).toBe(201);
    const { exclusion } = (await res.json()) as { exclusion: { id: string; run: number; response: string | null; reason: string } };
    expect(exclusion).toMatchObject({ run: 4, response: null, reason: "stirrer bar stuck" });
    expect((await exclusions.POST(req("/x", "POST", { run: 4, response: "yield", reason: "again" }), ctx({ planId }))).status).toBe(409);
    expect((await exclusions.POST(req("/x", "POST", { run: 40, reason: "no such run" }), ctx({ planId }))).status).toBe(422);
    const back = await exclusionOne.DELETE(req("/x", "DELETE"), ctx({ planId, exclusionId: exclusion.id }));
    expect(back.status).toBe(200);
    expect((await exclusionOne.DELETE(req("/x", "DELETE"), ctx({ planId, exclusionId: exclusion.id }))).status).toBe(409);
    const row = await AnalysisExclusion.findByPk(exclusion.id);
    expect(row?.restoredBy).toBe(SEED.users.chemist.id);
    expect((await AuditEntry.findAll({ where: { entityId: planId, action: ["plan.run_excluded", "plan.run_restored"] } })).map((e) => e.action).sort()).toEqual(["plan.run_excluded", "plan.run_restored"]);
  });
});
