// `npm stop`: stops what `npm start` started, by the process ids it recorded.
import { step } from "./lib/log.mjs";
import { stopPid } from "./lib/run.mjs";
import { stopCluster } from "./lib/postgres.mjs";

const root = new URL("..", import.meta.url).pathname.replace(/\/$/, "");
const runDir = `${root}/.run`;
step((await stopPid(`${runDir}/next.pid`)) ? "Next.js: stopped" : "Next.js: was not running");
step((await stopPid(`${runDir}/maildev.pid`)) ? "Fake mail service: stopped" : "Fake mail service: was not running");
step(stopCluster({ root, name: "dev" }) ? "PostgreSQL (dev): stopped" : "PostgreSQL (dev): was not running");
