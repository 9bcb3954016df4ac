// The fake mail service, the job worker and the Next.js server: started in their own
// process groups, recorded (pid + start time, see processes.mjs) so later runs recognise
// them, and never started on a port something else already holds.
import { existsSync, mkdirSync, statSync, readFileSync } from "node:fs";
import { run, waitFor } from "./run.mjs";
import { step } from "./log.mjs";
import { buildIsFresh } from "./app-env.mjs";
import { liveRecordedProcess, startRecorded, stopRecorded, tail } from "./processes.mjs";
import { assertPortFree } from "./ports.mjs";

/** Stops a recorded service whose recorded settings differ from `wanted`; returns the live one otherwise. */
async function liveWith(pidFile, wanted, what) {
  const live = liveRecordedProcess(pidFile);
  if (!live) return null;
  const changed = Object.entries(wanted).filter(([k, v]) => live[k] !== v);
  if (!changed.length) return live;
  step(`${what}: running with ${changed.map(([k]) => `${k} ${live[k]}`).join(", ")}, wanted ${changed.map(([k, v]) => `${k} ${v}`).join(", ")}; restarting it…`);
  await stopRecorded(pidFile);
  return null;
}

export async function ensureMaildev(root, { smtpPort, webPort, runDir, command = "npm start" }) {
  const pidFile = `${runDir}/maildev.pid`;
  const inbox = `http://127.0.0.1:${webPort}/index.html`;
  const live = await liveWith(pidFile, { smtpPort, webPort }, "Fake mail service");
  if (live) {
    step(`Fake mail service: already running (pid ${live.pid}, SMTP 127.0.0.1:${smtpPort}, inbox ${inbox})`);
    return;
  }
  await assertPortFree(smtpPort, { what: "the fake mail service's SMTP", envVar: "TARELINE_SMTP_PORT", command });
  await assertPortFree(webPort, { what: "the fake mail service's inbox", envVar: "TARELINE_MAIL_WEB_PORT", command });
  mkdirSync(`${root}/.data/mail`, { recursive: true });
  step(`Fake mail service: starting maildev (SMTP 127.0.0.1:${smtpPort}, inbox ${inbox})…`);
  const pid = startRecorded(`${root}/node_modules/.bin/maildev`, [
    "--ip", "127.0.0.1", "--web-ip", "127.0.0.1", "-s", String(smtpPort), "-w", String(webPort),
    "--mail-directory", `${root}/.data/mail`,
  ], { env: process.env, logFile: `${runDir}/maildev.log`, pidFile, cwd: root, extra: { smtpPort, webPort } });
  await waitFor(async () => (await fetch(`http://127.0.0.1:${webPort}/api/email`)).ok, {
    what: `maildev (pid ${pid}, see ${runDir}/maildev.log)`, timeoutMs: 30_000, stillRunning: () => liveRecordedProcess(pidFile) !== null,
  });
  if (!liveRecordedProcess(pidFile)) throw new Error(`maildev exited while starting:\n${tail(`${runDir}/maildev.log`)}`);
}

export function ensureBuild(root, env, distDir) {
  if (buildIsFresh(root, distDir)) {
    step(`Next.js: production build in ${distDir} is up to date`);
    return;
  }
  step(`Next.js: building the app into ${distDir} (next build)…`);
  run(`${root}/node_modules/.bin/next`, ["build"], { env: { ...env, NEXT_DIST_DIR: distDir }, cwd: root });
}

export async function ensureNext(root, env, { port, runDir, distDir, name = "next", portVar = "PORT", command = "npm start" }) {
  const pidFile = `${runDir}/${name}.pid`;
  const url = `http://127.0.0.1:${port}`;
  const live = await liveWith(pidFile, { port, distDir }, "Next.js");
  if (live) {
    step(`Next.js: already running at ${url} (pid ${live.pid}; restart with npm stop && npm start to load a new build)`);
    return url;
  }
  await assertPortFree(port, { what: "the Tareline app (Next.js)", envVar: portVar, command });
  step(`Next.js: starting on ${url} (log ${runDir}/${name}.log)…`);
  startRecorded(`${root}/node_modules/.bin/next`, ["start", "-H", "127.0.0.1", "-p", String(port)], {
    env: { ...env, NEXT_DIST_DIR: distDir }, logFile: `${runDir}/${name}.log`, pidFile, cwd: root, extra: { port, distDir },
  });
  await waitFor(async () => (await fetch(`${url}/api/health`)).ok, {
    what: `Next.js on ${url} (see ${runDir}/${name}.log)`, timeoutMs: 90_000, stillRunning: () => liveRecordedProcess(pidFile) !== null,
  });
  if (!liveRecordedProcess(pidFile)) throw new Error(`Next.js exited while starting:\n${tail(`${runDir}/${name}.log`)}`);
  return url;
}

/** The line the worker prints once it serves its queues (lib/jobs/worker.ts). */
const WORKER_READY = "Job worker: ready";

/**
 * Starts the job worker (lib/jobs/worker.ts: pg-boss, delivers the mail queue) unless our
 * recorded one runs; waits until it says it is ready. `restart` replaces a running one
 * (npm test does, so the worker always has the run's settings).
 */
export async function ensureWorker(root, env, { runDir, name = "worker", restart = false }) {
  const pidFile = `${runDir}/${name}.pid`;
  const logFile = `${runDir}/${name}.log`;
  if (restart) await stopRecorded(pidFile);
  const live = liveRecordedProcess(pidFile);
  if (live) {
    step(`Job worker: already running (pid ${live.pid}, log ${logFile}; restart with npm stop && npm start to load new code)`);
    return;
  }
  step(`Job worker: starting lib/jobs/worker.ts (pg-boss; log ${logFile})…`);
  const offset = existsSync(logFile) ? statSync(logFile).size : 0;
  startRecorded(process.execPath, ["--conditions=react-server", "--import", "tsx", "lib/jobs/worker.ts"], { env, logFile, pidFile, cwd: root });
  // `offset` counts bytes (statSync) and the log holds multi-byte characters (—, …): slice the bytes, not the decoded text.
  const since = () => readFileSync(logFile).subarray(offset).toString("utf8");
  try {
    await waitFor(async () => since().includes(WORKER_READY), {
      what: `the job worker (see ${logFile})`, timeoutMs: 60_000, intervalMs: 200, stillRunning: () => liveRecordedProcess(pidFile) !== null,
    });
  } catch (error) {
    throw new Error(`${error instanceof Error ? error.message : error}\n${since().trimEnd().split("\n").slice(-20).join("\n")}`);
  }
  if (!liveRecordedProcess(pidFile)) throw new Error(`The job worker exited while starting:\n${tail(logFile)}`);
}

/**
 * Checks, before anything starts, every port a service will need that is not already held
 * by that same service of ours (`ours` true); throws naming the first port taken.
 */
export async function checkPortsFirst(items, command) {
  const needed = items.filter((i) => !i.ours);
  for (const i of needed) await assertPortFree(i.port, { what: i.what, envVar: i.envVar, command });
  if (needed.length) step(`Ports: ${needed.map((i) => `${i.port} (${i.what})`).join(", ")} free`);
}

/** Whether our recorded service runs with these recorded settings. */
export function runsWith(pidFile, wanted) {
  const live = liveRecordedProcess(pidFile);
  return live !== null && Object.entries(wanted).every(([k, v]) => live[k] === v);
}
