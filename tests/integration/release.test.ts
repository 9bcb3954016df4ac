/**
 * Release and cancellation through the real route handlers and PostgreSQL (only the
 * session is replaced): CONTRACT.md `POST /plans/{plan}/release` and `/cancel`, issue 11
 * "Release". The plan is the demo's Suzuki–Miyaura screen (examples/plan-suzuki.json) with
 * its components and solvent linked to chemicals this test stocks through the inventory's
 * own operations, so the seeded stock is never touched (named "Release test …", so a
 * catalogue search for a demo chemical in the browser tests, which run later on the same
 * database, finds only the demo's).
 *
 * Checked against things outside the release code: the run sheet the plan GET returns
 * (the `plan` verb's output) for the amounts, computed here exactly from its decimal text;
 * the release rule of PRODUCT.md ("first to expire first, opened containers before sealed
 * ones") for which container is taken; the reservations and containers tables read with
 * SQL; the SMTP server inside the test for the stockkeepers' notice; and concurrency with
 * twenty releases started together on the real pool.
 */
import { randomUUID } from "node:crypto";
import { afterAll, beforeAll, describe, expect, it, vi } from "vitest";
import { QueryTypes } from "sequelize";
import { Plan, Reservation } from "@/lib/server/models";
import { SEED, db } from "../support/integration";
import { signInAs } from "../support/fake-session";
import { SmtpCapture, attachmentContent, testSmtpPort, unfoldQuotedPrintable } from "../support/smtp-capture";
import { escapeRegExp, flat, pdfText } from "../unit/reports/pdf-tools";
import { ceilThousandths, ctx, databaseNow, daysFromToday, linkChemicals, mailJobsPending, req, stockedChemical, suzuki, suzukiHot, type ErrorJson, type Json, type PlanJson } from "../support/plan-api";

vi.mock("@/lib/auth/session", () => import("../support/fake-session"));

const studies = await import("@/app/api/labs/[lab]/studies/route");
const studyPlans = await import("@/app/api/labs/[lab]/studies/[studyId]/plans/route");
const planOne = await import("@/app/api/labs/[lab]/plans/[planId]/route");
const release = await import("@/app/api/labs/[lab]/plans/[planId]/release/route");
const cancel = await import("@/app/api/labs/[lab]/plans/[planId]/cancel/route");
const start = await import("@/app/api/labs/[lab]/plans/[planId]/start/route");
const timeline = await import("@/app/api/labs/[lab]/plans/[planId]/timeline/route");
const prepSheet = await import("@/app/api/labs/[lab]/plans/[planId]/prep-sheet.pdf/route");
const worklist = await import("@/app/api/labs/[lab]/plans/[planId]/worklist.csv/route");
const results = await import("@/app/api/labs/[lab]/plans/[planId]/results/route");

const as = (u: { id: string; email: string }) => signInAs(u);
const tag = randomUUID().slice(0, 8);
const smtp = new SmtpCapture(testSmtpPort());
let startedAt = "";
let studyId = "";
let links: { components: Record<string, string>; solvents: Record<string, string> };
const stock: Record<string, { chemicalId: string; containerIds: string[] }> = {};

async function createPlan(document: unknown): Promise<PlanJson> {
  as(SEED.users.chemist);
  const res = await studyPlans.POST(req("POST", { document }), ctx({ studyId }));
  expect(res.status, JSON.stringify(await res.clone().json())).toBe(201);
  return ((await res.json()) as { plan: PlanJson }).plan;
}
const getPlan = async (id: string) => ((await (await planOne.GET(req(), ctx({ planId: id }))).json()) as { plan: PlanJson }).plan;
type PlanRoute = { POST: (r: Request, c: { params: Promise<{ lab: string; planId: string }> }) => Promise<Response> };
const post = (mod: PlanRoute, planId: string) => mod.POST(req("POST"), ctx({ planId }));

/** What the reservations table holds, per container, for a set of containers (SQL, not the project's code). */
async function heldByContainer(ids: string[]): Promise<Map<string, bigint>> {
  const rows = await db().query<{ id: string; held: string }>(
    "SELECT container_id AS id, COALESCE(SUM(amount_base) FILTER (WHERE status = 'held'), 0)::text AS held FROM reservations WHERE container_id IN (:ids) GROUP BY container_id",
    { replacements: { ids }, type: QueryTypes.SELECT },
  );
  return new Map(rows.map((r) => [r.id, BigInt(r.held)]));
}

beforeAll(async () => {
  startedAt = await databaseNow();
  await smtp.start();
  as(SEED.users.chemist);
  const res = await studies.POST(req("POST", { name: `Release ${tag}`, responses: [{ name: "yield", unit: "%", goal: "maximize" }] }), ctx({}));
  studyId = ((await res.json()) as { study: { id: string } }).study.id;
  // Aryl bromide: one bottle by volume. Boronic acid: three jars, to see which the release rule takes.
  stock.arBr = await stockedChemical({ name: `Release test ${tag}: 1-bromo-4-isopropylbenzene`, molarMass: "199.09", density: "1.290", physicalState: "liquid" }, [
    { barcode: `RL-${tag}-A1`, amount: "50", unit: "mL", expiresOn: daysFromToday(400), openedOn: daysFromToday(-30), purityPercent: "98" },
  ]);
  stock.boronicAcid = await stockedChemical({ name: `Release test ${tag}: 2-methoxypyridin-3-ylboronic acid`, molarMass: "152.94", physicalState: "solid" }, [
    { barcode: `RL-${tag}-B1`, amount: "10", unit: "g", expiresOn: daysFromToday(100), purityPercent: "97" }, // sealed, first to expire
    { barcode: `RL-${tag}-B2`, amount: "10", unit: "g", expiresOn: daysFromToday(300), openedOn: daysFromToday(-10), purityPercent: "97" }, // opened, expires later
    { barcode: `RL-${tag}-B3`, amount: "10", unit: "g", expiresOn: daysFromToday(100), openedOn: daysFromToday(-20), purityPercent: "97" }, // opened, first to expire: the one to take
  ]);
  stock.base = await stockedChemical({ name: `Release test ${tag}: potassium phosphate tribasic`, molarMass: "212.27", physicalState: "solid" }, [{ barcode: `RL-${tag}-K1`, amount: "100", unit: "g", expiresOn: daysFromToday(500), purityPercent: "98" }]);
  stock.dioxane = await stockedChemical({ name: `Release test ${tag}: 1,4-dioxane`, molarMass: "88.11", density: "1.033", physicalState: "liquid" }, [{ barcode: `RL-${tag}-D1`, amount: "1", unit: "L", expiresOn: daysFromToday(300), openedOn: daysFromToday(-5), purityPercent: "99.8" }]);
  links = {
    components: { arBr: stock.arBr.chemicalId, boronicAcid: stock.boronicAcid.chemicalId, base: stock.base.chemicalId },
    solvents: { "1,4-dioxane": stock.dioxane.chemicalId },
  };
});
afterAll(async () => {
  // Every mail this file queued is delivered (to this file's capture) before it stops listening.
  await vi.waitFor(async () => expect(await mailJobsPending(startedAt)).toBe(0), { timeout: 120_000, interval: 500 });
  await smtp.stop();
}, 150_000);

describe("release", () => {
  it("a plan no rule flags goes from draft to released, reserving exactly the run sheet's totals (overage and dead volume included)", async () => {
    const plan = await createPlan(linkChemicals(suzuki(), links));
    expect(plan).toMatchObject({ state: "draft", signOffRequired: false, releasable: true });
    const res = await post(release, plan.id);
    expect(res.status, JSON.stringify(await res.clone().json())).toBe(200);
    const released = ((await res.json()) as { plan: PlanJson }).plan;
    expect(released).toMatchObject({ state: "released", version: plan.version + 1 });

    // The run sheet's totals (the `plan` verb's `inventory` lines), in base units: µL → nL, mg → µg.
    const lines = new Map(plan.runSheet!.inventory.map((l) => [l.id, l]));
    const expected: Record<string, bigint> = {
      arBr: ceilThousandths(lines.get("arBr")!.volumeUl!), // a liquid: the volume to take
      boronicAcid: ceilThousandths(lines.get("boronicAcid")!.massMg!), // solids: the mass to weigh
      base: ceilThousandths(lines.get("base")!.massMg!),
      dioxane: ceilThousandths(lines.get("1,4-dioxane")!.volumeUl!),
    };
    // The dispensing settings: 10 % overage and 50 µL dead volume are part of those totals.
    expect(plan.document.dispensing).toMatchObject({ overagePercent: 10, deadVolumeUl: 50 });
    for (const [key, base] of Object.entries(expected)) {
      const rows = await db().query<{ total: string; n: string }>(
        "SELECT COALESCE(SUM(r.amount_base), 0)::text AS total, count(*)::text AS n FROM reservations r JOIN containers c ON c.id = r.container_id WHERE r.plan_id = :plan AND c.chemical_id = :chem AND r.status = 'held'",
        { replacements: { plan: plan.id, chem: stock[key]!.chemicalId }, type: QueryTypes.SELECT },
      );
      expect(BigInt(rows[0]!.total), key).toBe(base);
      expect(rows[0]!.n, `${key}: one container covers it`).toBe("1");
    }
    // Water and the catalyst name no chemical: nothing is reserved for them.
    expect(released.reservations).toHaveLength(4);
    // First to expire first, opened before sealed: B3 (opened, expires in 100 days), not B1 (sealed, same date) or B2 (later).
    const boronic = released.reservations.find((r) => r.chemicalId === stock.boronicAcid!.chemicalId)!;
    expect(boronic.barcode).toBe(`RL-${tag}-B3`);
    // Tied to the plan by its foreign key (reservations.plan_id → plans).
    const fk = await db().query<{ n: string }>(
      "SELECT count(*)::text AS n FROM reservations r JOIN plans p ON p.id = r.plan_id AND p.lab_id = r.lab_id WHERE p.id = :plan",
      { replacements: { plan: plan.id }, type: QueryTypes.SELECT },
    );
    expect(fk[0]!.n).toBe("4");

    // The timeline shows the release and each reservation.
    const items = ((await (await timeline.GET(req(), ctx({ planId: plan.id }))).json()) as { timeline: Array<{ title: string; kind: string }> }).timeline;
    expect(items.map((i) => i.title)).toEqual(expect.arrayContaining(["Created the plan", "Released", `Reserved stock: RL-${tag}-B3`]));
    expect(items.filter((i) => i.kind === "reservation")).toHaveLength(4);

    // Cancelling releases every held reservation in the same transaction.
    const cancelled = await post(cancel, plan.id);
    expect(cancelled.status).toBe(200);
    const after = ((await cancelled.json()) as { plan: PlanJson }).plan;
    expect(after.state).toBe("cancelled");
    expect(after.reservations.map((r) => r.status)).toEqual(["released", "released", "released", "released"]);
    const held = await heldByContainer(Object.values(stock).flatMap((s) => s.containerIds));
    expect([...held.values()].every((h) => h === 0n)).toBe(true);
  });

  it("a shortfall is a 409 naming the chemical with needed and available amounts; nothing is reserved, and the stockkeepers are told", async () => {
    const scarce = await stockedChemical({ name: `Release test ${tag}: potassium phosphate, scarce`, molarMass: "212.27", physicalState: "solid" }, [{ barcode: `RL-${tag}-S1`, amount: "1", unit: "g", expiresOn: daysFromToday(200), purityPercent: "98" }]);
    const plan = await createPlan(linkChemicals(suzuki(), { ...links, components: { ...links.components, base: scarce.chemicalId } }));
    const heldBefore = await heldByContainer(Object.values(stock).flatMap((s) => s.containerIds));
    const res = await post(release, plan.id);
    expect(res.status).toBe(409);
    const body = (await res.json()) as ErrorJson;
    const needed = plan.runSheet!.inventory.find((l) => l.id === "base")!.massMg!;
    expect(body.shortfalls).toHaveLength(1);
    expect(body.shortfalls![0]).toMatchObject({ chemicalId: scarce.chemicalId, name: `Release test ${tag}: potassium phosphate, scarce`, unit: "mg" });
    expect(body.shortfalls![0]!.needed).toBeCloseTo(needed, 9);
    expect(body.shortfalls![0]!.available).toBeCloseTo(1000, 6); // the one 1 g jar
    expect(body.error.issues.map((i) => i.path)).toEqual(["shortfalls"]);
    // Nothing reserved — not even the chemicals that were there — and the plan is as it was.
    expect(await Reservation.count({ where: { planId: plan.id } })).toBe(0);
    expect(await heldByContainer(Object.values(stock).flatMap((s) => s.containerIds))).toEqual(heldBefore);
    expect(await Plan.findByPk(plan.id)).toMatchObject({ state: "draft", version: plan.version });
    // The stockkeeper's notice was queued outside the rolled-back release and arrives.
    await expect.poll(() => smtp.received.some((m) => m.to.includes(SEED.users.stockkeeper.email) && unfoldQuotedPrintable(m.raw).includes(`Release test ${tag}: potassium phosphate, scarce`)), { timeout: 90_000, interval: 250 }).toBe(true);
  }, 120_000);

  it("sign-off required: a draft cannot be released without review (409 naming signOffRequired)", async () => {
    const plan = await createPlan(linkChemicals(suzukiHot(), links));
    expect(plan.signOffRequired).toBe(true);
    const res = await post(release, plan.id);
    expect(res.status).toBe(409);
    expect(((await res.json()) as ErrorJson).error.issues.map((i) => i.path)).toEqual(["signOffRequired"]);
    expect(await Reservation.count({ where: { planId: plan.id } })).toBe(0);
    expect(await Plan.findByPk(plan.id)).toMatchObject({ state: "draft", version: plan.version });
  });

  it("start: released → running; a running plan can no longer be cancelled", async () => {
    const plan = await createPlan(linkChemicals(suzuki(), links));
    expect((await post(release, plan.id)).status).toBe(200);
    const started = await post(start, plan.id);
    expect(started.status).toBe(200);
    expect(((await started.json()) as { plan: PlanJson }).plan.state).toBe("running");
    const refused = await post(cancel, plan.id);
    expect(refused.status).toBe(409);
    expect((await getPlan(plan.id)).reservations.every((r) => r.status === "held")).toBe(true);
  });

  it("results move a released plan through the same table: first results → running, the last → results entered, its reservations consumed", async () => {
    const plan = await createPlan(linkChemicals(suzuki(), links));
    expect((await post(release, plan.id)).status).toBe(200);
    const runs = (plan.runSheet!.runs as Array<{ run: number }>).map((r) => r.run);
    const put = (body: unknown) => results.PUT(req("PUT", body), ctx({ planId: plan.id }));
    // A viewer holds no plans.execute (the permission the table gives start and enter_results): 403, nothing moves.
    as(SEED.users.viewer);
    expect((await put({ runs: [{ run: runs[0], responses: { yield: 40 } }] })).status).toBe(403);
    as(SEED.users.chemist);
    const first = await put({ runs: [{ run: runs[0], responses: { yield: 40 } }] });
    expect(first.status, JSON.stringify(await first.clone().json())).toBe(200);
    const running = ((await first.json()) as { plan: PlanJson; changed: { moves: string[] } });
    expect(running.changed.moves).toEqual(["released → running"]);
    expect(running.plan).toMatchObject({ state: "running", version: plan.version + 2 }); // release, then start
    // Running: cancel is no longer a move (409), the stock stays held.
    expect((await post(cancel, plan.id)).status).toBe(409);
    const last = await put({ runs: runs.map((run, i) => ({ run, responses: { yield: 40 + i } })) });
    expect(last.status).toBe(200);
    const done = (await last.json()) as { plan: PlanJson; changed: { moves: string[]; consumed: number } };
    expect(done.changed).toMatchObject({ moves: ["running → results_entered"], consumed: 4 });
    expect(done.plan).toMatchObject({ state: "results_entered", version: plan.version + 3 });
    expect(done.plan.reservations.map((r) => r.status)).toEqual(["consumed", "consumed", "consumed", "consumed"]);
    // A results-entered plan is past running: cancel and start are not moves.
    expect((await post(cancel, plan.id)).status).toBe(409);
    expect((await post(start, plan.id)).status).toBe(409);
    const items = ((await (await timeline.GET(req(), ctx({ planId: plan.id }))).json()) as { timeline: Array<{ title: string; changes: Array<{ label: string; after: string | null }> }> }).timeline;
    const entered = items.filter((i) => i.title === "Entered results");
    expect(entered.map((i) => i.changes.find((c) => c.label === "state")?.after)).toEqual(["Running", "Results entered"]);
    expect(entered[1]!.changes).toEqual(expect.arrayContaining([{ field: "reservationsConsumed", label: "reservations consumed", before: null, after: "4" }]));
  });

  it("a viewer may not release or cancel (403), a stockkeeper neither", async () => {
    const plan = await createPlan(linkChemicals(suzuki(), links));
    for (const u of [SEED.users.viewer, SEED.users.stockkeeper, SEED.users.safety]) {
      as(u);
      expect((await post(release, plan.id)).status).toBe(403);
      expect((await post(cancel, plan.id)).status).toBe(403);
    }
    as(SEED.users.harrowChemist);
    expect((await post(release, plan.id)).status).toBe(404);
    expect(await Plan.findByPk(plan.id)).toMatchObject({ state: "draft", version: plan.version });
  });
});

describe("the prep sheet and the worklist", () => {
  it("are served as PDF and CSV, and the release mail to the author carries both", async () => {
    const plan = await createPlan({ ...linkChemicals(suzuki(), links), name: `Sheets ${tag}` });
    expect((await post(release, plan.id)).status).toBe(200);
    const released = await getPlan(plan.id);
    const sheet = released.runSheet as unknown as { runs: Array<{ run: number; runOrder: number; temperatureC: number; dispense: Array<{ step: number; name: string; kind: string; massMg: number | null; volumeUl: number | null }> }> };

    const pdfRes = await prepSheet.GET(req(), ctx({ planId: plan.id }));
    expect(pdfRes.status).toBe(200);
    expect(pdfRes.headers.get("content-type")).toBe("application/pdf");
    const pdf = Buffer.from(await pdfRes.arrayBuffer());
    expect(pdf.subarray(0, 5).toString("latin1")).toBe("%PDF-");
    // pdftotext (poppler) reads the plan's name and the first vial's first dispense row: by the vial-map
    // rule (lib/plans/vial-map.ts) the earliest run in run order at the lowest temperature sits at 1:A1.
    const text = pdfText(pdf);
    expect(flat(text)).toContain(`Sheets ${tag}`);
    const coldest = Math.min(...sheet.runs.map((r) => r.temperatureC));
    const first = sheet.runs.filter((r) => r.temperatureC === coldest).sort((a, b) => a.runOrder - b.runOrder)[0]!;
    const d = first.dispense[0]!;
    const v = d.kind === "solid" ? d.massMg! : d.volumeUl!;
    const amount = `${v < 10 ? v.toFixed(2) : v < 100 ? v.toFixed(1) : v.toFixed(0)} ${d.kind === "solid" ? "mg" : "µL"}`; // the sheet's rounding (docs/reports.md)
    expect(text).toMatch(new RegExp(`\\n\\s*1:A1\\s+${first.run}\\s+${escapeRegExp(amount)}\\s*\\n`));
    expect(flat(text)).toContain("planning aids");

    const csvRes = await worklist.GET(req(), ctx({ planId: plan.id }));
    expect(csvRes.status).toBe(200);
    expect(csvRes.headers.get("content-type")).toMatch(/^text\/csv/);
    const csv = await csvRes.text();
    const lines = csv.trim().split(/\r\n/);
    expect(lines[0]).toBe("order,step,block,vial position,vial,run,add,amount,unit,from,source");
    expect(lines).toHaveLength(1 + sheet.runs.reduce((a, r) => a + r.dispense.length, 0)); // one row per dispense step

    // The release mail, built in the worker, reaches the author with both attached.
    const mine = () => smtp.received.find((m) => m.to.includes(SEED.users.chemist.email) && unfoldQuotedPrintable(m.raw).includes(`Released: Sheets ${tag}`));
    await expect.poll(() => mine() !== undefined, { timeout: 90_000, interval: 250 }).toBe(true);
    const mail = mine()!;
    const attachedPdf = attachmentContent(mail.raw, `Sheets-${tag}.prep-sheet.pdf`);
    expect(attachedPdf?.subarray(0, 5).toString("latin1")).toBe("%PDF-");
    expect(flat(pdfText(attachedPdf!))).toContain(`Sheets ${tag}`);
    expect(attachmentContent(mail.raw, `Sheets-${tag}.worklist.csv`)?.toString("utf8")).toBe(csv);
  }, 120_000);

  it("a plan whose amounts cannot work has no sheet (409)", async () => {
    const doc = suzuki();
    (doc.recipe as Json).scaleMmol = 40; // 40 mmol in a 4 mL vial: far past the vial's volume
    const plan = await createPlan(doc);
    expect(plan.runSheet).toBeNull();
    expect((await prepSheet.GET(req(), ctx({ planId: plan.id }))).status).toBe(409);
    expect((await worklist.GET(req(), ctx({ planId: plan.id }))).status).toBe(409);
  });
});

describe("twenty concurrent releases", () => {
  it("never hold more than the containers have: exactly as many plans as the stock covers are released", async () => {
    // Three 4 g jars of one base: 12 g in all. Each plan needs the run sheet's total of the base.
    const contested = await stockedChemical({ name: `Release test ${tag}: potassium phosphate, contested`, molarMass: "212.27", physicalState: "solid" }, [
      { barcode: `RL-${tag}-C1`, amount: "4", unit: "g", expiresOn: daysFromToday(90), purityPercent: "98" },
      { barcode: `RL-${tag}-C2`, amount: "4", unit: "g", expiresOn: daysFromToday(120), purityPercent: "98" },
      { barcode: `RL-${tag}-C3`, amount: "4", unit: "g", expiresOn: daysFromToday(150), purityPercent: "98" },
    ]);
    const doc = linkChemicals(suzuki(), { components: { base: contested.chemicalId } });
    const plans: PlanJson[] = [];
    for (let i = 0; i < 20; i++) plans.push(await createPlan({ ...doc, name: `Contested ${tag} #${i + 1}` }));
    const need = ceilThousandths(plans[0]!.runSheet!.inventory.find((l) => l.id === "base")!.massMg!); // µg per plan
    const capacity = 12_000_000n; // µg in the three jars
    const fits = Number(capacity / need); // 12 g / 1.754 g → 6 plans

    as(SEED.users.chemist);
    const responses = await Promise.all(plans.map((p) => post(release, p.id)));
    const statuses = responses.map((r) => r.status);
    expect(statuses.filter((s) => s === 200)).toHaveLength(fits);
    expect(statuses.filter((s) => s === 409)).toHaveLength(20 - fits);
    for (const r of responses.filter((x) => x.status === 409)) {
      const body = (await r.json()) as ErrorJson;
      expect(body.shortfalls?.map((s) => s.chemicalId)).toEqual([contested.chemicalId]);
    }

    // Read with SQL: no container holds more than it has, and every released plan holds its whole need.
    const rows = await db().query<{ id: string; amount: string; held: string }>(
      "SELECT c.id, c.amount_base::text AS amount, COALESCE(SUM(r.amount_base) FILTER (WHERE r.status = 'held'), 0)::text AS held FROM containers c LEFT JOIN reservations r ON r.container_id = c.id WHERE c.id IN (:ids) GROUP BY c.id",
      { replacements: { ids: contested.containerIds }, type: QueryTypes.SELECT },
    );
    for (const r of rows) expect(BigInt(r.held) <= BigInt(r.amount), `container ${r.id}: held ${r.held} of ${r.amount}`).toBe(true);
    const perPlan = await db().query<{ plan: string; total: string }>(
      "SELECT plan_id AS plan, SUM(amount_base)::text AS total FROM reservations WHERE container_id IN (:ids) AND status = 'held' GROUP BY plan_id",
      { replacements: { ids: contested.containerIds }, type: QueryTypes.SELECT },
    );
    expect(perPlan).toHaveLength(fits);
    // A need split over two jars is rounded up in each (at most 1 µg more per jar).
    for (const p of perPlan) expect(BigInt(p.total) - need >= 0n && BigInt(p.total) - need <= 2n, `plan ${p.plan} holds ${p.total} of ${need}`).toBe(true);
    const releasedIds = new Set(perPlan.map((p) => p.plan));
    for (const p of plans) expect((await Plan.findByPk(p.id))?.state).toBe(releasedIds.has(p.id) ? "released" : "draft");
  });
});
