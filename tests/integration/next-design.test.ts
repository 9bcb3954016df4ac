/**
 * The next design (issue 13 items 3 and 4) through the real route handlers and PostgreSQL
 * (only the session is replaced):
 *
 * - `POST /plans/{plan}/confirmation`: the confirmation runs sit at the analysis route's
 *   optimum rounded to settable steps (1 °C, 0.05 equiv, 0.1 mol % by default; per factor
 *   when given), inside the safe envelope (no blocking caution, no limit left, judged by the
 *   hazard engine's own `pointSafety`); an optimum on the block's maximum that rounds past it
 *   moves to the nearest settable point inside, and one with no settable point near is refused naming the
 *   factor. The prediction interval for the mean of the replicates is checked against
 *   ŷ₀ ± t(0.975, df)·s·√(1/m + x₀'(X'X)⁻¹x₀) (Montgomery, Peck & Vining, Introduction to
 *   Linear Regression Analysis, §3.5; from memory) computed in this test with ml-matrix and
 *   the t table value t(0.975, 5) = 2.5706 (any Student-t table). Once its results are in,
 *   the source plan's analysis judges them.
 * - `POST /plans/{plan}/augment`: a 2^3 factorial plan gets the axial and centre runs of a
 *   central composite design in a second block — 2k = 6 axial runs at ±α on each axis and the
 *   centre, α = (2^k)^(1/4) = 8^(1/4) ≈ 1.6818 for rotatability (Montgomery, Design and
 *   Analysis of Experiments, §11.4.2, the CCD and rotatability; from memory) — and α is cut to
 *   the block's maximum temperature when +α would pass it (rotatability given up, said so).
 *   The two plans are analysed together with a block term.
 * - The path of steepest ascent of a first-order model (Montgomery §11.2, Example 11.1; from
 *   memory): coded steps proportional to the coefficients, natural steps the coded steps times
 *   the factor half-ranges, stopped at the first point the safe envelope refuses.
 * Plan states are set by a test fixture (tests/support/plan-fixtures.ts).
 */
import { randomUUID } from "node:crypto";
import { readFileSync } from "node:fs";
import { Matrix, inverse } from "ml-matrix";
import { beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { pointSafety } from "@/lib/chemistry/point-safety";
import { Plan } from "@/lib/server/models";
import { SEED } from "../support/integration";
import { signInAs } from "../support/fake-session";
import { ctxOf, forcePlanState, req, type Json } from "../support/plan-fixtures";
import { flat, pdfText } from "../unit/reports/pdf-tools";

vi.mock("@/lib/auth/session", () => import("../support/fake-session"));

const studies = await import("@/app/api/labs/[lab]/studies/route");
const studyPlans = await import("@/app/api/labs/[lab]/studies/[studyId]/plans/route");
const results = await import("@/app/api/labs/[lab]/plans/[planId]/results/route");
const analysis = await import("@/app/api/labs/[lab]/plans/[planId]/analysis/route");
const studyAnalysis = await import("@/app/api/labs/[lab]/studies/[studyId]/analysis/route");
const confirmation = await import("@/app/api/labs/[lab]/plans/[planId]/confirmation/route");
const augment = await import("@/app/api/labs/[lab]/plans/[planId]/augment/route");
const report = await import("@/app/api/labs/[lab]/plans/[planId]/analysis-report.pdf/route");

const lab = SEED.labs.kestrel.slug;
const ctx = ctxOf(lab);
const tag = randomUUID().slice(0, 8);
const chemist = () => signInAs(SEED.users.chemist);
const example = (): Json => JSON.parse(readFileSync(new URL("../../examples/plan-suzuki.json", import.meta.url), "utf8")) as Json;

type Coded = Record<string, number>;
interface PlanBody {
  id: string;
  studyId: string;
  state: string;
  runCount: number;
  derivedFromPlanId: string | null;
  derivation: string | null;
  derivationDetails: Json | null;
  document: Json & { factors: Array<{ name: string; low: number; high: number }>; design: { runs?: Array<{ kind: string; block?: number; natural: Coded; coded?: Coded }> } };
  runSheet: { runs: Array<{ run: number; coded: Coded; natural: Coded }> };
  cautions: Array<{ code: string; severity: string }>;
}
type ErrorBody = { error: { code: string; issues: Array<{ path: string; message: string }> } };

/** The example's recipe with temperature 60–100 °C, base 1.5–3.0 equiv and Pd 0.5–2.0 mol %, and the given design. */
function threeFactorDocument(name: string, design: Json, equipment?: Json, pd?: { low: number; high: number }): Json {
  const doc = example();
  const factors = (doc.factors as Array<{ name: string }>).filter((f) => ["temperature", "baseEquiv", "pdLoading"].includes(f.name)).map((f) => (pd && f.name === "pdLoading" ? { ...f, ...pd } : f));
  return { ...doc, name, factors, design, ...(equipment ? { equipment } : {}) };
}

let studyId = "";
async function createPlan(document: Json): Promise<PlanBody> {
  chemist();
  const res = await studyPlans.POST(req("/x", "POST", { document }), ctx({ studyId }));
  expect(res.status).toBe(201);
  return ((await res.json()) as { plan: PlanBody }).plan;
}
async function enterResults(planId: string, yields: Array<[number, number]>): Promise<void> {
  await forcePlanState(planId, "running");
  chemist();
  const put = await results.PUT(req("/x", "PUT", { runs: yields.map(([run, y]) => ({ run, responses: { yield: y } })) }), ctx({ planId }));
  expect(put.status).toBe(200);
}
async function post(handler: typeof confirmation.POST, planId: string, body: unknown, as: { id: string; email: string } = SEED.users.chemist, labSlug: string = lab) {
  signInAs(as);
  const res = await handler(req("/x", "POST", body), ctxOf(labSlug)({ planId }));
  return { status: res.status, body: (await res.json()) as Json & ErrorBody };
}
async function getAnalysis(planId: string, query: string) {
  chemist();
  const res = await analysis.GET(req(`/x?${query}`), ctx({ planId }));
  return { status: res.status, body: (await res.json()) as Json };
}
const planCount = async () => Plan.count({ where: { labId: SEED.labs.kestrel.id } });

/** Invented yields with an interior maximum: a stated quadratic in coded units plus a fixed wobble. */
const surface = (c: Coded, i: number) =>
  80 + 4 * c.temperature! + 2 * c.baseEquiv! + 1.5 * c.pdLoading! - 3 * c.temperature! ** 2 - 4 * c.baseEquiv! ** 2 - 3 * c.pdLoading! ** 2 + c.temperature! * c.baseEquiv! + ((i * 7) % 5) * 0.3 - 0.6;

const boxBehnken = { design: "box-behnken", centerPoints: 3, randomize: true, seed: 5 };
/** Rounds to a step, independently of the engine. */
const roundTo = (v: number, step: number) => Number((Math.round(v / step) * step).toFixed(6));

beforeAll(async () => {
  chemist();
  const res = await studies.POST(req("/x", "POST", { name: `Next design ${tag}`, responses: [{ name: "yield", unit: "%", goal: "maximize" }] }), ctx({}));
  studyId = ((await res.json()) as { study: { id: string } }).study.id;
});
beforeEach(() => signInAs(null));

describe("the confirmation plan", () => {
  let source: PlanBody;
  beforeAll(async () => {
    source = await createPlan(threeFactorDocument(`Box–Behnken ${tag}`, boxBehnken));
    const runs = [...source.runSheet.runs].sort((a, b) => a.run - b.run);
    await enterResults(source.id, runs.map((r, i) => [r.run, surface(r.coded, i)]));
  });

  it("puts replicate runs at the analysis's optimum rounded to 1 °C, 0.05 equiv and 0.1 mol %, inside the envelope, with the interval for their mean", async () => {
    const { body: a } = await getAnalysis(source.id, "response=yield&model=quadratic");
    const optimum = a.optimum as { natural: Coded; coded: Coded };
    expect(Object.values(optimum.coded).every((v) => Math.abs(v) < 0.999), "an interior optimum").toBe(true);
    // A second-order model proposes no path of steepest ascent, and a Box–Behnken plan is not augmented.
    const next = a.nextDesign as { steepestAscent: { path: unknown; note: string }; augmentation: { available: boolean; note: string } };
    expect(next.steepestAscent).toMatchObject({ path: null, note: expect.stringContaining("square terms") });
    expect(next.augmentation).toMatchObject({ available: false, note: expect.stringContaining("neither a corner") });
    expect(a.nextDesign).toMatchObject({ settableSteps: { temperature: 1, baseEquiv: 0.05, pdLoading: 0.1 } }); // the page's defaults
    const before = await planCount();
    const res = await post(confirmation.POST, source.id, { response: "yield", replicates: 3, model: "quadratic" });
    expect(res.status).toBe(201);
    expect(await planCount()).toBe(before + 1);
    const made = res.body.plan as PlanBody;
    expect(made).toMatchObject({ studyId, state: "draft", derivedFromPlanId: source.id, derivation: "confirmation", runCount: 3 });
    const expected = { temperature: roundTo(optimum.natural.temperature!, 1), baseEquiv: roundTo(optimum.natural.baseEquiv!, 0.05), pdLoading: roundTo(optimum.natural.pdLoading!, 0.1) };
    const runs = made.document.design.runs!;
    expect(runs).toHaveLength(3);
    for (const r of runs) {
      expect(r.kind).toBe("confirmation");
      for (const [name, v] of Object.entries(expected)) expect(r.natural[name], name).toBeCloseTo(v, 9);
    }
    expect(made.runSheet.runs.map((r) => r.natural.temperature)).toEqual([expected.temperature, expected.temperature, expected.temperature]);
    // Inside the envelope: the hazard engine finds nothing blocking and no limit left at the point, and the plan has no blocking caution.
    const verdict = pointSafety(made.document)(expected);
    expect([...verdict.blocking, ...verdict.limits]).toEqual([]);
    expect(made.cautions.filter((c) => c.severity === "blocking")).toEqual([]);
    // What it was derived with, and the interval for the mean of 3 runs computed here: ŷ₀ ± t(0.975, 5)·s·√(1/3 + x₀'(X'X)⁻¹x₀).
    const details = res.body.confirmation as { analysis: Json; moved: boolean; predicted: number; meanInterval95: [number, number]; steps: Coded };
    expect(made.derivationDetails).toEqual(JSON.parse(JSON.stringify(details)));
    expect(details).toMatchObject({ analysis: { response: "yield", model: "quadratic", alpha: null, hierarchy: true, transform: "none", region: "cube", combine: [] }, moved: false, steps: { temperature: 1, baseEquiv: 0.05, pdLoading: 0.1 } });
    const row = (c: Coded) => {
      const [x1, x2, x3] = [c.temperature!, c.baseEquiv!, c.pdLoading!];
      return [1, x1, x2, x3, x1 * x1, x2 * x2, x3 * x3, x1 * x2, x1 * x3, x2 * x3];
    };
    const design = [...source.runSheet.runs].sort((p, q) => p.run - q.run);
    const X = new Matrix(design.map((r) => row(r.coded)));
    const y = Matrix.columnVector(design.map((r, i) => surface(r.coded, i)));
    const C = inverse(X.transpose().mmul(X));
    const b = C.mmul(X.transpose()).mmul(y);
    const resid = y.sub(X.mmul(b));
    const s2 = resid.transpose().mmul(resid).get(0, 0) / (15 - 10);
    const coded = made.runSheet.runs[0]!.coded;
    const x0 = Matrix.rowVector(row(coded));
    const q = x0.mmul(C).mmul(x0.transpose()).get(0, 0);
    const yhat = x0.mmul(b).get(0, 0);
    const half = 2.5706 * Math.sqrt(s2 * (1 / 3 + q));
    expect(details.predicted).toBeCloseTo(yhat, 8);
    expect(details.meanInterval95[0]).toBeCloseTo(yhat - half, 3);
    expect(details.meanInterval95[1]).toBeCloseTo(yhat + half, 3);
  });

  it("takes settable steps per factor; once the results are in, the source plan's analysis says whether the confirmation holds", async () => {
    const { body: a } = await getAnalysis(source.id, "response=yield&model=quadratic");
    const optimum = a.optimum as { natural: Coded };
    const res = await post(confirmation.POST, source.id, { response: "yield", replicates: 2, steps: { temperature: 5, pdLoading: 0.25 }, name: `Confirm in 5 °C steps ${tag}` });
    expect(res.status).toBe(201);
    const made = res.body.plan as PlanBody;
    const natural = made.document.design.runs![0]!.natural;
    expect(natural.temperature).toBeCloseTo(roundTo(optimum.natural.temperature!, 5), 9);
    expect(natural.pdLoading).toBeCloseTo(roundTo(optimum.natural.pdLoading!, 0.25), 9);
    expect(natural.baseEquiv).toBeCloseTo(roundTo(optimum.natural.baseEquiv!, 0.05), 9);

    // Results near the prediction hold; results far below it do not.
    const waiting = (await getAnalysis(source.id, "response=yield&model=quadratic")).body as { nextDesign: { confirmations: Array<Json & { plan: { id: string }; verdict: null | Json; note: string | null }> } };
    expect(waiting.nextDesign.confirmations.find((c) => c.plan.id === made.id)).toMatchObject({ verdict: null, note: expect.stringContaining("Waiting for results") });
    const predicted = (res.body.confirmation as { predicted: number }).predicted;
    await enterResults(made.id, [[1, predicted + 0.3], [2, predicted - 0.5]]);
    const judged = (await getAnalysis(source.id, "response=yield&model=quadratic")).body as { nextDesign: { confirmations: Array<{ plan: { id: string }; sameAnalysis: boolean; predicted: number; runs: Array<{ observed: number }>; meanInterval95: [number, number]; verdict: { holds: boolean; observedMean: number } } > } };
    const check = judged.nextDesign.confirmations.find((c) => c.plan.id === made.id)!;
    expect(check.sameAnalysis).toBe(true);
    expect(check.runs.map((r) => r.observed)).toEqual([predicted + 0.3, predicted - 0.5]);
    expect(check.verdict).toMatchObject({ holds: true });
    expect(check.verdict.observedMean).toBeCloseTo(predicted - 0.1, 9);
    chemist();
    expect((await results.PUT(req("/x", "PUT", { runs: [{ run: 1, responses: { yield: predicted - 25 } }, { run: 2, responses: { yield: predicted - 24 } }] }), ctx({ planId: made.id }))).status).toBe(200);
    const failed = (await getAnalysis(source.id, "response=yield&model=quadratic")).body as typeof judged;
    const miss = failed.nextDesign.confirmations.find((c) => c.plan.id === made.id)!;
    expect(miss.verdict.holds).toBe(false);
    expect(miss.verdict.observedMean).toBeLessThan(miss.meanInterval95[0]);

    // The source plan's analysis report prints that confirmation: the plan, its observed results and the same verdict.
    const pdf = await report.GET(req("/x?response=yield&model=quadratic"), ctx({ planId: source.id }));
    expect(pdf.status).toBe(200);
    const text = flat(pdfText(Buffer.from(await pdf.arrayBuffer())));
    expect(text).toContain("Confirmation");
    expect(text).toContain(`Confirm in 5 °C steps ${tag}`);
    expect(text).toContain("The confirmation does not hold");
  });

  it("an optimum on the block's maximum that rounds past it moves to the nearest settable point inside; with no settable point near it is refused naming the factor, and nothing is stored", async () => {
    // The same plan on a block that reaches 93.7 °C: the surface's maximum (about 94.5 °C) is
    // past it, so the optimum sits on the envelope's edge at the block's maximum — and rounds to
    // 94 °C, past it again.
    const hot = await createPlan(threeFactorDocument(`Box–Behnken low block ${tag}`, boxBehnken, { blockMaxC: 93.7, coolingMinC: -78 }));
    const runs = [...hot.runSheet.runs].sort((a, b) => a.run - b.run);
    await enterResults(hot.id, runs.map((r, i) => [r.run, surface(r.coded, i)]));
    const { body: a } = await getAnalysis(hot.id, "response=yield&model=quadratic");
    const optimum = (a.optimum as { natural: Coded }).natural;
    expect(optimum.temperature!).toBeLessThanOrEqual(93.7);
    expect(roundTo(optimum.temperature!, 1)).toBeGreaterThan(93.7);
    const moved = await post(confirmation.POST, hot.id, { response: "yield" });
    expect(moved.status).toBe(201);
    const point = (moved.body.plan as PlanBody).document.design.runs![0]!.natural;
    expect(point.temperature).toBe(93);
    expect(moved.body.confirmation).toMatchObject({ moved: true, warnings: expect.arrayContaining([expect.stringContaining("nearest settable point inside")]) });
    const verdict = pointSafety((moved.body.plan as PlanBody).document)(point);
    expect([...verdict.blocking, ...verdict.limits]).toEqual([]);

    const before = await planCount();
    const refused = await post(confirmation.POST, hot.id, { response: "yield", steps: { temperature: 50 } });
    expect(refused.status).toBe(422);
    expect(refused.body.error.issues.map((i) => i.path)).toContain("steps.temperature");
    expect(refused.body.error.issues.find((i) => i.path === "steps.temperature")!.message).toMatch(/TL-T01|region/);
    expect(await planCount()).toBe(before);
  });

  it("422 at the field for bad input, 409 without best conditions, 404 for another lab's plan, 403 for a viewer; nothing stored", async () => {
    const before = await planCount();
    for (const [body, path] of [
      [{ response: "purity" }, "response"],
      [{ replicates: 0 }, "replicates"],
      [{ replicates: 2.5 }, "replicates"],
      [{ steps: { nope: 1 } }, "steps.nope"],
      [{ steps: { temperature: -1 } }, "steps.temperature"],
      [{ model: "temperature,nope" }, "model"],
      [{ alpha: 2 }, "alpha"],
      [{ transform: "log" }, "transform"],
    ] as const) {
      const r = await post(confirmation.POST, source.id, body);
      expect(r.status, JSON.stringify(body)).toBe(422);
      expect(r.body.error.issues.map((i) => i.path), JSON.stringify(body)).toEqual([path]);
    }
    const none = await post(confirmation.POST, source.id, { model: ["intercept"] });
    expect(none.status).toBe(409);
    expect(none.body.error.issues.map((i) => i.path)).toEqual(["response"]);
    expect((await post(confirmation.POST, source.id, {}, SEED.users.harrowChemist, SEED.labs.harrow.slug)).status).toBe(404);
    expect((await post(confirmation.POST, source.id, {}, SEED.users.viewer)).status).toBe(403);
    expect(await planCount()).toBe(before);
  });
});

describe("augmenting a two-level factorial to a central composite design", () => {
  const factorial = { design: "full-factorial", centerPoints: 2, randomize: true, seed: 9 };
  const ROTATABLE = Math.pow(8, 0.25); // (2^k)^(1/4), k = 3

  it("adds the 2k axial runs at ±α = (2^3)^(1/4) and centre runs in a second block, analysed with the first through a block term", async () => {
    // Pd 1.0–2.0 mol % here: at −α the 0.5–2.0 range of the screen would ask for a negative loading (the envelope would cut α).
    const first = await createPlan(threeFactorDocument(`2^3 ${tag}`, factorial, undefined, { low: 1, high: 2 }));
    expect(first.runCount).toBe(10);
    const res = await post(augment.POST, first.id, {});
    expect(res.status).toBe(201);
    const made = res.body.plan as PlanBody;
    expect(made).toMatchObject({ studyId, state: "draft", derivedFromPlanId: first.id, derivation: "augmentation", runCount: 8 });
    expect(res.body.augmentation).toMatchObject({ rotatable: true, factorialRuns: 8, factorialCenterRuns: 2, axialRuns: 6, centerRuns: 2 });
    expect((res.body.augmentation as { alpha: number }).alpha).toBeCloseTo(1.681793, 6);
    const runs = made.document.design.runs!;
    expect(runs.every((r) => r.block === 2)).toBe(true);
    const axial = runs.filter((r) => r.kind === "axial");
    const centre = runs.filter((r) => r.kind === "center");
    expect(centre).toHaveLength(2);
    // The CCD's axial points: each factor at ±α with the others at the centre, one pair per factor.
    const names = ["temperature", "baseEquiv", "pdLoading"];
    const points = axial.map((r) => names.map((n) => r.coded![n]!));
    const expected = names.flatMap((_n, i) => [-1, 1].map((s) => names.map((_m, j) => (i === j ? s * ROTATABLE : 0))));
    expect(points.map((p) => p.map((v) => v.toFixed(6))).sort()).toEqual(expected.map((p) => p.map((v) => (v === 0 ? 0 : v).toFixed(6))).sort());
    for (const r of centre) expect(names.map((n) => r.coded![n])).toEqual([0, 0, 0]);
    // Natural values: the centre plus α half-ranges (temperature 80 ± 20α °C, base 2.25 ± 0.75α equiv, Pd 1.5 ± 0.5α mol %).
    const hot = axial.find((r) => r.coded!.temperature! > 0)!;
    expect(hot.natural.temperature).toBeCloseTo(80 + 20 * ROTATABLE, 9);
    expect(hot.natural.baseEquiv).toBeCloseTo(2.25, 12);
    const lowBase = axial.find((r) => r.coded!.baseEquiv! < 0)!;
    expect(lowBase.natural.baseEquiv).toBeCloseTo(2.25 - 0.75 * ROTATABLE, 9);
    // Analysed together: 18 runs, a block per plan, the full quadratic estimable.
    const firstRuns = [...first.runSheet.runs].sort((a, b) => a.run - b.run);
    await enterResults(first.id, firstRuns.map((r, i) => [r.run, surface(r.coded, i)]));
    const madeRuns = [...made.runSheet.runs].sort((a, b) => a.run - b.run);
    await enterResults(made.id, madeRuns.map((r, i) => [r.run, surface(r.coded, i + 3) + 0.7]));
    chemist();
    const together = await studyAnalysis.GET(req(`/x?plans=${first.id},${made.id}&model=quadratic`), ctx({ studyId }));
    expect(together.status).toBe(200);
    const body = (await together.json()) as { stats: { n: number }; terms: Array<{ term: string }>; aliased: string[]; anova: { blocks: { df: number } | null }; analysis: { plans: Array<{ id: string; used: number }> } };
    expect(body.stats.n).toBe(18);
    expect(body.terms).toHaveLength(10);
    expect(body.aliased).toEqual([]);
    expect(body.anova.blocks).toMatchObject({ df: 1 });
    expect(body.analysis.plans).toEqual([expect.objectContaining({ id: first.id, used: 10 }), expect.objectContaining({ id: made.id, used: 8 })]);
    // The first plan's analysis lists the augmentation.
    const a = (await getAnalysis(first.id, "model=interaction")).body as { nextDesign: { augmentation: { available: boolean; plans: Array<{ id: string }> } } };
    expect(a.nextDesign.augmentation).toMatchObject({ available: true, plans: [expect.objectContaining({ id: made.id })] });
  });

  it("cuts α to the block's maximum temperature and says rotatability was given up", async () => {
    // +α at the rotatable α would be 80 + 20·1.682 = 113.6 °C; the block reaches 105 °C, so α = (105 − 80)/20 = 1.25.
    const first = await createPlan(threeFactorDocument(`2^3 on a 105 °C block ${tag}`, factorial, { blockMaxC: 105, coolingMinC: -78 }, { low: 1, high: 2 }));
    const res = await post(augment.POST, first.id, { alpha: "rotatable", centerPoints: 3 });
    expect(res.status).toBe(201);
    const aug = res.body.augmentation as { alpha: number; rotatable: boolean; notes: string[]; centerRuns: number };
    expect(aug.alpha).toBeLessThanOrEqual(1.25);
    expect(aug.alpha).toBeGreaterThanOrEqual(1.249);
    expect(aug.rotatable).toBe(false);
    expect(aug.centerRuns).toBe(3);
    expect(aug.notes.join(" ")).toMatch(/Rotatability given up/);
    expect(aug.notes.join(" ")).toMatch(/TL-T01/);
    const made = res.body.plan as PlanBody;
    for (const r of made.document.design.runs!) {
      const v = pointSafety(made.document)(r.natural);
      expect([...v.blocking, ...v.limits]).toEqual([]);
    }
  });

  it("refuses a plan that is not a two-level factorial (409 at design), bad α (422), another lab (404), a viewer (403); nothing stored", async () => {
    const bb = await createPlan(threeFactorDocument(`Not a factorial ${tag}`, boxBehnken));
    const first = await createPlan(threeFactorDocument(`2^3 refusals ${tag}`, factorial));
    const before = await planCount();
    const r = await post(augment.POST, bb.id, {});
    expect(r.status).toBe(409);
    expect(r.body.error.issues.map((i) => i.path)).toEqual(["design"]);
    for (const [body, path] of [[{ alpha: 0.5 }, "alpha"], [{ alpha: "spherical" }, "alpha"], [{ centerPoints: -1 }, "centerPoints"], [{ name: "" }, "name"]] as const) {
      const bad = await post(augment.POST, first.id, body);
      expect(bad.status, JSON.stringify(body)).toBe(422);
      expect(bad.body.error.issues.map((i) => i.path)).toEqual([path]);
    }
    expect((await post(augment.POST, first.id, {}, SEED.users.harrowChemist, SEED.labs.harrow.slug)).status).toBe(404);
    expect((await post(augment.POST, first.id, {}, SEED.users.viewer)).status).toBe(403);
    expect(await planCount()).toBe(before);
  });
});

describe("the path of steepest ascent", () => {
  it("moves in coded steps proportional to the first-order coefficients, natural steps scaled by the half-ranges, until the envelope stops it", async () => {
    // A block that reaches 130 °C: the path from 80 °C in 10 °C steps must stop there.
    const first = await createPlan(threeFactorDocument(`2^3 first order ${tag}`, { design: "full-factorial", centerPoints: 2, randomize: true, seed: 3 }, { blockMaxC: 130, coolingMinC: -78 }));
    const runs = [...first.runSheet.runs].sort((a, b) => a.run - b.run);
    const lin = (c: Coded, i: number) => 50 + 6 * c.temperature! + 3 * c.baseEquiv! - 2 * c.pdLoading! + ((i * 7) % 5) * 0.2 - 0.4;
    await enterResults(first.id, runs.map((r, i) => [r.run, lin(r.coded, i)]));
    const { status, body } = await getAnalysis(first.id, "response=yield&model=linear");
    expect(status).toBe(200);
    const path = (body as { nextDesign: { steepestAscent: { path: { baseFactor: string; codedStep: Coded; naturalStep: Coded; points: Array<{ step: number; natural: Coded }>; stoppedAt: { step: number; reasons: string[] } | null } } } }).nextDesign.steepestAscent.path;
    // The coefficients of an orthogonal two-level design with centre runs, computed here: b_i = Σ x_i·y / Σ x_i² (Montgomery §6, from memory).
    const names = ["temperature", "baseEquiv", "pdLoading"];
    const coef = Object.fromEntries(names.map((n) => [n, runs.reduce((s, r, i) => s + r.coded[n]! * lin(r.coded, i), 0) / runs.reduce((s, r) => s + r.coded[n]! ** 2, 0)]));
    expect(path.baseFactor).toBe("temperature");
    const half: Coded = { temperature: 20, baseEquiv: 0.75, pdLoading: 0.75 };
    for (const n of names) {
      expect(path.codedStep[n]! / path.codedStep.temperature!, n).toBeCloseTo(coef[n]! / coef.temperature!, 9);
      expect(path.naturalStep[n], n).toBeCloseTo(path.codedStep[n]! * half[n]!, 9);
    }
    expect(path.codedStep.temperature).toBeCloseTo(0.5, 12);
    const centre: Coded = { temperature: 80, baseEquiv: 2.25, pdLoading: 1.25 };
    path.points.forEach((p) => names.forEach((n) => expect(p.natural[n]).toBeCloseTo(centre[n]! + p.step * path.naturalStep[n]!, 9)));
    // It stops at the first step the hazard engine refuses (a blocking caution or a limit), every step before it runnable.
    const at = pointSafety(first.document);
    const refused = (natural: Coded) => {
      const v = at(natural);
      return v.blocking.length + v.limits.length > 0;
    };
    expect(path.points.every((p) => !refused(p.natural))).toBe(true);
    expect(path.stoppedAt).not.toBeNull();
    const stop = path.stoppedAt!.step;
    expect(path.points).toHaveLength(stop - 1);
    expect(refused(Object.fromEntries(names.map((n) => [n, centre[n]! + stop * path.naturalStep[n]!])))).toBe(true);
    expect(stop).toBeLessThanOrEqual(6); // 80 + 6·10 = 140 °C is past the 130 °C block at the latest
    // With two-factor interactions the path still follows the first-order coefficients, and says so.
    const inter = (await getAnalysis(first.id, "response=yield&model=interaction")).body as { nextDesign: { steepestAscent: { path: { warnings: string[] } | null } } };
    expect(inter.nextDesign.steepestAscent.path!.warnings.join(" ")).toMatch(/first-order coefficients only/);
  });
});
