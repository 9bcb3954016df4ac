/**
 * Re-fitting on the analysis page (issue 12 item 5): in Chromium (Debian's, through
 * Playwright), the analysis page of a 96-run six-factor plan (a face-centred central
 * composite design) with the quadratic model; a term is ticked or unticked, and the time
 * from the click (performance mark `tareline:refit-start`, set in the checkbox's handler)
 * to the redrawn coefficient table (`tareline:refit-drawn`, set when the table of the new
 * fit is committed to the DOM) is read from the page's `tareline:refit` measure. The
 * re-fit goes through the analysis route (a request per tick); each tick unticks another
 * term, so every model is new (none is answered from the page's cache). Needs the app
 * (TARELINE_BENCH_URL) and its database (DATABASE_URL); skipped with a note otherwise.
 */
import { chromium, type Browser, type Page } from "@playwright/test";
import type { AsyncBenchCase } from "./harness";
import { response } from "./analysis.bench";
import { FACTORS, sixFactorDocument } from "./analysis-route.bench";
import { BENCH_LAB, BENCH_URL, appUnavailable, planWithResults, signInCookie } from "./bench-app";
import { seededRng } from "../lib/doe";

const ARGS = ["--headless", "--no-sandbox", "--disable-gpu", "--disable-quic", "--no-first-run", "--disable-background-networking", "--disable-component-update", "--disable-sync"];

const st: { skip: string | null; browser: Browser | null; page: Page | null; ticks: number; samples: number[] } = { skip: null, browser: null, page: null, ticks: 0, samples: [] };

async function setup(): Promise<void> {
  st.skip = await appUnavailable();
  if (st.skip) return;
  const cookie = await signInCookie("chemist@kestrelbay.example");
  const rng = seededRng(96);
  const made = await planWithResults(cookie, sixFactorDocument("Bench: 96-run six-factor CCD", 1), (c) => response(FACTORS.map((f) => c[f]!), rng));
  st.browser = await chromium.launch({ executablePath: process.env.CHROMIUM_PATH ?? "/usr/bin/chromium", args: ARGS });
  const context = await st.browser.newContext({ viewport: { width: 1280, height: 900 }, baseURL: BENCH_URL });
  const url = new URL(BENCH_URL);
  await context.addCookies(cookie.split("; ").map((c) => ({ name: c.slice(0, c.indexOf("=")), value: c.slice(c.indexOf("=") + 1), domain: url.hostname, path: "/" })));
  st.page = await context.newPage();
  await st.page.goto(`/labs/${BENCH_LAB}/studies/${made.studyId}/plans/${made.planId}/analysis`);
  await st.page.getByTestId("coefficient-table").waitFor();
  await st.page.getByTestId("model-quadratic").check();
  await st.page.waitForFunction(() => document.querySelectorAll("[data-testid=coefficient-table] tbody tr").length === 28);
}

/** The terms unticked one after another (squares, then interactions): every tick is a model not fitted before, so no answer comes from the page's cache. */
const ORDER = (() => {
  const squares = FACTORS.map((f) => `${f}^2`);
  const pairs = FACTORS.flatMap((a, i) => FACTORS.slice(i + 1).map((b) => `${a}*${b}`));
  return [...squares, ...pairs];
})();

/** One tick (the next term of ORDER off) and the page's own measure of it. */
async function tick(): Promise<number> {
  const page = st.page!;
  const before = await page.evaluate(() => performance.getEntriesByName("tareline:refit", "measure").length);
  await page.getByTestId(`term-${ORDER[st.ticks % ORDER.length]}`).click();
  await page.waitForFunction((n) => performance.getEntriesByName("tareline:refit", "measure").length > n, before);
  st.ticks++;
  return page.evaluate(() => {
    const all = performance.getEntriesByName("tareline:refit", "measure");
    return all[all.length - 1]!.duration;
  });
}

export const cases: AsyncBenchCase[] = [
  {
    name: "analysis page (Chromium): tick a term on a 96-run plan → coefficient table redrawn (performance marks, click to table)",
    targetMs: 100,
    repeat: 21,
    warmup: 3,
    runAsync: async () => {
      if (!st.page && st.skip === null) await setup();
      if (st.skip) return;
      st.samples.push(await tick());
    },
    note: () => {
      if (st.skip) return [`skipped: ${st.skip}`];
      const marks = st.samples.slice(3).sort((a, b) => a - b);
      const median = marks[Math.floor(marks.length / 2)]!;
      void st.browser?.close();
      return [
        `the page's own measure (mark in the click handler → mark when the new table is in the DOM), ${marks.length} ticks: median ${median.toFixed(1)} ms, min ${marks[0]!.toFixed(1)}, max ${marks[marks.length - 1]!.toFixed(1)} ms (target ≤ 100 ms); the line above also counts Playwright's round trips`,
      ];
    },
  },
];
