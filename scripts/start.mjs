// `npm start`: sets up and runs Tareline on this machine. Safe to re-run: every step says
// what it does and skips what is done. One `npm start`/`npm stop` at a time per checkout.
import { mkdirSync, writeFileSync } from "node:fs";
import { step, fail } from "./lib/log.mjs";
import { ensureNodeModules } from "./lib/deps.mjs";
import { acquireLock } from "./lib/lock.mjs";

const root = new URL("..", import.meta.url).pathname.replace(/\/$/, "");
const port = (name, fallback) => {
  const value = Number(process.env[name] ?? fallback);
  if (!Number.isInteger(value) || value < 1 || value > 65535) fail(`${name} must be a port number (1–65535), not "${process.env[name]}".`);
  return value;
};
const PORT = port("PORT", 3000);
const PGPORT = port("TARELINE_PGPORT", 54329);
const SMTP_PORT = port("TARELINE_SMTP_PORT", 1025);
const MAIL_WEB_PORT = port("TARELINE_MAIL_WEB_PORT", 1080);
const DIST_DIR = process.env.NEXT_DIST_DIR || ".next";

try {
  step("Tareline: setting up (npm start). Each step says what it does; re-runs skip what is done.");
  await acquireLock(`${root}/.run/start.lock`, "npm start or npm stop");
  ensureNodeModules(root);
  const { ensureCluster, clusterPaths, runningServer } = await import("./lib/postgres.mjs");
  const { secrets } = await import("./lib/app-env.mjs");
  const { migrate, seed } = await import("./lib/database.mjs");
  const { ensureMaildev, ensureBuild, ensureNext, ensureWorker, checkPortsFirst, runsWith } = await import("./lib/services.mjs");
  const runDir = `${root}/.run`;
  mkdirSync(runDir, { recursive: true });
  const s = secrets(root, "dev");

  // Before anything starts: every port we will listen on is free, or already ours.
  const ourPg = runningServer(clusterPaths(root, "dev").data);
  const maildevOurs = runsWith(`${runDir}/maildev.pid`, { smtpPort: SMTP_PORT, webPort: MAIL_WEB_PORT });
  await checkPortsFirst([
    ...(process.env.DATABASE_URL ? [] : [{ port: PGPORT, what: "PostgreSQL (dev)", envVar: "TARELINE_PGPORT", ours: ourPg?.port === PGPORT }]),
    ...(process.env.SMTP_URL ? [] : [
      { port: SMTP_PORT, what: "the fake mail service's SMTP", envVar: "TARELINE_SMTP_PORT", ours: maildevOurs },
      { port: MAIL_WEB_PORT, what: "the fake mail service's inbox", envVar: "TARELINE_MAIL_WEB_PORT", ours: maildevOurs },
    ]),
    { port: PORT, what: "the Tareline app (Next.js)", envVar: "PORT", ours: runsWith(`${runDir}/next.pid`, { port: PORT, distDir: DIST_DIR }) },
  ], "npm start");

  let databaseUrl = process.env.DATABASE_URL;
  let pgLog = null;
  if (databaseUrl) step("PostgreSQL: using DATABASE_URL from the environment (no local cluster started)");
  else {
    const cluster = await ensureCluster({ root, name: "dev", port: PGPORT, portVar: "TARELINE_PGPORT", database: "tareline_dev", role: "tareline", password: s.dbPassword });
    databaseUrl = cluster.url;
    pgLog = cluster.paths.log;
  }

  const smtpUrl = process.env.SMTP_URL ?? `smtp://127.0.0.1:${SMTP_PORT}`;
  const appUrl = `http://127.0.0.1:${PORT}`;
  const env = {
    ...process.env,
    NODE_ENV: "production",
    NEXT_TELEMETRY_DISABLED: "1",
    DATABASE_URL: databaseUrl,
    NEXTAUTH_URL: process.env.NEXTAUTH_URL ?? appUrl,
    NEXTAUTH_SECRET: process.env.NEXTAUTH_SECRET ?? s.authSecret,
    APP_URL: process.env.APP_URL ?? appUrl,
    SMTP_URL: smtpUrl,
    MAIL_FROM: process.env.MAIL_FROM ?? "Tareline <no-reply@tareline.invalid>",
  };
  // For developers who run `next dev`, the worker or sequelize-cli by hand.
  writeFileSync(`${root}/.env.local`, [
    "# Written by npm start; local to this machine, git-ignored.",
    `DATABASE_URL=${env.DATABASE_URL}`, `NEXTAUTH_URL=${env.NEXTAUTH_URL}`, `NEXTAUTH_SECRET=${env.NEXTAUTH_SECRET}`,
    `APP_URL=${env.APP_URL}`, `SMTP_URL=${env.SMTP_URL}`, `MAIL_FROM=${env.MAIL_FROM}`, "",
  ].join("\n"), { mode: 0o600 });

  migrate(root, env);
  seed(root, env);
  if (!process.env.SMTP_URL) await ensureMaildev(root, { smtpPort: SMTP_PORT, webPort: MAIL_WEB_PORT, runDir });
  else step(`Mail: the worker sends to SMTP_URL from the environment`);
  // The worker creates (or upgrades) pg-boss's schema and the queues before it says it is
  // ready, so it starts before the app, which only adds jobs.
  await ensureWorker(root, env, { runDir });
  ensureBuild(root, env, DIST_DIR);
  const url = await ensureNext(root, env, { port: PORT, runDir, distDir: DIST_DIR });

  console.log(`
Tareline is running.
  App:            ${url}
  Mail inbox:     ${process.env.SMTP_URL ? "(external SMTP)" : `http://127.0.0.1:${MAIL_WEB_PORT}/index.html`}
  Demo lab:       Kestrel Bay Process Chemistry — password for every demo account: tareline-demo
    chemist          chemist@kestrelbay.example
    safety officer   safety@kestrelbay.example
    stockkeeper      stock@kestrelbay.example
    lab admin        admin@kestrelbay.example
    viewer           viewer@kestrelbay.example
  Second lab:     Harrow Fen Analytical — analyst@harrowfen.example (same password)
  Logs:           .run/next.log, .run/worker.log, .run/maildev.log${pgLog ? `, ${pgLog}` : ""}
  Stop:           npm stop
`);
} catch (error) {
  fail(error instanceof Error ? error.message : String(error));
}
