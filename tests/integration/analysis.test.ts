/**
 * The analysis routes through the real route handlers and PostgreSQL (only the session is
 * replaced): CONTRACT.md `GET /plans/{plan}/analysis` and `GET /studies/{study}/analysis`.
 *
 * - A published worked example entered as a plan reproduces the published numbers:
 *   Montgomery, Design and Analysis of Experiments, Example 11.2 (central composite design
 *   in k = 2 with α = 1.414 — the rotatable √2 — and 5 centre points; data in REFERENCE.md §6).
 * - The route's numbers equal the engine's (the `fit` verb, lib/cli/verbs/fit.ts, run
 *   in-process on the same data) and its optimum equals `findOptimum` in the cube with the
 *   plan's safe envelope (`safeEnvelope`: the hazard engine's `pointSafety` with the lab's limits).
 * - Runs left out (failed, missing, excluded with a reason) are reported with their reason;
 *   two plans analysed together get a block term.
 * Plan states are set by a test fixture (tests/support/plan-fixtures.ts).
 */
import { randomUUID } from "node:crypto";
import { readFileSync } from "node:fs";
import { Matrix, inverse } from "ml-matrix";
import { beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { run as fitVerb } from "@/lib/cli/verbs/fit";
import { safeEnvelope } from "@/lib/results/envelope";
import { buildTerms, modelRow } from "@/lib/stats";
import { findOptimum, fitResponseSurface } from "@/lib/surface";
import { SEED } from "../support/integration";
import { signInAs } from "../support/fake-session";
import { ctxOf, forcePlanState, req, type Json } from "../support/plan-fixtures";

vi.mock("@/lib/auth/session", () => import("../support/fake-session"));

const studies = await import("@/app/api/labs/[lab]/studies/route");
const studyPlans = await import("@/app/api/labs/[lab]/studies/[studyId]/plans/route");
const planOne = await import("@/app/api/labs/[lab]/plans/[planId]/route");
const results = await import("@/app/api/labs/[lab]/plans/[planId]/results/route");
const analysis = await import("@/app/api/labs/[lab]/plans/[planId]/analysis/route");
const studyAnalysis = await import("@/app/api/labs/[lab]/studies/[studyId]/analysis/route");
const exclusions = await import("@/app/api/labs/[lab]/plans/[planId]/exclusions/route");

const lab = SEED.labs.kestrel.slug;
const ctx = ctxOf(lab);
const tag = randomUUID().slice(0, 8);
const chemist = () => signInAs(SEED.users.chemist);
const example = (): Json => JSON.parse(readFileSync(new URL("../../examples/plan-suzuki.json", import.meta.url), "utf8")) as Json;

type Term = { term: string; estimate: number; stdError: number; t: number; p: number; ci95: [number, number] };
type Row = { df: number; ss: number; ms: number; f?: number; p?: number };
interface Analysis {
  terms: Term[];
  dropped: string[];
  stats: { n: number; r2: number; adjR2: number; predR2: number; rmse: number };
  anova: { model: Row; residual: Row; lackOfFit: Row | null; pureError: Row | null; total: { df: number; ss: number }; blocks: Row | null };
  blocks: { effects: Array<{ label: string; effect: number; runs: number }> } | null;
  excluded: Array<{ run: number; reason: string }>;
  diagnostics: Array<{ run: number }>;
  optimum: { natural: Record<string, number>; predicted: number; safety: { checked: boolean } } | null;
  analysis: { plans: Array<{ id: string; runs: number; used: number }>; runs: Array<{ run: number; status: string; reason: string | null }> };
}
const get = async (planId: string, query: string): Promise<{ status: number; body: Analysis & { error?: { issues: Array<{ path: string }> } } }> => {
  chemist();
  const res = await analysis.GET(req(`/x?${query}`), ctx({ planId }));
  return { status: res.status, body: (await res.json()) as Analysis };
};

/** Montgomery Example 11.2, (x1 time, x2 temperature, yield) in the book's order (REFERENCE.md §6); ±1.414 is √2. */
const A = Math.SQRT2;
const EX_11_2: Array<[number, number, number]> = [
  [-1, -1, 76.5], [-1, 1, 77.0], [1, -1, 78.0], [1, 1, 79.5],
  [0, 0, 79.9], [0, 0, 80.3], [0, 0, 80.0], [0, 0, 79.7], [0, 0, 79.8],
  [A, 0, 78.4], [-A, 0, 75.6], [0, A, 78.5], [0, -A, 77.0],
];

/** The example's recipe with two factors, time and temperature, and the CCD's runs as the plan's design. */
function ccdDocument(name: string, rows: Array<[number, number, number]>): Json {
  const doc = example();
  return {
    ...doc,
    name,
    factors: [
      { name: "time", low: 1, high: 3, unit: "h", binding: { kind: "time" } },
      { name: "temperature", low: 70, high: 80, unit: "degC", binding: { kind: "temperature" } },
    ],
    design: { runs: rows.map(([x1, x2], i) => ({ standardOrder: i + 1, runOrder: i + 1, kind: x1 === 0 && x2 === 0 ? "center" : Math.abs(x1) === 1 ? "factorial" : "axial", coded: { time: x1, temperature: x2 } })) },
  };
}

let studyId = "";
async function planWithResults(document: Json, yields: Array<number | null>): Promise<string> {
  chemist();
  const res = await studyPlans.POST(req("/x", "POST", { document }), ctx({ studyId }));
  expect(res.status).toBe(201);
  const planId = ((await res.json()) as { plan: { id: string } }).plan.id;
  await forcePlanState(planId, "running");
  chemist();
  const put = await results.PUT(req("/x", "PUT", { runs: yields.map((y, i) => ({ run: i + 1, responses: { yield: y }, ...(y === null ? { reason: "vial leaked" } : {}) })) }), ctx({ planId }));
  expect(put.status).toBe(200);
  return planId;
}

beforeAll(async () => {
  chemist();
  const res = await studies.POST(req("/x", "POST", { name: `Analysis ${tag}`, responses: [{ name: "yield", unit: "%", goal: "maximize" }] }), ctx({}));
  studyId = ((await res.json()) as { study: { id: string } }).study.id;
});
beforeEach(() => {
  signInAs(null);
});

describe("analysis of a plan", () => {
  it("Montgomery Example 11.2 entered as a plan reproduces the published coefficients, standard errors and ANOVA", async () => {
    const planId = await planWithResults(ccdDocument(`Ex 11.2 ${tag}`, EX_11_2), EX_11_2.map((r) => r[2]));
    const { status, body } = await get(planId, "response=yield&model=quadratic");
    expect(status).toBe(200);
    const est = Object.fromEntries(body.terms.map((t) => [t.term, t]));
    // Fitted model, REFERENCE.md §6 [C] (computed from the example's data), 4 decimals: tolerance 5e-5.
    const reference: Record<string, number> = { intercept: 79.94, time: 0.995, temperature: 0.5152, "time^2": -1.3763, "temperature^2": -1.0013, "time*temperature": 0.25 };
    for (const [term, v] of Object.entries(reference)) expect(Math.abs(est[term]!.estimate - v), term).toBeLessThanOrEqual(5e-5);
    // As printed in Montgomery (ŷ = 79.94 + 0.99x1 + 0.52x2 − 1.38x1² − 1.00x2² + 0.25x1x2; from memory): 2 decimals, tolerance 0.0051.
    const printed: Record<string, number> = { intercept: 79.94, time: 0.99, temperature: 0.52, "time^2": -1.38, "temperature^2": -1.0, "time*temperature": 0.25 };
    for (const [term, v] of Object.entries(printed)) expect(Math.abs(est[term]!.estimate - v), term).toBeLessThanOrEqual(0.0051);
    // Standard errors as printed in the example's computer output (from memory: 0.12, 0.094, 0.094, 0.10, 0.10, 0.13), to the printed digits.
    const se: Record<string, [number, number]> = { intercept: [0.12, 0.005], time: [0.094, 0.0005], temperature: [0.094, 0.0005], "time^2": [0.1, 0.005], "temperature^2": [0.1, 0.005], "time*temperature": [0.13, 0.005] };
    for (const [term, [v, tol]] of Object.entries(se)) expect(Math.abs(est[term]!.stdError - v), term).toBeLessThanOrEqual(tol);
    // …and exactly as sqrt(MS_residual · [(X'X)⁻¹]jj), computed in this test with ml-matrix's inverse (normal equations: fine for this well-conditioned 13 × 6 design): 10 digits.
    const terms = buildTerms("quadratic", ["time", "temperature"]);
    const X = new Matrix(EX_11_2.map(([a, b]) => [...modelRow(terms, [a, b])]));
    const C = inverse(X.transpose().mmul(X));
    terms.forEach((t, j) => expect(est[t.name]!.stdError).toBeCloseTo(Math.sqrt(body.anova.residual.ms * C.get(j, j)), 10));
    // ANOVA (REFERENCE.md §6 [C]: lack of fit SS 0.2833 on 3 df against pure error 0.2120 on 4 df; R² 0.9828) — 4 decimals, tolerance 5e-5.
    expect(body.anova.lackOfFit).toMatchObject({ df: 3 });
    expect(body.anova.pureError).toMatchObject({ df: 4 });
    expect(Math.abs(body.anova.lackOfFit!.ss - 0.2833)).toBeLessThanOrEqual(5e-5);
    expect(Math.abs(body.anova.pureError!.ss - 0.212)).toBeLessThanOrEqual(5e-5);
    expect(Math.abs(body.stats.r2 - 0.9828)).toBeLessThanOrEqual(5e-5);
    // The published ANOVA table (from memory): model SS 28.25 on 5 df, residual 0.50 on 7, lack-of-fit F 1.78 with p 0.2897, total 28.74 on 12.
    expect(body.anova.model.df).toBe(5);
    expect(Math.abs(body.anova.model.ss - 28.25)).toBeLessThanOrEqual(0.005);
    expect(body.anova.residual.df).toBe(7);
    expect(Math.abs(body.anova.residual.ss - 0.5)).toBeLessThanOrEqual(0.005);
    expect(Math.abs(body.anova.lackOfFit!.f! - 1.78)).toBeLessThanOrEqual(0.005);
    expect(Math.abs(body.anova.lackOfFit!.p! - 0.2897)).toBeLessThanOrEqual(5e-5);
    expect(body.anova.total.df).toBe(12);
    expect(Math.abs(body.anova.total.ss - 28.74)).toBeLessThanOrEqual(0.005);
  });

  it("the route's numbers equal the fit verb's on the same data, and its optimum equals findOptimum with the plan's safe envelope", async () => {
    chemist();
    const created = await studyPlans.POST(req("/x", "POST", { document: { ...example(), name: `Screen ${tag}` } }), ctx({ studyId }));
    const planId = ((await created.json()) as { plan: { id: string } }).plan.id;
    const { plan } = (await (await planOne.GET(req("/x"), ctx({ planId }))).json()) as { plan: { document: Json & { factors: Array<{ name: string; low: number; high: number; unit: string; scale: "linear" | "log" }> }; runSheet: { runs: Array<{ run: number; coded: Record<string, number>; natural: Record<string, number> }> } } };
    // Invented yields: a stated model (60 + 8·T + 5·Pd + 3·T·Pd + 2·base, coded) plus a fixed wobble.
    const yieldOf = (c: Record<string, number>, i: number) => 60 + 8 * c.temperature! + 5 * c.pdLoading! + 3 * c.temperature! * c.pdLoading! + 2 * c.baseEquiv! + ((i * 7) % 5) * 0.3 - 0.6;
    const runs = [...plan.runSheet.runs].sort((a, b) => a.run - b.run);
    await forcePlanState(planId, "running");
    chemist();
    expect((await results.PUT(req("/x", "PUT", { runs: runs.map((r, i) => ({ run: r.run, responses: { yield: yieldOf(r.coded, i) } })) }), ctx({ planId }))).status).toBe(200);

    const { status, body } = await get(planId, "response=yield&model=interaction&alpha=0.1&hierarchy=true");
    expect(status).toBe(200);
    const input = {
      factors: plan.document.factors.map((f) => ({ name: f.name, low: f.low, high: f.high, unit: f.unit, scale: f.scale })),
      runs: runs.map((r, i) => ({ natural: r.natural, response: yieldOf(r.coded, i) })),
      model: "interaction",
      prune: { alpha: 0.1, hierarchy: true },
    };
    const verb = JSON.parse(JSON.stringify(fitVerb(input))) as Json;
    const { optimum, analysis: meta, nextDesign: _nextDesign, ...fit } = body as unknown as Json; // nextDesign: issue 13's proposals (tests/integration/next-design.test.ts)
    expect(fit).toEqual(verb);
    expect((meta as Analysis["analysis"]).runs.every((r) => r.status === "used")).toBe(true);
    expect(body.dropped.length).toBeGreaterThan(0);
    const { model } = fitResponseSurface(input);
    expect(optimum).toEqual(JSON.parse(JSON.stringify(findOptimum({ kind: "response", model, goal: "maximize", name: "yield", unit: "%" }, { region: "cube", safety: safeEnvelope(plan.document).check }))));
    expect(body.optimum?.safety.checked).toBe(true);
  });

  it("failed, missing and left-out runs are excluded with their reasons; leaving a run out changes the fit; bad queries are 422 at their parameter", async () => {
    const yields: Array<number | null> = EX_11_2.map((r) => r[2]);
    yields[3] = null; // run 4 failed
    const planId = await planWithResults(ccdDocument(`Ex 11.2 gaps ${tag}`, EX_11_2), yields);
    const before = await get(planId, "model=quadratic");
    expect(before.body.stats.n).toBe(12);
    expect(before.body.excluded).toEqual([expect.objectContaining({ run: 4, reason: "the run failed: vial leaked" })]);
    chemist();
    expect((await exclusions.POST(req("/x", "POST", { run: 11, reason: "axial vial under-filled" }), ctx({ planId }))).status).toBe(201);
    const after = await get(planId, "model=quadratic");
    expect(after.body.stats.n).toBe(11);
    expect(after.body.excluded.map((e) => [e.run, e.reason])).toEqual([[4, "the run failed: vial leaked"], [11, "axial vial under-filled"]]);
    expect(after.body.terms.find((t) => t.term === "time")!.estimate).not.toBeCloseTo(before.body.terms.find((t) => t.term === "time")!.estimate, 6);
    expect(after.body.analysis.runs.find((r) => r.run === 11)).toMatchObject({ status: "excluded", reason: "axial vial under-filled" });

    for (const [q, path] of [["response=purity", "response"], ["model=time,nope", "model"], ["alpha=2", "alpha"], ["transform=log", "transform"]] as const) {
      const r = await get(planId, q);
      expect(r.status, q).toBe(422);
      expect(r.body.error!.issues.map((i) => i.path)).toEqual([path]);
    }
  });
});

describe("several plans of one study", () => {
  it("a factorial plan and its axial/centre augmentation analysed together get a block term; the answer names the plans and runs", async () => {
    const factorial = EX_11_2.slice(0, 7); // 4 factorial + 3 centre points
    const augment = [...EX_11_2.slice(9), ...EX_11_2.slice(7, 9)]; // 4 axial + 2 centre points
    const a = await planWithResults(ccdDocument(`Block A ${tag}`, factorial), factorial.map((r) => r[2]));
    const b = await planWithResults(ccdDocument(`Block B ${tag}`, augment), augment.map((r) => r[2] + 0.4));
    chemist();
    const res = await studyAnalysis.GET(req(`/x?plans=${a},${b}&model=quadratic`), ctx({ studyId }));
    expect(res.status).toBe(200);
    const body = (await res.json()) as Analysis;
    expect(body.analysis.plans).toEqual([expect.objectContaining({ id: a, runs: 7, used: 7 }), expect.objectContaining({ id: b, runs: 6, used: 6 })]);
    expect(body.anova.blocks).toMatchObject({ df: 1 });
    const effects = body.blocks!.effects;
    expect(effects.map((e) => [e.label, e.runs])).toEqual([[`Block A ${tag}`, 7], [`Block B ${tag}`, 6]]);
    expect(effects[0]!.effect + effects[1]!.effect).toBeCloseTo(0, 12);
    // The same as the fit verb with each run's block named.
    const verb = fitVerb({
      factors: [{ name: "time", low: 1, high: 3, unit: "h" }, { name: "temperature", low: 70, high: 80, unit: "degC" }],
      runs: [...factorial.map((r) => ({ coded: { time: r[0], temperature: r[1] }, response: r[2], block: `Block A ${tag}` })), ...augment.map((r) => ({ coded: { time: r[0], temperature: r[1] }, response: r[2] + 0.4, block: `Block B ${tag}` }))],
      model: "quadratic",
    }) as Analysis;
    body.terms.forEach((t, j) => expect(t.estimate).toBeCloseTo(verb.terms[j]!.estimate, 10));
    expect(body.anova.blocks!.ss).toBeCloseTo(verb.anova.blocks!.ss, 10);
    // A plan of another study is refused at `plans`.
    const other = await studies.POST(req("/x", "POST", { name: `Other ${tag}`, responses: [{ name: "yield", unit: "%", goal: "maximize" }] }), ctx({}));
    const otherId = ((await other.json()) as { study: { id: string } }).study.id;
    const refused = await studyAnalysis.GET(req(`/x?plans=${a},${b}`), ctx({ studyId: otherId }));
    expect(refused.status).toBe(422);
    expect(((await refused.json()) as { error: { issues: Array<{ path: string }> } }).error.issues.map((i) => i.path)).toEqual(["plans", "plans"]);
  });
});
