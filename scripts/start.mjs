// `npm start`: sets up and runs Tareline on this machine. Safe to re-run.
import { mkdirSync, writeFileSync } from "node:fs";
import { step, fail } from "./lib/log.mjs";
import { ensureNodeModules } from "./lib/deps.mjs";

const root = new URL("..", import.meta.url).pathname.replace(/\/$/, "");
const PORT = Number(process.env.PORT ?? 3000);
const PGPORT = Number(process.env.TARELINE_PGPORT ?? 54329);
const SMTP_PORT = 1025;
const MAIL_WEB_PORT = 1080;

try {
  step("Tareline: setting up (npm start). Each step says what it does; re-runs skip what is done.");
  ensureNodeModules(root);
  const { ensureCluster } = await import("./lib/postgres.mjs");
  const { secrets } = await import("./lib/app-env.mjs");
  const { migrate, seed } = await import("./lib/database.mjs");
  const { ensureMaildev, ensureBuild, ensureNext } = await import("./lib/services.mjs");
  const runDir = `${root}/.run`;
  mkdirSync(runDir, { recursive: true });
  const s = secrets(root, "dev");

  let databaseUrl = process.env.DATABASE_URL;
  if (databaseUrl) step("PostgreSQL: using DATABASE_URL from the environment (no local cluster started)");
  else databaseUrl = ensureCluster({ root, name: "dev", port: PGPORT, database: "tareline_dev", role: "tareline", password: s.dbPassword }).url;

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
  // For developers who run `next dev` or sequelize-cli by hand.
  writeFileSync(`${root}/.env.local`, [
    "# Written by npm start; local to this machine, git-ignored.",
    `DATABASE_URL=${env.DATABASE_URL}`, `NEXTAUTH_URL=${env.NEXTAUTH_URL}`, `NEXTAUTH_SECRET=${env.NEXTAUTH_SECRET}`,
    `APP_URL=${env.APP_URL}`, `SMTP_URL=${env.SMTP_URL}`, `MAIL_FROM=${env.MAIL_FROM}`, "",
  ].join("\n"), { mode: 0o600 });

  migrate(root, env);
  seed(root, env);
  if (!process.env.SMTP_URL) await ensureMaildev(root, { smtpPort: SMTP_PORT, webPort: MAIL_WEB_PORT, runDir });
  else step(`Mail: sending to SMTP_URL from the environment`);
  ensureBuild(root, env, ".next");
  const url = await ensureNext(root, env, { port: PORT, runDir, distDir: ".next" });

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
  Logs:           .run/next.log, .run/maildev.log, .data/dev/postgres.log
  Stop:           npm stop
`);
} catch (error) {
  fail(error instanceof Error ? error.message : String(error));
}
