/**
 * Surface and optimum benchmarks (issue 13 item 7).
 *
 * - The contour grid with the safe envelope, 2 factors at 101 × 101 (target ≤ 300 ms): what
 *   the surface route computes after reading the plan — the `fit` of the analysis query, the
 *   grid of the fitted model, the hazard engine at each of the 10 201 points (the envelope of
 *   lib/results/envelope.ts, prepared in the timed run), and the regions' outlines and
 *   labels — for a Box–Behnken plan of the demo's Suzuki–Miyaura recipe in dioxane/water,
 *   the temperature axis extended from 90–125 °C to 80–170 °C so that three findings block
 *   part of the grid (lib/results/surface.ts `surfaceOfSources`).
 * - The constrained optimum of a 6-factor quadratic with the safe envelope (target ≤ 500 ms):
 *   the demo recipe with six factors (temperature 100–140 °C, where TL-F02 blocks from
 *   130 °C), a face-centred CCD with invented yields whose unrestricted best lies at the hot
 *   edge, a linear constraint on natural values, `findOptimum` inside the cube, the constraint
 *   and the envelope (the envelope prepared in the timed run).
 * - Over HTTP, when an app runs (TARELINE_BENCH_URL and its DATABASE_URL): the surface route
 *   at 41 × 41 (what the page asks when a slider moves) and 101 × 101.
 */
import { readFileSync } from "node:fs";
import type { AsyncBenchCase, BenchCase } from "./harness";
import { api, appUnavailable, planWithResults, signInCookie } from "./bench-app";
import { resolveRuns } from "../lib/chemistry/design-runs";
import { planDocumentSchema } from "../lib/chemistry/plan-document";
import { parseConstraints } from "../lib/doe/constraints";
import { safeEnvelope } from "../lib/results/envelope";
import type { AnalysisPlanSource } from "../lib/results/analysis-input";
import { cellKey, type ResultCell } from "../lib/results/entries";
import { surfaceQuerySchema } from "../lib/results/schemas";
import { surfaceOfSources, type SurfaceAnswer } from "../lib/results/surface";
import { fitModelWithPredictor } from "../lib/stats";
import { findOptimum, type OptimizeOutput } from "../lib/surface";
import type { StudyResponse } from "../lib/studies/schemas";

const example = () => JSON.parse(readFileSync(new URL("../examples/plan-suzuki.json", import.meta.url), "utf8")) as Record<string, unknown> & { factors: Array<Record<string, unknown>> };
const RESPONSES: StudyResponse[] = [{ name: "yield", unit: "%", goal: "maximize" }];
/** Invented yields with an interior maximum: 70 + 4·T + 3·B + 2·P − 5·T² − 3·B² − 2·P² + 1.5·T·P (coded), plus a fixed wobble. */
const bbdYield = (c: Record<string, number>, run: number) => 70 + 4 * c.temperature! + 3 * c.baseEquiv! + 2 * c.pdLoading! - 5 * c.temperature! ** 2 - 3 * c.baseEquiv! ** 2 - 2 * c.pdLoading! ** 2 + 1.5 * c.temperature! * c.pdLoading! + (((run * 7) % 5) - 2) * 0.2;

function bbdDocument(name: string): Record<string, unknown> {
  const raw = example();
  return { ...raw, name, factors: [{ ...raw.factors[0], low: 90, high: 125 }, raw.factors[1]!, raw.factors[3]!], design: { design: "box-behnken", centerPoints: 3, randomize: true, seed: 12 } };
}

function gridState() {
  const document = bbdDocument("bench surface");
  const runs = resolveRuns(planDocumentSchema.parse(document));
  const results = new Map<string, ResultCell>();
  for (const r of runs) results.set(cellKey(r.standardOrder, "yield"), { run: r.standardOrder, response: "yield", value: bbdYield(r.coded as Record<string, number>, r.standardOrder), failed: false, reason: null });
  const parsed = planDocumentSchema.parse(document);
  const source: AnalysisPlanSource = { id: "bench", name: "bench", factors: parsed.factors.map((f) => ({ name: f.name, low: f.low, high: f.high, unit: f.unit })), runs: runs.map((r) => ({ run: r.standardOrder, runOrder: r.runOrder, natural: r.natural })), results, exclusions: [] };
  const query = surfaceQuerySchema.parse({ model: "quadratic", x: "temperature", y: "baseEquiv", xRange: "80,170", steps: "101" });
  return { source, query, envelope: { plan: { id: "bench", name: "bench" }, document }, last: null as SurfaceAnswer | null };
}

const SIX = ["temperature", "baseEquiv", "boronicEquiv", "pdLoading", "waterFraction", "timeH"];
function optimumState() {
  const raw = example();
  const document = {
    ...raw,
    factors: [{ ...raw.factors[0], low: 100, high: 140 }, ...raw.factors.slice(1), { name: "timeH", low: 8, high: 24, unit: "h", binding: { kind: "time" } }],
    design: { design: "central-composite", alpha: "face-centered", centerPoints: 6, randomize: false },
  };
  const parsed = planDocumentSchema.parse(document);
  const runs = resolveRuns(parsed);
  // Invented: rising with temperature (best at the hot edge, where TL-F02 blocks), curved in the others.
  const y = (c: Record<string, number>, i: number) => 60 + 6 * c.temperature! + 2 * c.baseEquiv! - 2 * c.baseEquiv! ** 2 + 1.5 * c.pdLoading! - 1.5 * c.pdLoading! ** 2 - c.boronicEquiv! ** 2 + 0.8 * c.waterFraction! - 2 * c.waterFraction! ** 2 + 1.2 * c.timeH! - c.timeH! ** 2 + 0.8 * c.temperature! * c.timeH! + ((i % 5) - 2) * 0.15;
  const factors = parsed.factors.map((f) => ({ name: f.name, low: f.low, high: f.high, unit: f.unit }));
  const { model } = fitModelWithPredictor({ factors, runs: runs.map((r, i) => ({ natural: r.natural, response: y(r.coded as Record<string, number>, i) })), model: "quadratic" });
  // A limit of the lab's own (invented): hotter runs only with less catalyst, temperature + 10·pdLoading ≤ 145.
  const constraints = parseConstraints([{ expr: "temperature + 10*pdLoading <= 145" }], model.factors);
  return { model, constraints, document, runs: runs.length, last: null as OptimizeOutput | null };
}

const http: { skip: string | null; cookie: string; planId: string } = { skip: null, cookie: "", planId: "" };
async function httpSetup(): Promise<void> {
  http.skip = await appUnavailable();
  if (http.skip) return;
  http.cookie = await signInCookie("chemist@kestrelbay.example");
  const made = await planWithResults(http.cookie, bbdDocument("Bench: surface route, Box–Behnken"), (c, i) => bbdYield(c, i + 1));
  http.planId = made.planId;
}
const routeCase = (steps: number, targetMs: number): AsyncBenchCase => ({
  name: `surface route (HTTP): Box–Behnken, temperature × base at ${steps} × ${steps} with the safe envelope, axes extended to 170 °C`,
  targetMs,
  repeat: 15,
  warmup: 3,
  runAsync: async () => {
    if (!http.planId && http.skip === null) await httpSetup();
    if (http.skip) return;
    await api(http.cookie, "GET", `/plans/${http.planId}/analysis/surface?response=yield&model=quadratic&x=temperature&y=baseEquiv&xRange=80,170&steps=${steps}`);
  },
  note: () => (http.skip ? [`skipped: ${http.skip}`] : ["the whole request: session, reading the plan and its results, inventory facts, fit, grid, hazard engine at every point, outlines, JSON"]),
});

export const cases: Array<BenchCase | AsyncBenchCase> = [
  {
    name: "contour grid with the safe envelope: 2 factors at 101 × 101 (fit, grid, hazard engine at 10 201 points, outlines and labels)",
    targetMs: 300,
    repeat: 15,
    warmup: 3,
    setup: gridState,
    run: (s) => {
      const st = s as ReturnType<typeof gridState>;
      st.last = surfaceOfSources([st.source], RESPONSES, st.query, st.envelope);
    },
    note: (_r, s) => {
      const a = (s as ReturnType<typeof gridState>).last!;
      return [`findings on the grid: ${a.envelope.findings.map((f) => `${f.code} ${(f.share * 100).toFixed(1)} %`).join(", ")}; ${a.grid.xNatural.length * a.grid.yNatural.length} points`];
    },
  },
  {
    name: "constrained optimum: 6-factor quadratic (28 terms), a linear constraint and the safe envelope",
    targetMs: 500,
    repeat: 15,
    warmup: 3,
    setup: optimumState,
    run: (s) => {
      const st = s as ReturnType<typeof optimumState>;
      st.last = findOptimum({ kind: "response", model: st.model, goal: "maximize", name: "yield", unit: "%" }, { region: "cube", constraints: st.constraints, safety: safeEnvelope(st.document).check });
    },
    note: (_r, s) => {
      const st = s as ReturnType<typeof optimumState>;
      const o = st.last!;
      return [`${st.runs} runs; method ${o.method}; ${o.safety.checks} safety checks; blocked without the envelope: ${o.safety.blockedWithoutEnvelope.map((c) => c.code).join(", ") || "nothing"}; temperature ${o.natural.temperature!.toFixed(2)} °C, active constraints: ${o.activeConstraints.join(", ") || "none"}; ${SIX.length} factors`];
    },
  },
  routeCase(41, 300),
  routeCase(101, 300),
];
