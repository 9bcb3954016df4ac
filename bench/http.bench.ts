/**
 * The plan page's data under load (issue 10, "Performance"): `GET /api/labs/{lab}/plans/{id}`
 * for a 96-run plan at 20 concurrent users, p95 ≤ 200 ms, against the running app, with
 * the health route (`GET /api/health`: one `SELECT 1`) measured the same way in the same run
 * for the ratio. Load tool: wrk (Debian's `wrk`, installed with apt-get when missing; as
 * root), 2 threads, 20 connections, each route warmed up and then loaded for
 * BENCH_HTTP_SECONDS (default 10); latencies are wrk's, over loopback, so they are the
 * server's time plus a few tens of microseconds.
 *
 * The app: the one at BENCH_BASE_URL, else http://127.0.0.1:$PORT (default 3000) when its
 * health route answers — `npm start` running —; otherwise this bench runs `npm start`
 * (scripts/start.mjs: cluster, migrations, demo data, build when the sources changed, the
 * app) and `npm stop` afterwards. It signs in as the demo chemist and uses a study of its
 * own, "Bench — HTTP load (npm run bench)", holding one 96-run plan (made once, kept,
 * archived between runs so the demo's study list stays as it was).
 */
import { spawnSync } from "node:child_process";
import { mkdtempSync, readFileSync, rmSync, writeFileSync } from "node:fs";
import { tmpdir } from "node:os";
import { join } from "node:path";
import { fileURLToPath, pathToFileURL } from "node:url";
import type { MeasuredBenchCase } from "./harness";

const root = fileURLToPath(new URL("..", import.meta.url));
const LAB = "kestrel-bay";
const CHEMIST = { email: "chemist@kestrelbay.example", password: "tareline-demo" }; // README "Demo accounts"
const STUDY_NAME = "Bench — HTTP load (npm run bench)";
const PLAN_NAME = "Bench — 96-run plan: 2^5 full factorial × 3 replicates";
const CONNECTIONS = 20;
const SECONDS = Number(process.env.BENCH_HTTP_SECONDS ?? 10);

type Json = Record<string, unknown>;

/** wrk on PATH, installed from Debian when missing (scripts/lib/deps.mjs `aptInstall`). */
async function ensureWrk(): Promise<string> {
  const which = spawnSync("sh", ["-c", "command -v wrk"], { encoding: "utf8" });
  if (which.status === 0 && which.stdout.trim()) return which.stdout.trim();
  const deps = (await import(pathToFileURL(join(root, "scripts/lib/deps.mjs")).href)) as { aptInstall: (pkg: string, why: string) => void };
  deps.aptInstall("wrk", "the HTTP load tool of npm run bench");
  return "wrk";
}

async function healthy(base: string): Promise<boolean> {
  try {
    const res = await fetch(`${base}/api/health`, { signal: AbortSignal.timeout(3000) });
    return res.ok;
  } catch {
    return false;
  }
}

/** The app to load: reused when it answers, else started with `npm start` (and stopped again by `stop`). */
async function app(): Promise<{ base: string; how: string; stop: () => void }> {
  const base = process.env.BENCH_BASE_URL ?? `http://127.0.0.1:${process.env.PORT ?? 3000}`;
  if (await healthy(base)) return { base, how: `reused the app running at ${base}`, stop: () => {} };
  if (process.env.BENCH_BASE_URL) throw new Error(`BENCH_BASE_URL=${base} does not answer /api/health.`);
  console.log(`  (no app at ${base}: starting it with npm start; this builds when the sources changed)`);
  const started = spawnSync(process.execPath, [join(root, "scripts/start.mjs")], { cwd: root, env: process.env, encoding: "utf8" });
  if (started.status !== 0) throw new Error(`npm start failed:\n${started.stdout}${started.stderr}`);
  if (!(await healthy(base))) throw new Error(`npm start finished but ${base}/api/health does not answer.`);
  return {
    base,
    how: `started with npm start at ${base}, stopped with npm stop afterwards`,
    stop: () => void spawnSync(process.execPath, [join(root, "scripts/stop.mjs")], { cwd: root, env: process.env, encoding: "utf8" }),
  };
}

/** Signs in through next-auth's credentials callback; returns the Cookie header of the session. */
async function signIn(base: string): Promise<string> {
  const csrf = await fetch(`${base}/api/auth/csrf`);
  const { csrfToken } = (await csrf.json()) as { csrfToken: string };
  const jar = new Map<string, string>();
  const keep = (res: Response) => {
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(";");
      const i = pair!.indexOf("=");
      jar.set(pair!.slice(0, i), pair!.slice(i + 1));
    }
  };
  keep(csrf);
  const cookie = () => [...jar].map(([k, v]) => `${k}=${v}`).join("; ");
  const res = await fetch(`${base}/api/auth/callback/credentials`, {
    method: "POST",
    redirect: "manual",
    headers: { "content-type": "application/x-www-form-urlencoded", cookie: cookie() },
    body: new URLSearchParams({ csrfToken, email: CHEMIST.email, password: CHEMIST.password, json: "true" }).toString(),
  });
  keep(res);
  if (![...jar.keys()].some((k) => k.includes("session-token"))) throw new Error(`Signing in as ${CHEMIST.email} failed (${res.status}).`);
  return cookie();
}

/** fetch, tried once more when a kept-alive connection was closed by the server meanwhile (after a load run). */
async function fetchOnce(url: string, init?: RequestInit): Promise<Response> {
  try {
    return await fetch(url, init);
  } catch (e) {
    if (!(e instanceof TypeError)) throw e;
    return fetch(url, init);
  }
}

async function api<T>(base: string, cookie: string, path: string, method = "GET", body?: unknown): Promise<T> {
  const res = await fetchOnce(`${base}/api/labs/${LAB}${path}`, {
    method,
    headers: { cookie, ...(body === undefined ? {} : { "content-type": "application/json" }) },
    body: body === undefined ? undefined : JSON.stringify(body),
  });
  const json = (await res.json()) as T & { error?: { message: string } };
  if (!res.ok) throw new Error(`${method} ${path}: ${res.status} ${json.error?.message ?? ""}`);
  return json;
}

/**
 * The 96-run plan: the demo's Suzuki–Miyaura screen (examples/plan-suzuki.json) as a 2^5 full
 * factorial in three replicates on the 96-position block in 1 mL vials, 0.05 mmol in 250 µL,
 * temperature 40–80 °C, with its components linked to the demo inventory where it has them
 * (so every GET also reads the inventory's facts, as the plan page does).
 */
function benchDocument(chemicals: Array<{ id: string; name: string }>): Json {
  const doc = JSON.parse(readFileSync(join(root, "examples/plan-suzuki.json"), "utf8")) as Json & { recipe: Json & { components: Json[]; solvents: Json[] }; factors: Json[] };
  const link = (name: string) => chemicals.find((c) => c.name === name)?.id;
  doc.name = PLAN_NAME;
  doc.recipe.scaleMmol = 0.05;
  doc.recipe.solvents = doc.recipe.solvents.map((s) => {
    const id = link(s.name === "water" ? "Water, deionised" : "1,4-Dioxane");
    const { openedOn: _o, peroxideTestedOn: _p, ...rest } = s;
    return id ? { ...rest, chemicalId: id } : s;
  });
  const base = doc.recipe.components.find((c) => c.id === "base")!;
  const id = link("Potassium phosphate tribasic");
  if (id) Object.assign(base, { chemicalId: id, form: { state: "solid", purityWtPercent: 97 } });
  doc.factors[0] = { ...doc.factors[0], low: 40, high: 80 };
  doc.design = { design: "full-factorial", replicates: 3, centerPoints: 0, randomize: true, seed: 96 };
  doc.vessel = "vial-1ml-screw-septum";
  doc.block = "block-al-96";
  delete doc.equipment;
  delete doc.now;
  return doc;
}

/** The bench study and its 96-run plan, made once and kept (the study archived between runs). */
async function benchPlan(base: string, cookie: string): Promise<{ planId: string; studyId: string }> {
  const found = await api<{ studies: Array<{ id: string; name: string; archivedAt: string | null }> }>(base, cookie, `/studies?q=${encodeURIComponent(STUDY_NAME)}&archived=include`);
  let study = found.studies.find((s) => s.name === STUDY_NAME);
  if (!study) {
    study = (await api<{ study: { id: string; name: string; archivedAt: null } }>(base, cookie, "/studies", "POST", { name: STUDY_NAME, goal: "Load test of the plan page's data (npm run bench).", responses: [{ name: "yield", unit: "%", goal: "maximize" }] })).study;
  } else if (study.archivedAt) await api(base, cookie, `/studies/${study.id}?restore=1`, "DELETE");
  const { plans } = await api<{ plans: Array<{ id: string; name: string; runCount: number | null }> }>(base, cookie, `/studies/${study.id}`);
  let plan = plans.find((p) => p.name === PLAN_NAME);
  if (!plan) {
    const { chemicals } = await api<{ chemicals: Array<{ id: string; name: string }> }>(base, cookie, "/chemicals");
    plan = (await api<{ plan: { id: string; name: string; runCount: number | null } }>(base, cookie, `/studies/${study.id}/plans`, "POST", { document: benchDocument(chemicals) })).plan;
  }
  if (plan.runCount !== 96) throw new Error(`The bench plan has ${plan.runCount} runs, not 96.`);
  return { planId: plan.id, studyId: study.id };
}

interface Load {
  p50: number;
  p95: number;
  p99: number;
  max: number;
  requests: number;
  errors: number;
  non2xx: number;
}

/** wrk at CONNECTIONS connections for SECONDS s (after a 2 s warm-up); latencies in ms. */
function load(wrk: string, url: string, cookie: string): Load {
  const dir = mkdtempSync(join(tmpdir(), "tareline-bench-"));
  const script = join(dir, "report.lua");
  // wrk's Lua API (wrk 4): done() gets the latency histogram in microseconds.
  writeFileSync(
    script,
    `done = function(summary, latency, requests)
  local e = summary.errors
  io.write(string.format('RESULT {"p50":%d,"p95":%d,"p99":%d,"max":%d,"requests":%d,"errors":%d,"non2xx":%d}\\n',
    latency:percentile(50), latency:percentile(95), latency:percentile(99), latency.max, summary.requests,
    e.connect + e.read + e.write + e.timeout, e.status))
end
`,
  );
  try {
    const args = (seconds: number) => ["-t", "2", "-c", String(CONNECTIONS), "-d", `${seconds}s`, "--timeout", "10s", "-H", `Cookie: ${cookie}`, "-s", script, url];
    spawnSync(wrk, args(2), { encoding: "utf8" });
    const r = spawnSync(wrk, args(SECONDS), { encoding: "utf8" });
    const line = r.stdout.split("\n").find((l) => l.startsWith("RESULT "));
    if (r.status !== 0 || !line) throw new Error(`wrk failed: ${r.stdout}${r.stderr}`);
    const j = JSON.parse(line.slice(7)) as Load;
    return { ...j, p50: j.p50 / 1000, p95: j.p95 / 1000, p99: j.p99 / 1000, max: j.max / 1000 };
  } finally {
    rmSync(dir, { recursive: true, force: true });
  }
}

const ms = (v: number) => `${v.toFixed(1)} ms`;

export const measuredCases: MeasuredBenchCase[] = [
  {
    name: `http: GET /plans/{id} (96-run plan), ${CONNECTIONS} concurrent users, p95 (wrk, vs GET /api/health in the same run)`,
    targetMs: 200,
    measure: async () => {
      const wrk = await ensureWrk();
      const target = await app();
      try {
        const cookie = await signIn(target.base);
        const { planId, studyId } = await benchPlan(target.base, cookie);
        const url = `${target.base}/api/labs/${LAB}/plans/${planId}`;
        // One request first, alone: what a plan costs when nothing is cached (or was, by an earlier run).
        const t0 = performance.now();
        const first = await fetchOnce(url, { headers: { cookie } });
        const bytes = (await first.arrayBuffer()).byteLength;
        const firstMs = performance.now() - t0;
        const plan = load(wrk, url, cookie);
        const health = load(wrk, `${target.base}/api/health`, cookie);
        await api(target.base, cookie, `/studies/${studyId}`, "DELETE"); // archive the bench study again
        const version = spawnSync(wrk, ["-v"], { encoding: "utf8" });
        return {
          valueMs: plan.p95,
          detail: `p50 ${plan.p50.toFixed(1)}, p99 ${plan.p99.toFixed(1)}, max ${plan.max.toFixed(1)}`,
          notes: [
            `plan: ${plan.requests} requests in ${SECONDS} s (${(plan.requests / SECONDS).toFixed(0)}/s), ${plan.errors} socket errors, ${plan.non2xx} non-2xx; response ${(bytes / 1024).toFixed(0)} KiB; first request alone ${ms(firstMs)}`,
            `health: p50 ${ms(health.p50)}, p95 ${ms(health.p95)}, p99 ${ms(health.p99)}; ${health.requests} requests (${(health.requests / SECONDS).toFixed(0)}/s), ${health.errors + health.non2xx} errors`,
            `ratio of p95s, plan / health: ${(plan.p95 / health.p95).toFixed(1)}`,
            `load tool: ${(version.stdout || version.stderr).split("\n")[0]?.trim()}, 2 threads, ${CONNECTIONS} connections, 2 s warm-up + ${SECONDS} s per route; app ${target.how}`,
          ],
        };
      } finally {
        target.stop();
      }
    },
  },
];
