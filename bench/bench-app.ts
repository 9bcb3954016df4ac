/**
 * What the route and page benchmarks need of a running Tareline app: its URL
 * (TARELINE_BENCH_URL, default http://127.0.0.1:$PORT), a signed-in session of the demo
 * chemist, and a plan of a study with results. The plan's state is set to running directly
 * in the database (DATABASE_URL) — a benchmark fixture: review and release are not what is
 * measured — and its results are entered through the real `PUT …/results` route.
 */
import pg from "pg";

export const BENCH_LAB = "kestrel-bay";
export const BENCH_URL = process.env.TARELINE_BENCH_URL ?? `http://127.0.0.1:${process.env.PORT ?? "3000"}`;

/** Why the app benchmarks cannot run here, or null. */
export async function appUnavailable(): Promise<string | null> {
  if (!process.env.DATABASE_URL) return "DATABASE_URL is not set (the app's database, to put the bench plan in the running state)";
  try {
    const res = await fetch(`${BENCH_URL}/api/health`);
    return res.ok ? null : `${BENCH_URL}/api/health answered ${res.status}`;
  } catch {
    return `no Tareline app at ${BENCH_URL} (start one and set TARELINE_BENCH_URL)`;
  }
}

/** A cookie jar of one signed-in session (next-auth credentials flow). */
export async function signInCookie(email: string, password = "tareline-demo"): Promise<string> {
  const jar = new Map<string, string>();
  const keep = (res: Response) => {
    for (const c of res.headers.getSetCookie()) {
      const [pair] = c.split(";");
      const i = pair!.indexOf("=");
      jar.set(pair!.slice(0, i), pair!.slice(i + 1));
    }
  };
  const cookie = () => [...jar].map(([k, v]) => `${k}=${v}`).join("; ");
  const csrfRes = await fetch(`${BENCH_URL}/api/auth/csrf`);
  keep(csrfRes);
  const { csrfToken } = (await csrfRes.json()) as { csrfToken: string };
  const res = await fetch(`${BENCH_URL}/api/auth/callback/credentials`, {
    method: "POST",
    headers: { "content-type": "application/x-www-form-urlencoded", cookie: cookie() },
    body: new URLSearchParams({ csrfToken, email, password, json: "true" }).toString(),
    redirect: "manual",
  });
  keep(res);
  if (![...jar.keys()].some((k) => k.includes("session-token"))) throw new Error(`sign-in as ${email} failed (${res.status})`);
  return cookie();
}

export async function api<T>(cookie: string, method: string, path: string, body?: unknown): Promise<T> {
  const res = await fetch(`${BENCH_URL}/api/labs/${BENCH_LAB}${path}`, { method, headers: { cookie, ...(body === undefined ? {} : { "content-type": "application/json" }) }, body: body === undefined ? undefined : JSON.stringify(body) });
  const text = await res.text();
  if (!res.ok) throw new Error(`${method} ${path} → ${res.status}: ${text.slice(0, 300)}`);
  return JSON.parse(text) as T;
}

/** A study and a plan with `document`, put in the running state, with results from `yieldOf(coded)`. */
export async function planWithResults(cookie: string, document: Record<string, unknown>, yieldOf: (coded: Record<string, number>, i: number) => number): Promise<{ studyId: string; planId: string; runs: Array<{ run: number; coded: Record<string, number>; natural: Record<string, number> }>; yields: number[] }> {
  const { study } = await api<{ study: { id: string } }>(cookie, "POST", "/studies", { name: `Bench ${Date.now()}`, responses: [{ name: "yield", unit: "%", goal: "maximize" }] });
  const { plan } = await api<{ plan: { id: string } }>(cookie, "POST", `/studies/${study.id}/plans`, { document });
  const db = new pg.Client({ connectionString: process.env.DATABASE_URL });
  await db.connect();
  try {
    await db.query("UPDATE plans SET state = 'running' WHERE id = $1", [plan.id]); // benchmark fixture
  } finally {
    await db.end();
  }
  const { results } = await api<{ results: { runNumbers: number[] } }>(cookie, "GET", `/plans/${plan.id}/results`);
  const { plan: full } = await api<{ plan: { document: { factors: Array<{ name: string; low: number; high: number }> }; runSheet: { runs: Array<{ run: number; coded: Record<string, number>; natural: Record<string, number> }> } | null } }>(cookie, "GET", `/plans/${plan.id}`);
  if (!full.runSheet || full.runSheet.runs.length !== results.runNumbers.length) throw new Error("the bench plan has no run sheet");
  const runs = [...full.runSheet.runs].sort((a, b) => a.run - b.run);
  const yields = runs.map((r, i) => yieldOf(r.coded, i));
  await api(cookie, "PUT", `/plans/${plan.id}/results`, { runs: runs.map((r, i) => ({ run: r.run, responses: { yield: yields[i]! } })) });
  return { studyId: study.id, planId: plan.id, runs, yields };
}
