// `npm stop`: stops what `npm start` started, by the processes it recorded (pid and start
// time, so a recycled pid is never signalled). Waits for a running `npm start` to finish.
import { step, fail } from "./lib/log.mjs";
import { acquireLock } from "./lib/lock.mjs";
import { stopRecorded } from "./lib/processes.mjs";
import { clusterPaths, stopCluster } from "./lib/postgres.mjs";

const root = new URL("..", import.meta.url).pathname.replace(/\/$/, "");
const runDir = `${root}/.run`;
try {
  await acquireLock(`${runDir}/start.lock`, "npm start or npm stop");
  step((await stopRecorded(`${runDir}/next.pid`)) ? "Next.js: stopped" : "Next.js: was not running");
  step((await stopRecorded(`${runDir}/worker.pid`, { graceMs: 35_000 })) ? "Job worker: stopped" : "Job worker: was not running");
  step((await stopRecorded(`${runDir}/maildev.pid`)) ? "Fake mail service: stopped" : "Fake mail service: was not running");
  const { data } = clusterPaths(root, "dev");
  step(stopCluster({ root, name: "dev" }) ? `PostgreSQL (dev): stopped (data kept in ${data})` : "PostgreSQL (dev): was not running");
} catch (error) {
  fail(error instanceof Error ? error.message : String(error));
}
