/**
 * The demo scenario (lib/demo; PRODUCT.md "Demo scenario"), as the bootstrap applied it to
 * the test database after the seeders (scripts/lib/database.mjs): every step file is
 * recorded once; running the demo again changes nothing; a step that fails leaves nothing
 * behind and is tried again next time; and the demo's plans are as the scenario describes —
 * the screening and Box–Behnken plans have no blocking caution, Study B needs a safety
 * officer's sign-off and more n-butyllithium than the lab holds, and the CCD plan has
 * blocking axial runs with safe-design alternatives that clear them; and review and release
 * (step 50): the screen released with its stock held, the Box–Behnken plan approved by the
 * demo safety officer with a signature bound to its content, Study B's plan in the review
 * queue. Expected values are
 * worked out by hand from the documents of lib/demo/steps (run counts from REFERENCE.md §6).
 */
import { createHash, randomUUID } from "node:crypto";
import canonicalize from "canonicalize";
import { describe, expect, it } from "vitest";
import { checkAvailability } from "@/inventory/server/availability";
import { loadDemoSteps, runDemo } from "@/lib/demo/run";
import { demoStep } from "@/lib/demo/step";
import { getPlan } from "@/lib/plans/server/get-plan";
import { listReviewQueue } from "@/lib/plans/server/list-review-queue";
import { suggestSafeDesign } from "@/lib/plans/server/suggest-safe-design";
import { getLabSettings } from "@/lib/lab-settings/server/get-lab-settings";
import { createStudy } from "@/lib/studies/server/create-study";
import { AuditEntry, Chemical, DemoStep, Lab, Plan, PlanSignature, Reservation, Study, User } from "@/lib/server/models";
import { QueryTypes } from "sequelize";
import { db, SEED } from "../support/integration";

const LAB = SEED.labs.kestrel.id;

async function records(): Promise<Record<string, string>> {
  const out: Record<string, string> = {};
  for (const s of await DemoStep.findAll()) Object.assign(out, s.records);
  return out;
}

async function snapshot() {
  const lab = await Lab.findByPk(LAB);
  return { studies: await Study.count(), plans: await Plan.count(), audit: await AuditEntry.count(), steps: await DemoStep.count(), settingsVersion: lab?.settingsVersion };
}

describe("the demo's steps", () => {
  it("were all applied once by the bootstrap, in the order of their files", async () => {
    const files = (await loadDemoSteps()).map((s) => s.name);
    expect(files.slice(0, 5)).toEqual(["10-lab-equipment", "20-study-a", "30-study-b", "40-unsafe-ccd", "50-review-and-release"]);
    const applied = (await DemoStep.findAll({ order: [["appliedAt", "ASC"], ["name", "ASC"]] })).map((s) => s.name);
    for (const f of files) expect(applied).toContain(f);
  });

  it("run again without any change", async () => {
    const before = await snapshot();
    const first = await runDemo();
    const second = await runDemo();
    expect(first.applied).toEqual([]);
    expect(second.applied).toEqual([]);
    expect(second.alreadyApplied).toEqual((await loadDemoSteps()).map((s) => s.name));
    expect(await snapshot()).toEqual(before);
  });

  it("a step that fails leaves nothing and is not recorded; the next run applies it once", async () => {
    const tag = randomUUID().slice(0, 8);
    const name = `98-test-${tag}`;
    const studyName = `Demo step test ${tag}`;
    let fail = true;
    const step = demoStep("a test step", async (ctx, t) => {
      const s = await createStudy({ labId: ctx.lab.id, actorUserId: ctx.users.chemist, input: { name: studyName, responses: [{ name: "yield", unit: "%", goal: "maximize" }] } }, t);
      ctx.remember(`test.${tag}`, s.id);
      expect(ctx.recall("studyA")).toMatch(/^[0-9a-f-]{36}$/); // an earlier step's record
      if (fail) throw new Error("planned failure");
    });
    await expect(runDemo({ steps: [{ name, step }] })).rejects.toThrow("planned failure");
    expect(await Study.count({ where: { name: studyName } })).toBe(0);
    expect(await DemoStep.findByPk(name)).toBeNull();
    fail = false;
    expect((await runDemo({ steps: [{ name, step }] })).applied).toEqual([name]);
    expect((await runDemo({ steps: [{ name, step }] })).applied).toEqual([]);
    expect(await Study.count({ where: { name: studyName } })).toBe(1);
    expect((await DemoStep.findByPk(name))?.records).toEqual({ [`test.${tag}`]: (await Study.findOne({ where: { name: studyName } }))!.id });
  });

  it("a step that adds jobs gets the job queue installed first (as the worker installs it)", async () => {
    const name = `97-test-queue-${randomUUID().slice(0, 8)}`;
    let queues: unknown[] = [];
    const step = demoStep(
      "a test step that adds jobs",
      async (_ctx, t) => {
        queues = await db().query("SELECT name FROM pgboss.queue WHERE name = 'mail'", { type: QueryTypes.SELECT, transaction: t });
      },
      { jobQueue: true },
    );
    expect((await runDemo({ steps: [{ name, step }] })).applied).toEqual([name]);
    expect(queues).toEqual([{ name: "mail" }]);
  });
});

describe("the demo's lab and plans", () => {
  it("the lab's default vessel is the 4 mL crimp vial rated 10 bar, with the 24-position blocks", async () => {
    const { settings } = await getLabSettings({ labId: LAB });
    const vial = settings.vessels.types.find((v) => v.id === settings.vessels.defaultId)!;
    expect(vial).toMatchObject({ id: "kb-vial-4ml-crimp", totalVolumeMl: 4, ratedBar: 10, sealed: true });
    expect(vial.source).toMatch(/20 bar/);
    expect(settings.thresholds.safetyFactor).toBe(0.5);
    expect(settings.blocks.types.filter((b) => b.id.startsWith("kb-")).map((b) => [b.id, b.positions, b.minC, b.maxC])).toEqual([
      ["kb-al-24", 24, 20, 150],
      ["kb-cool-24", 24, -78, 25],
    ]);
    // The default types stay for plans that name them.
    expect(settings.vessels.types.some((v) => v.id === "vial-4ml-screw-septum")).toBe(true);
  });

  it("Study A's screen is a 2^(5−1) with two centre points, and neither it nor the Box–Behnken plan has a blocking caution", async () => {
    const r = await records();
    const screen = await getPlan({ labId: LAB, planId: r["studyA.screen"]! });
    expect(screen.studyId).toBe(r.studyA);
    expect(screen.runCount).toBe(18); // 2^(5−1) = 16 + 2 centre points
    expect(screen.document.design).toMatchObject({ design: "fractional-factorial", generators: ["E=ABCD"] });
    expect(screen.document.factors.map((f) => f.name)).toEqual(["temperature", "baseEquiv", "boronicEquiv", "pdLoading", "waterFraction"]);
    expect(screen.cautions.filter((c) => c.severity === "blocking")).toEqual([]);
    expect(screen.releasable).toBe(true);
    expect(screen.problem).toBeNull();

    const bb = await getPlan({ labId: LAB, planId: r["studyA.boxBehnken"]! });
    expect(bb.runCount).toBe(15); // Box–Behnken k = 3: 12 + 3 centre points
    expect(bb.document.design.design).toBe("box-behnken");
    expect(bb.document.factors.map((f) => f.name)).toEqual(["temperature", "baseEquiv", "pdLoading"]);
    expect(bb.cautions.filter((c) => c.severity === "blocking")).toEqual([]);
    expect(bb.releasable).toBe(true);
    // The same plan in the default screw-cap vial (3 bar × 0.5) would block at 110 °C.
    const vessel = bb.document.vessel as { ratedBar: number };
    expect(vessel.ratedBar * bb.document.thresholds.safetyFactor).toBe(5);
    expect(Math.max(...bb.perRun.map((p) => p.totalBar ?? 0))).toBeGreaterThan(1.5);
    expect(Math.max(...bb.perRun.map((p) => p.totalBar ?? 0))).toBeLessThan(5);
  });

  it("every component and solvent of the demo's plans names a chemical of the lab, with the same physical state", async () => {
    const r = await records();
    for (const key of ["studyA.screen", "studyA.boxBehnken", "studyB.exchange", "studyA.unsafeCcd"]) {
      const plan = await getPlan({ labId: LAB, planId: r[key]! });
      const ids = [...plan.document.recipe.components.map((c) => c.chemicalId), ...plan.document.recipe.solvents.map((s) => s.chemicalId)];
      expect(ids.every((id) => typeof id === "string"), key).toBe(true);
      expect(await Chemical.count({ where: { labId: LAB, id: ids as string[] } }), key).toBe(new Set(ids).size);
      expect(plan.inventoryIssues.filter((i) => /\.form\.state$|\.chemicalId$|densityGPerMl$/.test(i.path)), key).toEqual([]);
    }
  });

  it("Study B needs a safety officer's sign-off (pyrophoric n-butyllithium) and more of it than the lab holds", async () => {
    const r = await records();
    const plan = await getPlan({ labId: LAB, planId: r["studyB.exchange"]! });
    expect(plan.studyId).toBe(r.studyB);
    expect(plan.runCount).toBe(11); // 2^3 + 3 centre points
    expect(plan.signOffRequired).toBe(true);
    expect(plan.signOffReasons.some((s) => s.startsWith("TL-S02"))).toBe(true);
    expect(plan.cautions.filter((c) => c.severity === "blocking")).toEqual([]);
    expect(plan.cautions.map((c) => c.code)).toEqual(expect.arrayContaining(["TL-R01", "TL-R02", "TL-R03"]));
    // 11 vials × 2.0 mmol × (1.05…1.25, mean 1.15 equiv) / 2.5 M ≈ 10.1 mL (by hand): more than the one usable 8 mL bottle.
    const buli = plan.runSheet!.inventory.find((l) => l.kind === "component" && l.id === "buli")!;
    expect(buli.volumeUl!).toBeGreaterThan(10_000);
    const availability = await checkAvailability({ labId: LAB, input: { requirements: [{ chemicalId: plan.document.recipe.components[1]!.chemicalId!, amount: String(buli.volumeUl), unit: "µL" }] } });
    expect(availability.shortfalls).toHaveLength(1);
  });

  it("the CCD plan's +α temperature run is past the vial's rating, and the safe-design alternatives clear it", async () => {
    const r = await records();
    const plan = await getPlan({ labId: LAB, planId: r["studyA.unsafeCcd"]! });
    expect(plan.runCount).toBe(17); // 2^3 + 2·3 + 3
    const blocking = plan.cautions.filter((c) => c.severity === "blocking");
    expect(blocking.map((c) => c.code)).toEqual(["TL-V02"]);
    const axial = plan.runSheet!.runs.filter((x) => x.kind === "axial").map((x) => x.run);
    expect(blocking[0]!.runs.every((n) => axial.includes(n))).toBe(true);
    // +α = 100 + 8^¼ · 15 = 125.2 °C (NIST/SEMATECH e-Handbook §5.3.3.6.1 for α).
    const hot = plan.runSheet!.runs.find((x) => x.run === blocking[0]!.runs[0])!;
    expect(hot.natural.temperature).toBeCloseTo(100 + Math.pow(8, 0.25) * 15, 6);
    expect(plan.releasable).toBe(false);

    const report = await suggestSafeDesign({ labId: LAB, input: { document: plan.document, kinds: ["face-centered", "smaller-alpha", "narrower-range"] } });
    expect(report.blockingRuns.map((b) => b.run)).toEqual(blocking[0]!.runs);
    expect(report.alternatives.every((a) => a.nothingBlocks)).toBe(true);
  });
});

describe("the demo's review and release (step 50)", () => {
  const sha256 = (doc: unknown) => createHash("sha256").update(canonicalize(doc)!, "utf8").digest("hex"); // RFC 8785 canonical JSON, by the canonicalize package

  it("Study A's screen is released, holding stock for every component and solvent that names a chemical, tied to the plan", async () => {
    const r = await records();
    const screen = await getPlan({ labId: LAB, planId: r["studyA.screen"]! });
    expect(screen.state).toBe("released");
    expect(screen.signature).toBeNull(); // no rule asks for sign-off: released without review
    const named = new Set([...screen.document.recipe.components.map((c) => c.chemicalId), ...screen.document.recipe.solvents.map((x) => x.chemicalId)]);
    const held = screen.reservations.filter((x) => x.status === "held");
    expect(held.length).toBeGreaterThanOrEqual(named.size);
    expect(new Set(held.map((x) => x.chemicalId))).toEqual(named);
    // Each row carries the plan's foreign key (reservations.plan_id), read without the project's view code.
    expect(await Reservation.count({ where: { labId: LAB, planId: screen.id, status: "held" } })).toBe(held.length);
    const released = await AuditEntry.findOne({ where: { entityId: screen.id, action: "plan.released" } });
    expect(released?.actorUserId).toBe((await User.findOne({ where: { email: "chemist@kestrelbay.example" } }))!.id);
  });

  it("the Box–Behnken plan is approved by the demo safety officer, the signature bound to its canonical content", async () => {
    const r = await records();
    const bb = await getPlan({ labId: LAB, planId: r["studyA.boxBehnken"]! });
    const officer = (await User.findOne({ where: { email: "safety@kestrelbay.example" } }))!;
    expect(bb.state).toBe("approved");
    expect(bb.signOffRequired).toBe(true);
    expect(bb.signature).toMatchObject({ signerName: officer.name, meaning: "approved for execution as planned", valid: true, decision: "approve" });
    const stored = await Plan.findByPk(bb.id);
    expect(bb.signature!.contentHash).toBe(sha256(stored!.document));
    const row = await PlanSignature.findOne({ where: { planId: bb.id } });
    expect(row).toMatchObject({ signerId: officer.id, decision: "approve", contentHash: sha256(stored!.document) });
    // Not released yet: nothing held.
    expect(bb.reservations).toEqual([]);
  });

  it("Study B's pyrophoric exchange plan waits in the review queue", async () => {
    const r = await records();
    const queue = await listReviewQueue({ labId: LAB });
    const item = queue.find((q) => q.plan.id === r["studyB.exchange"]);
    expect(item).toBeDefined();
    expect(item!.plan.state).toBe("in_review");
    expect(item!.submittedAt).not.toBeNull();
    expect(item!.codes).toEqual(expect.arrayContaining(["TL-R01"]));
    expect(item!.signOffReasons.some((s) => s.startsWith("TL-S02"))).toBe(true);
    // The approved Box–Behnken plan and the released screen are no longer in it.
    expect(queue.some((q) => q.plan.id === r["studyA.boxBehnken"] || q.plan.id === r["studyA.screen"])).toBe(false);
  });
});
