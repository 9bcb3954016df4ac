/**
 * The analysis ROUTE (issue 12 item 5), over HTTP against a running app: a 6-factor plan of
 * 1536 runs (a face-centred central composite design, 96 runs, replicated 16 times) with
 * yields from a stated quadratic plus seeded noise (bench/analysis.bench.ts `response`),
 * `GET /plans/{plan}/analysis?model=quadratic&alpha=0.05&hierarchy=true` — session check,
 * reading the plan and its 1536 results, the 28-term fit with backward elimination, ANOVA,
 * diagnostics, the optimum inside the safe envelope (the hazard engine's `pointSafety`),
 * JSON — side by side with statsmodels doing the same backward elimination on the same
 * data (the script of bench/analysis.bench.ts). Needs the app (TARELINE_BENCH_URL) and its
 * database (DATABASE_URL); skipped with a note otherwise.
 */
import { execFileSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import type { AsyncBenchCase } from "./harness";
import { PY_SCRIPT, response, statsmodelsReady } from "./analysis.bench";
import { api, appUnavailable, planWithResults, signInCookie } from "./bench-app";
import { seededRng } from "../lib/doe";
import { buildTerms, modelRow } from "../lib/stats";
import { fitResponseSurface } from "../lib/surface";

/** In the document's order (the Suzuki factors, then time), so the terms come in the route's order. */
export const FACTORS = ["temperature", "baseEquiv", "boronicEquiv", "pdLoading", "waterFraction", "timeH"];

/** The demo's Suzuki–Miyaura recipe with six factors and a replicated face-centred CCD of `replicates` × 96 runs. */
export function sixFactorDocument(name: string, replicates: number): Record<string, unknown> {
  const doc = JSON.parse(readFileSync(new URL("../examples/plan-suzuki.json", import.meta.url), "utf8")) as Record<string, unknown> & { factors: unknown[] };
  return {
    ...doc,
    name,
    factors: [...doc.factors, { name: "timeH", low: 8, high: 24, unit: "h", binding: { kind: "time" } }],
    design: { design: "central-composite", alpha: "face-centered", centerPoints: 20, replicates, randomize: true, seed: 11 },
  };
}

interface RouteState {
  skip: string | null;
  cookie: string;
  planId: string;
  X: number[][];
  y: number[];
  names: string[];
  exponents: number[][];
  coded: Record<string, number>[];
  last: { terms: Array<{ term: string; estimate: number }>; stats: { n: number } } | null;
}
const st: RouteState = { skip: null, cookie: "", planId: "", X: [], y: [], names: [], exponents: [], coded: [], last: null };
const QUERY = "response=yield&model=quadratic&alpha=0.05&hierarchy=true";

async function setup(): Promise<void> {
  st.skip = await appUnavailable();
  if (st.skip) return;
  st.cookie = await signInCookie("chemist@kestrelbay.example");
  const rng = seededRng(1536);
  const made = await planWithResults(st.cookie, sixFactorDocument("Bench: 1536-run six-factor CCD", 16), (c) => response(FACTORS.map((f) => c[f]!), rng));
  st.planId = made.planId;
  const terms = buildTerms("quadratic", FACTORS);
  st.names = terms.map((t) => t.name);
  st.exponents = terms.map((t) => t.exponents);
  st.X = made.runs.map((r) => [...modelRow(terms, FACTORS.map((f) => r.coded[f]!))]);
  st.y = made.yields;
  st.coded = made.runs.map((r) => r.coded);
}

/** The engine alone on the same data (what `fit` does in-process), median of 15 after 3 warm-ups. */
function engineMs(): number {
  const input = { factors: FACTORS.map((name) => ({ name, low: -1, high: 1 })), runs: st.coded.map((c, i) => ({ coded: c, response: st.y[i]! })), model: "quadratic", prune: { alpha: 0.05, hierarchy: true } };
  const times: number[] = [];
  for (let i = 0; i < 18; i++) {
    const t0 = performance.now();
    fitResponseSurface(input);
    if (i >= 3) times.push(performance.now() - t0);
  }
  return times.sort((a, b) => a - b)[Math.floor(times.length / 2)]!;
}

export const cases: AsyncBenchCase[] = [
  {
    name: "analysis route (HTTP): 1536 runs, 28-term quadratic, backward elimination with hierarchy, optimum in the safe envelope — vs statsmodels",
    targetMs: 1000,
    repeat: 15,
    warmup: 3,
    runAsync: async () => {
      if (!st.planId && st.skip === null) await setup();
      if (st.skip) return;
      st.last = await api(st.cookie, "GET", `/plans/${st.planId}/analysis?${QUERY}`);
    },
    note: (r) => {
      if (st.skip) return [`skipped: ${st.skip}`];
      const skip = statsmodelsReady();
      if (skip) return [`statsmodels comparison skipped: ${skip}`];
      const dir = mkdtempSync(join(tmpdir(), "tareline-route-bench-"));
      try {
        const data = join(dir, "data.json");
        const script = join(dir, "backward.py");
        writeFileSync(data, JSON.stringify({ X: st.X, y: st.y, exponents: st.exponents, alpha: 0.05, repeat: 15 }));
        writeFileSync(script, PY_SCRIPT);
        const env = { ...process.env, OMP_NUM_THREADS: "1", OPENBLAS_NUM_THREADS: "1" };
        const py = JSON.parse(execFileSync("/usr/bin/python3", [script, data], { encoding: "utf8", maxBuffer: 1 << 24, env })) as { kept: number[]; coefficients: number[]; medianMs: number; minMs: number };
        const ours = st.last!;
        const pyKept = py.kept.map((j) => st.names[j]!);
        const same = JSON.stringify(pyKept) === JSON.stringify(ours.terms.map((t) => t.term));
        const diff = same ? Math.max(...ours.terms.map((t, j) => Math.abs(t.estimate - py.coefficients[j]!))) : NaN;
        const engine = engineMs();
        return [
          `the route answered for n = ${ours.stats.n} runs; statsmodels (same data and elimination rules, one BLAS thread, timed inside Python, no database, no HTTP): median ${py.medianMs.toFixed(2)} ms (min ${py.minMs.toFixed(2)})`,
          `agreement: ${same ? `the same ${pyKept.length} kept terms` : `DIFFERENT kept terms (statsmodels: ${pyKept.join(", ")})`}; largest coefficient difference ${diff.toExponential(2)}`,
          `the engine alone in-process on the same data (fit, pruning, ANOVA, diagnostics, canonical analysis): median ${engine.toFixed(2)} ms, ratio engine / statsmodels ${(engine / py.medianMs).toFixed(2)}`,
          `time ratio route / statsmodels: median ${(r.medianMs / py.medianMs).toFixed(2)}, min ${(r.minMs / py.minMs).toFixed(2)} (the route's figure is the whole request: session, database, fit, pruning, diagnostics, optimum with safety checks, JSON)`,
        ];
      } finally {
        rmSync(dir, { recursive: true, force: true });
      }
    },
  },
];
