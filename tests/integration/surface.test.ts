/**
 * The surface and report routes through the real route handlers and PostgreSQL (only the
 * session is replaced): `GET /plans/{plan}/analysis/surface`, `GET /studies/{study}/analysis/surface`,
 * `GET /plans/{plan}/analysis-report.pdf` and `GET /studies/{study}/analysis-report.pdf`.
 *
 * - Montgomery, Design and Analysis of Experiments, Example 11.2 (central composite design,
 *   k = 2, α = √2, 5 centre points; REFERENCE.md §6) entered as a plan on the demo's
 *   Suzuki–Miyaura recipe: the surface at the design centre is the published intercept,
 *   79.940, and the report's text (pdftotext) holds the published coefficients.
 * - Bad axes, sliders and ranges are 422 at the query's own parameter; another lab's plan
 *   is 404; every role of the lab reads; no session is 401.
 * Plan states are set by a test fixture (tests/support/plan-fixtures.ts).
 */
import { randomUUID } from "node:crypto";
import { readFileSync } from "node:fs";
import { beforeAll, beforeEach, describe, expect, it, vi } from "vitest";
import { SEED } from "../support/integration";
import { signInAs } from "../support/fake-session";
import { ctxOf, forcePlanState, req, type Json } from "../support/plan-fixtures";
import { flat, pdfText } from "../unit/reports/pdf-tools";

vi.mock("@/lib/auth/session", () => import("../support/fake-session"));

const studies = await import("@/app/api/labs/[lab]/studies/route");
const studyPlans = await import("@/app/api/labs/[lab]/studies/[studyId]/plans/route");
const results = await import("@/app/api/labs/[lab]/plans/[planId]/results/route");
const surface = await import("@/app/api/labs/[lab]/plans/[planId]/analysis/surface/route");
const studySurface = await import("@/app/api/labs/[lab]/studies/[studyId]/analysis/surface/route");
const report = await import("@/app/api/labs/[lab]/plans/[planId]/analysis-report.pdf/route");
const studyReport = await import("@/app/api/labs/[lab]/studies/[studyId]/analysis-report.pdf/route");

const lab = SEED.labs.kestrel.slug;
const ctx = ctxOf(lab);
const tag = randomUUID().slice(0, 8);
const chemist = () => signInAs(SEED.users.chemist);
const example = (): Json => JSON.parse(readFileSync(new URL("../../examples/plan-suzuki.json", import.meta.url), "utf8")) as Json;

/** Montgomery Example 11.2 (x1 time, x2 temperature, yield) in the book's order (REFERENCE.md §6); ±1.414 is √2. */
const A = Math.SQRT2;
const EX_11_2: Array<[number, number, number]> = [
  [-1, -1, 76.5], [-1, 1, 77.0], [1, -1, 78.0], [1, 1, 79.5],
  [0, 0, 79.9], [0, 0, 80.3], [0, 0, 80.0], [0, 0, 79.7], [0, 0, 79.8],
  [A, 0, 78.4], [-A, 0, 75.6], [0, A, 78.5], [0, -A, 77.0],
];

type Surface = {
  x: string;
  y: string;
  grid: { xNatural: number[]; yNatural: number[]; z: number[][]; fixed: Record<string, number> };
  envelope: { checked: boolean; findings: Array<{ code: string; kind: string }> };
  points: Array<{ run: number; onSlice: boolean }>;
};
type ErrorBody = { error: { code: string; issues: Array<{ path: string }> } };

let studyId = "";
let planId = "";
beforeAll(async () => {
  chemist();
  const s = await studies.POST(req("/x", "POST", { name: `Surface ${tag}`, responses: [{ name: "yield", unit: "%", goal: "maximize" }] }), ctx({}));
  studyId = ((await s.json()) as { study: { id: string } }).study.id;
  // The example's recipe with two factors, time 1–3 h and temperature 70–80 °C, and the CCD's runs as the plan's design.
  const document = {
    ...example(),
    name: `Ex 11.2 surface ${tag}`,
    factors: [
      { name: "time", low: 1, high: 3, unit: "h", binding: { kind: "time" } },
      { name: "temperature", low: 70, high: 80, unit: "degC", binding: { kind: "temperature" } },
    ],
    design: { runs: EX_11_2.map(([x1, x2], i) => ({ standardOrder: i + 1, runOrder: i + 1, kind: x1 === 0 && x2 === 0 ? "center" : Math.abs(x1) === 1 ? "factorial" : "axial", coded: { time: x1, temperature: x2 } })) },
  };
  const created = await studyPlans.POST(req("/x", "POST", { document }), ctx({ studyId }));
  expect(created.status).toBe(201);
  planId = ((await created.json()) as { plan: { id: string } }).plan.id;
  await forcePlanState(planId, "running");
  chemist();
  const put = await results.PUT(req("/x", "PUT", { runs: EX_11_2.map((r, i) => ({ run: i + 1, responses: { yield: r[2] } })) }), ctx({ planId }));
  expect(put.status).toBe(200);
});
beforeEach(() => signInAs(null));

const getSurface = async (query: string, lab_: string = lab) => {
  const res = await surface.GET(req(`/x?${query}`), ctx({ planId }, lab_));
  return { status: res.status, body: (await res.json()) as { surface: Surface } & ErrorBody };
};

describe("the surface route", () => {
  it("gives the fitted surface on a grid in natural units: at the design centre (2 h, 75 °C) the published intercept 79.940 (Montgomery Ex. 11.2)", async () => {
    chemist();
    const { status, body } = await getSurface("response=yield&model=quadratic&steps=41");
    expect(status).toBe(200);
    const s = body.surface;
    expect([s.x, s.y]).toEqual(["time", "temperature"]);
    // The axes span the runs: the axial points at ±√2, 2 ± √2 h and 75 ± 5√2 °C.
    expect(s.grid.xNatural[0]).toBeCloseTo(2 - A, 12);
    expect(s.grid.yNatural[40]).toBeCloseTo(75 + 5 * A, 12);
    expect(s.grid.xNatural[20]).toBeCloseTo(2, 12);
    expect(Math.abs(s.grid.z[20]![20]! - 79.94)).toBeLessThanOrEqual(5e-5);
    // The envelope was asked at every point; 70–82 °C in dioxane/water at 0.2 mmol in a 4 mL vial blocks nowhere.
    expect(s.envelope.checked).toBe(true);
    expect(s.envelope.findings).toEqual([]);
    // Both factors are on the axes, so every run is on the slice.
    expect(s.points.filter((p) => p.onSlice)).toHaveLength(13);
  });
  it("extended past the studied range it marks what the hazard engine blocks (130 °C: within 50 °C of dioxane's 180 °C autoignition, REFERENCE.md §3)", async () => {
    chemist();
    const { status, body } = await getSurface("response=yield&model=quadratic&x=time&y=temperature&yRange=70,160&steps=31");
    expect(status).toBe(200);
    const codes = body.surface.envelope.findings.map((f) => `${f.code}:${f.kind}`);
    expect(codes).toContain("TL-F02:caution");
    expect(codes).toContain("TL-T01:limit"); // the plan's heating block holds 150 °C
  });
  it("refuses bad axes, sliders and ranges at the query's parameter (422)", async () => {
    chemist();
    for (const [query, path] of [
      ["x=pressure", "x"],
      ["x=time&y=time", "y"],
      ["hold=catalyst:1", "hold.catalyst"],
      ["hold=time:abc", "hold.time"],
      ["xRange=3,1", "xRange"],
      ["steps=5", "steps"],
      ["response=purity", "response"],
      ["model=quadratic,foo", "model"],
    ] as const) {
      const { status, body } = await getSurface(`response=yield&${query}`);
      expect(status, query).toBe(422);
      expect(body.error.issues.map((i) => i.path), query).toContain(path);
    }
  });
  it("another lab's plan is 404; every role of the lab reads; no session is 401", async () => {
    signInAs(SEED.users.harrowChemist);
    expect((await getSurface("", SEED.labs.harrow.slug)).status).toBe(404);
    signInAs(SEED.users.harrowChemist);
    expect((await getSurface("")).status).toBe(404);
    for (const u of [SEED.users.viewer, SEED.users.safety, SEED.users.stockkeeper, SEED.users.admin]) {
      signInAs(u);
      expect((await getSurface("model=quadratic")).status).toBe(200);
    }
    signInAs(null);
    expect((await getSurface("")).status).toBe(401);
  });
  it("the study route gives the same surface for the plan alone", async () => {
    chemist();
    const res = await studySurface.GET(req(`/x?plans=${planId}&model=quadratic&steps=41`), ctx({ studyId }));
    expect(res.status).toBe(200);
    const s = ((await res.json()) as { surface: Surface }).surface;
    expect(Math.abs(s.grid.z[20]![20]! - 79.94)).toBeLessThanOrEqual(5e-5);
  });
});

describe("the analysis report route", () => {
  it("is a PDF whose text holds the published coefficients to 4 decimals, the optimum and the planning-aid notice (Montgomery Ex. 11.2)", async () => {
    chemist();
    const res = await report.GET(req("/x?response=yield&model=quadratic"), ctx({ planId }));
    expect(res.status).toBe(200);
    expect(res.headers.get("content-type")).toBe("application/pdf");
    expect(res.headers.get("content-disposition")).toMatch(/^attachment; filename="analysis-ex-11-2-surface-/);
    const pdf = Buffer.from(await res.arrayBuffer());
    expect(pdf.subarray(0, 5).toString("latin1")).toBe("%PDF-");
    const t = flat(pdfText(pdf));
    // REFERENCE.md §6 [C]: 79.940 + 0.9950 x1 + 0.5152 x2 − 1.3763 x1² − 1.0013 x2² + 0.2500 x1x2.
    for (const [term, v] of [["intercept", "79.9400"], ["time", "0.9950"], ["temperature", "0.5152"], ["time\\^2", "−1.3763"], ["temperature\\^2", "−1.0013"], ["time\\*temperature", "0.2500"]]) expect(t).toMatch(new RegExp(`${term} ${v}`));
    expect(t).toContain("Lack of fit 3 0.2833");
    expect(t).toMatch(/maximum/);
    expect(t).toContain("Contour plot and safe envelope");
    expect(t).toContain("Optimum");
    expect(t).toContain("planning aids");
  });
  it("refuses a bad query at its parameter, and another lab's plan", async () => {
    chemist();
    const bad = await report.GET(req("/x?x=pressure"), ctx({ planId }));
    expect(bad.status).toBe(422);
    expect(((await bad.json()) as ErrorBody).error.issues[0]!.path).toBe("x");
    signInAs(SEED.users.harrowChemist);
    expect((await report.GET(req("/x"), ctx({ planId }, SEED.labs.harrow.slug))).status).toBe(404);
    signInAs(SEED.users.viewer);
    expect((await studyReport.GET(req(`/x?plans=${planId}&model=quadratic`), ctx({ studyId }))).status).toBe(200);
    expect((await studyReport.GET(req(`/x?plans=not-a-plan`), ctx({ studyId }))).status).toBe(422);
  });
});
