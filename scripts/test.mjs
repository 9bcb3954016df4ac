// `npm test`: sets up what the tests need (dependencies, Chromium, a separate PostgreSQL
// test cluster with a fresh database) and runs every suite: type-check, lint, unit,
// integration, browser. Ends with "N passed, N failed"; exits non-zero on any failure.
//
//   node scripts/test.mjs                 everything
//   node scripts/test.mjs unit            one suite (static | unit | integration | e2e), several allowed
//   node scripts/test.mjs unit -- path    extra arguments go to the suite's runner
import { mkdirSync, readFileSync, existsSync, rmSync } from "node:fs";
import { createServer } from "node:net";
import { step, fail } from "./lib/log.mjs";
import { ensureNodeModules, ensureChromium } from "./lib/deps.mjs";

const root = new URL("..", import.meta.url).pathname.replace(/\/$/, "");
const argv = process.argv.slice(2);
const dash = argv.indexOf("--");
const suitesAsked = (dash === -1 ? argv : argv.slice(0, dash)).filter(Boolean);
const extra = dash === -1 ? [] : argv.slice(dash + 1);
const ALL = ["static", "unit", "integration", "e2e"];
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

function freePort() {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.listen(0, "127.0.0.1", () => {
      const { port } = srv.address();
      srv.close(() => resolve(port));
    });
    srv.on("error", reject);
  });
}

try {
  step(`Tareline tests: ${suites.join(", ")}`);
  ensureNodeModules(root);
  const { run, stopPid } = await import("./lib/run.mjs");
  const { ensureCluster } = await import("./lib/postgres.mjs");
  const { secrets } = await import("./lib/app-env.mjs");
  const { migrate, seed } = await import("./lib/database.mjs");
  const { ensureBuild, ensureNext } = await import("./lib/services.mjs");
  const runDir = `${root}/.run/test`;
  mkdirSync(runDir, { recursive: true });
  const bin = (name) => `${root}/node_modules/.bin/${name}`;
  const baseEnv = { ...process.env, NEXT_TELEMETRY_DISABLED: "1", FORCE_COLOR: "0" };

  let env = baseEnv;
  if (suites.includes("integration") || suites.includes("e2e")) {
    const s = secrets(root, "test");
    let url = process.env.TEST_DATABASE_URL;
    if (url) {
      step("PostgreSQL: using TEST_DATABASE_URL from the environment");
    } else {
      const cluster = ensureCluster({ root, name: "test", port: Number(process.env.TARELINE_TEST_PGPORT ?? 54339), database: "tareline_test", role: "tareline", password: s.dbPassword });
      step("PostgreSQL (test): recreating database tareline_test so every run starts clean");
      cluster.admin.drop("tareline_test");
      cluster.admin.create("tareline_test");
      url = cluster.url;
    }
    env = { ...baseEnv, DATABASE_URL: url, NEXTAUTH_SECRET: s.authSecret };
    migrate(root, env);
    seed(root, env);
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
  if (suites.includes("unit")) vitest("unit", baseEnv);
  if (suites.includes("integration")) vitest("integration", env);

  if (suites.includes("e2e")) {
    const chromium = ensureChromium();
    const port = Number(process.env.TARELINE_TEST_PORT ?? (await freePort()));
    const smtpPort = await freePort();
    const appUrl = `http://127.0.0.1:${port}`;
    const appEnv = { ...env, NODE_ENV: "production", NEXTAUTH_URL: appUrl, APP_URL: appUrl, SMTP_URL: `smtp://127.0.0.1:${smtpPort}`, MAIL_FROM: "Tareline tests <tests@tareline.invalid>" };
    ensureBuild(root, appEnv, ".next-test");
    await stopPid(`${runDir}/next.pid`);
    await ensureNext(root, appEnv, { port, runDir, distDir: ".next-test", name: "next" });
    const out = `${runDir}/playwright.json`;
    rmSync(out, { force: true });
    step(`browser and API tests (Playwright in ${chromium}) against ${appUrl}…`);
    try {
      run(bin("playwright"), ["test", "--reporter=list,json", ...extra], {
        env: { ...appEnv, E2E_BASE_URL: appUrl, E2E_SMTP_PORT: String(smtpPort), CHROMIUM_PATH: chromium, PLAYWRIGHT_JSON_OUTPUT_NAME: out },
        allowFail: true,
      });
    } finally {
      await stopPid(`${runDir}/next.pid`);
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
