// `npm test`: sets up what the tests need (dependencies, Chromium, a separate PostgreSQL
// test cluster with a fresh database) and runs every suite: type-check, lint, unit,
// integration, browser. Ends with "N passed, N failed"; exits non-zero on any failure.
//
// The integration and browser suites run against the real job worker (lib/jobs/worker.ts),
// which delivers mail to an SMTP port the tests listen on (TEST_SMTP_PORT / E2E_SMTP_PORT).
// The bootstrap suite runs `npm start` in a copy of this checkout (as root only).
// One `npm test` at a time per checkout: a second one waits for the first.
//
//   node scripts/test.mjs                 everything
//   node scripts/test.mjs unit            one suite (static | unit | integration | e2e | bootstrap), several allowed
//   node scripts/test.mjs unit -- path    extra arguments go to the suite's runner
import { mkdirSync, readFileSync, existsSync, rmSync } from "node:fs";
import { step, fail } from "./lib/log.mjs";
import { ensureNodeModules, ensureChromium, ensurePoppler } from "./lib/deps.mjs";
import { acquireLock } from "./lib/lock.mjs";
import { assertPortFree, freePort } from "./lib/ports.mjs";

const root = new URL("..", import.meta.url).pathname.replace(/\/$/, "");
const argv = process.argv.slice(2);
const dash = argv.indexOf("--");
const suitesAsked = (dash === -1 ? argv : argv.slice(0, dash)).filter(Boolean);
const extra = dash === -1 ? [] : argv.slice(dash + 1);
const ALL = ["static", "unit", "integration", "e2e", "bootstrap"];
for (const s of suitesAsked) if (!ALL.includes(s)) fail(`Unknown suite "${s}". Choose from: ${ALL.join(", ")}.`);
const suites = suitesAsked.length ? suitesAsked : ALL;

const totals = { passed: 0, failed: 0, skipped: 0 };
const lines = [];
function record(name, passed, failed, skipped = 0) {
  totals.passed += passed;
  totals.failed += failed;
  totals.skipped += skipped;
  lines.push(`${name.padEnd(12)} ${passed} passed, ${failed} failed${skipped ? `, ${skipped} skipped` : ""}`);
}

const portFromEnv = (name) => {
  if (!process.env[name]) return null;
  const value = Number(process.env[name]);
  if (!Number.isInteger(value) || value < 1 || value > 65535) fail(`${name} must be a port number (1–65535), not "${process.env[name]}".`);
  return value;
};

try {
  step(`Tareline tests: ${suites.join(", ")}`);
  await acquireLock(`${root}/.run/test.lock`, "npm test");
  ensureNodeModules(root);
  const { run } = await import("./lib/run.mjs");
  const { stopRecorded } = await import("./lib/processes.mjs");
  const { ensureCluster, clusterPaths, runningServer } = await import("./lib/postgres.mjs");
  const { secrets } = await import("./lib/app-env.mjs");
  const { migrate, seed } = await import("./lib/database.mjs");
  const { ensureBuild, ensureNext, ensureWorker, checkPortsFirst } = await import("./lib/services.mjs");
  const runDir = `${root}/.run/test`;
  mkdirSync(runDir, { recursive: true });
  // Before anything starts: the fixed ports this run will listen on are free, or ours.
  const pgPort = portFromEnv("TARELINE_TEST_PGPORT") ?? 54339;
  const appPort = portFromEnv("TARELINE_TEST_PORT");
  await stopRecorded(`${runDir}/next.pid`);
  await checkPortsFirst([
    ...((suites.includes("integration") || suites.includes("e2e")) && !process.env.TEST_DATABASE_URL
      ? [{ port: pgPort, what: "PostgreSQL (test)", envVar: "TARELINE_TEST_PGPORT", ours: runningServer(clusterPaths(root, "test").data)?.port === pgPort }]
      : []),
    ...(suites.includes("e2e") && appPort ? [{ port: appPort, what: "the app under test (Next.js)", envVar: "TARELINE_TEST_PORT", ours: false }] : []),
  ], "npm test");
  const bin = (name) => `${root}/node_modules/.bin/${name}`;
  const baseEnv = { ...process.env, NEXT_TELEMETRY_DISABLED: "1", FORCE_COLOR: "0" };
  const stopWorker = async () => {
    if (await stopRecorded(`${runDir}/worker.pid`, { graceMs: 35_000 })) step("Job worker (test): stopped");
  };

  let env = baseEnv;
  let smtpPort = null;
  if (suites.includes("integration") || suites.includes("e2e")) {
    const s = secrets(root, "test");
    // The worker of an earlier run is stopped before its database is recreated.
    await stopWorker();
    let url = process.env.TEST_DATABASE_URL;
    if (url) {
      step("PostgreSQL: using TEST_DATABASE_URL from the environment");
    } else {
      const cluster = await ensureCluster({
        root, name: "test", port: pgPort, portVar: "TARELINE_TEST_PGPORT",
        database: "tareline_test", role: "tareline", password: s.dbPassword, command: "npm test",
      });
      step("PostgreSQL (test): recreating database tareline_test so every run starts clean");
      cluster.admin.drop("tareline_test");
      cluster.admin.create("tareline_test");
      url = cluster.url;
    }
    // Mail from the tests goes to an SMTP server that the tests themselves run on this port.
    smtpPort = portFromEnv("TARELINE_TEST_SMTP_PORT") ?? (await freePort());
    await assertPortFree(smtpPort, { what: "the tests' SMTP capture", envVar: "TARELINE_TEST_SMTP_PORT", command: "npm test" });
    env = {
      ...baseEnv, DATABASE_URL: url, NEXTAUTH_SECRET: s.authSecret,
      SMTP_URL: `smtp://127.0.0.1:${smtpPort}`, MAIL_FROM: "Tareline tests <tests@tareline.invalid>", TEST_SMTP_PORT: String(smtpPort),
      // Quick retries so the mail-outage test does not wait long; the worker polls often.
      TARELINE_JOB_RETRY_DELAY_SECONDS: process.env.TARELINE_JOB_RETRY_DELAY_SECONDS ?? "1",
      TARELINE_JOB_POLL_SECONDS: process.env.TARELINE_JOB_POLL_SECONDS ?? "0.5",
    };
    migrate(root, env);
    seed(root, env);
    await ensureWorker(root, { ...env, NODE_ENV: "production" }, { runDir, restart: true });
  }

  if (suites.includes("static")) {
    step("Type-check (tsc --noEmit)…");
    const tsc = run(bin("tsc"), ["--noEmit", "-p", "tsconfig.json"], { allowFail: true });
    record("typecheck", tsc.status === 0 ? 1 : 0, tsc.status === 0 ? 0 : 1);
    step("Lint (eslint)…");
    const lint = run(bin("eslint"), ["--max-warnings=0", "."], { allowFail: true });
    record("lint", lint.status === 0 ? 1 : 0, lint.status === 0 ? 0 : 1);
  }

  const vitest = (project, runEnv) => {
    const out = `${runDir}/vitest-${project}.json`;
    rmSync(out, { force: true });
    step(`${project} tests (vitest)…`);
    const r = run(bin("vitest"), ["run", "--project", project, "--reporter=default", "--reporter=json", `--outputFile.json=${out}`, ...extra], { env: runEnv, allowFail: true });
    if (!existsSync(out)) return record(project, 0, 1);
    const j = JSON.parse(readFileSync(out, "utf8"));
    const brokenFiles = (j.testResults ?? []).filter((f) => f.status === "failed" && (f.assertionResults ?? []).length === 0).length;
    const failed = j.numFailedTests + brokenFiles + (r.status !== 0 && j.numFailedTests + brokenFiles === 0 ? 1 : 0);
    record(project, j.numPassedTests, failed, j.numPendingTests + (j.numTodoTests ?? 0));
  };
  try {
    // The report tests (unit), the sheet routes (integration) and the release flow (e2e) read PDFs with pdftotext and render them with pdftoppm.
    if (suites.includes("unit") || suites.includes("integration") || suites.includes("e2e")) ensurePoppler();
    if (suites.includes("unit")) vitest("unit", baseEnv);
    if (suites.includes("integration")) vitest("integration", env);
    if (suites.includes("e2e")) await e2e();
  } finally {
    await stopWorker();
  }
  // Last: it copies the checkout with the browser build the e2e suite has just made.
  if (suites.includes("bootstrap")) vitest("bootstrap", baseEnv);

  async function e2e() {
    const chromium = ensureChromium();
    const port = appPort ?? (await freePort());
    const appUrl = `http://127.0.0.1:${port}`;
    const appEnv = { ...env, NODE_ENV: "production", NEXTAUTH_URL: appUrl, APP_URL: appUrl };
    ensureBuild(root, appEnv, ".next-test");
    await stopRecorded(`${runDir}/next.pid`);
    await ensureNext(root, appEnv, { port, runDir, distDir: ".next-test", name: "next", portVar: "TARELINE_TEST_PORT", command: "npm test" });
    const out = `${runDir}/playwright.json`;
    rmSync(out, { force: true });
    step(`browser and API tests (Playwright in ${chromium}) against ${appUrl}…`);
    try {
      run(bin("playwright"), ["test", "--reporter=list,json", ...extra], {
        env: { ...appEnv, E2E_BASE_URL: appUrl, E2E_SMTP_PORT: String(smtpPort), CHROMIUM_PATH: chromium, PLAYWRIGHT_JSON_OUTPUT_NAME: out },
        allowFail: true,
      });
    } finally {
      await stopRecorded(`${runDir}/next.pid`);
    }
    if (!existsSync(out)) record("e2e", 0, 1);
    else {
      const st = JSON.parse(readFileSync(out, "utf8")).stats;
      record("e2e", st.expected + (st.flaky ?? 0), st.unexpected + ((st.expected + st.unexpected) === 0 ? 1 : 0), st.skipped);
    }
  }

  console.log("\nSummary");
  for (const l of lines) console.log(`  ${l}`);
  console.log(`\n${totals.passed} passed, ${totals.failed} failed${totals.skipped ? `, ${totals.skipped} skipped` : ""}`);
  process.exitCode = totals.failed === 0 ? 0 : 1;
} catch (error) {
  console.log(`\n${totals.passed} passed, ${totals.failed + 1} failed`);
  fail(error instanceof Error ? error.message : String(error));
}
