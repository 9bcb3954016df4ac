// One `npm start` (or `npm stop`) and one `npm test` at a time per checkout: a lock file
// created atomically (O_EXCL) holding the owner's recorded identity. A second run waits
// and says who it waits for; a lock left by a process that has ended is taken over.
import { linkSync, mkdirSync, readFileSync, renameSync, rmSync, writeFileSync } from "node:fs";
import { dirname } from "node:path";
import { processIdentity, sameProcess } from "./processes.mjs";
import { sleep } from "./run.mjs";
import { step } from "./log.mjs";

function readHolder(file) {
  try {
    return JSON.parse(readFileSync(file, "utf8"));
  } catch (error) {
    if (error.code === "ENOENT") return undefined;
    return null; // half-written or foreign content: treated as stale
  }
}

function holderIsAlive(holder) {
  return holder !== null && holder !== undefined && sameProcess(processIdentity(holder.pid), holder);
}

/** Removes a stale lock, unless someone replaced it meanwhile (then it is put back). */
function removeStale(file, stale) {
  const aside = `${file}.${process.pid}.stale`;
  try {
    renameSync(file, aside);
  } catch {
    return; // already gone
  }
  const moved = readHolder(aside);
  if (JSON.stringify(moved) !== JSON.stringify(stale)) {
    try { linkSync(aside, file); } catch { /* someone holds it now; theirs wins */ }
  }
  rmSync(aside, { force: true });
}

/**
 * Takes the lock `file` for `what` ("npm test"), waiting for a live holder up to
 * `timeoutMs`. The lock is released when this process exits.
 */
export async function acquireLock(file, what, { timeoutMs = Number(process.env.TARELINE_LOCK_TIMEOUT_SECONDS ?? 1800) * 1000 } = {}) {
  mkdirSync(dirname(file), { recursive: true });
  const me = processIdentity(process.pid);
  const mine = JSON.stringify({ ...me, what }) + "\n";
  const start = Date.now();
  let told = 0;
  for (;;) {
    try {
      writeFileSync(file, mine, { flag: "wx" });
      break;
    } catch (error) {
      if (error.code !== "EEXIST") throw error;
    }
    const holder = readHolder(file);
    if (holder === undefined) continue;
    if (!holderIsAlive(holder)) {
      step(`Lock: ${file} was left by a run that has ended; taking it over`);
      removeStale(file, holder);
      continue;
    }
    const waited = Date.now() - start;
    if (waited > timeoutMs) {
      throw new Error(`Another ${holder.what ?? what} (pid ${holder.pid}) is still running in this checkout after ${Math.round(waited / 1000)} s. Wait for it to finish, or stop it, then run again.`);
    }
    if (Date.now() - told >= 30_000) {
      step(`Lock: another ${holder.what ?? what} is running in this checkout (pid ${holder.pid}); waiting for it to finish (Ctrl-C to give up)…`);
      told = Date.now();
    }
    await sleep(500);
  }
  const release = () => {
    const holder = readHolder(file);
    if (holder && holder.pid === process.pid && holder.startTicks === me.startTicks) rmSync(file, { force: true });
  };
  // On a normal exit the lock goes; after Ctrl-C or a crash it stays, and the next run
  // sees that its holder has ended and takes it over.
  process.once("exit", release);
  return release;
}
