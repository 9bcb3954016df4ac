// The fake mail service and the Next.js server, started detached with recorded pids.
import { existsSync, mkdirSync } from "node:fs";
import { run, startDetached, readPid, pidAlive, waitFor } from "./run.mjs";
import { step } from "./log.mjs";
import { buildIsFresh } from "./app-env.mjs";

export async function ensureMaildev(root, { smtpPort, webPort, runDir }) {
  const pidFile = `${runDir}/maildev.pid`;
  const pid = readPid(pidFile);
  if (pid && pidAlive(pid)) {
    step(`Fake mail service: already running (inbox http://127.0.0.1:${webPort}/index.html)`);
    return;
  }
  mkdirSync(`${root}/.data/mail`, { recursive: true });
  step(`Fake mail service: starting maildev (SMTP 127.0.0.1:${smtpPort}, inbox http://127.0.0.1:${webPort}/index.html)…`);
  startDetached(`${root}/node_modules/.bin/maildev`, [
    "--ip", "127.0.0.1", "--web-ip", "127.0.0.1", "-s", String(smtpPort), "-w", String(webPort),
    "--mail-directory", `${root}/.data/mail`,
  ], { env: process.env, logFile: `${runDir}/maildev.log`, pidFile, cwd: root });
  await waitFor(async () => (await fetch(`http://127.0.0.1:${webPort}/api/email`)).ok, { what: "maildev", timeoutMs: 30_000 });
}

export function ensureBuild(root, env, distDir) {
  if (buildIsFresh(root, distDir)) {
    step("Next.js: production build is up to date");
    return;
  }
  step("Next.js: building the app (next build)…");
  run(`${root}/node_modules/.bin/next`, ["build"], { env: { ...env, NEXT_DIST_DIR: distDir }, cwd: root });
}

export async function ensureNext(root, env, { port, runDir, distDir, name = "next" }) {
  const pidFile = `${runDir}/${name}.pid`;
  const pid = readPid(pidFile);
  const url = `http://127.0.0.1:${port}`;
  if (pid && pidAlive(pid)) {
    step(`Next.js: already running at ${url} (restart with npm stop && npm start to load a new build)`);
    return url;
  }
  step(`Next.js: starting on ${url}…`);
  startDetached(`${root}/node_modules/.bin/next`, ["start", "-H", "127.0.0.1", "-p", String(port)], {
    env: { ...env, NEXT_DIST_DIR: distDir }, logFile: `${runDir}/${name}.log`, pidFile, cwd: root,
  });
  await waitFor(async () => (await fetch(`${url}/api/health`)).ok, { what: `Next.js on ${url} (see ${runDir}/${name}.log)`, timeoutMs: 60_000 });
  return url;
}

export function hasFile(p) { return existsSync(p); }
