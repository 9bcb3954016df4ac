// Long-running processes started by the bootstrap, recorded so they can be found and
// stopped again — and only they. A record holds the pid together with the boot id and the
// process's start time (field 22 of /proc/<pid>/stat, in clock ticks since boot); a pid
// whose start time differs was recycled by the kernel for another program and is never
// signalled. (The command line is recorded for messages only: Next.js renames its process
// to "next-server", so it cannot identify it.)
import { spawn } from "node:child_process";
import { existsSync, openSync, readFileSync, readlinkSync, rmSync, writeFileSync, closeSync } from "node:fs";
import { sleep } from "./run.mjs";

/** What the kernel says about a running pid, or null when there is no such process. */
export function processIdentity(pid) {
  try {
    const stat = readFileSync(`/proc/${pid}/stat`, "utf8");
    // The command name (field 2) is in parentheses and may hold spaces: split after it.
    const fields = stat.slice(stat.lastIndexOf(")") + 2).split(" ");
    const state = fields[0];
    if (state === "Z" || state === "X") return null; // a zombie is gone, only not yet reaped
    const startTicks = fields[19];
    const cmdline = readFileSync(`/proc/${pid}/cmdline`, "utf8").split("\0").filter(Boolean).join(" ");
    return { pid, bootId: bootId(), startTicks, cmdline };
  } catch {
    return null;
  }
}

function bootId() {
  try {
    return readFileSync("/proc/sys/kernel/random/boot_id", "utf8").trim();
  } catch {
    return "unknown";
  }
}

export const sameProcess = (a, b) => a !== null && b !== null && a.pid === b.pid && a.bootId === b.bootId && a.startTicks === b.startTicks;

/** The working folder of a process (readable for our own processes and as root), or null. */
export function processCwd(pid) {
  try {
    return readlinkSync(`/proc/${pid}/cwd`);
  } catch {
    return null;
  }
}

/** Records a running process in `file`, with `extra` facts (its port, say) for later runs. */
export function writePidRecord(file, pid, extra = {}) {
  const id = processIdentity(pid);
  if (!id) throw new Error(`process ${pid} ended right after it was started (see its log)`);
  writeFileSync(file, JSON.stringify({ ...extra, ...id }) + "\n");
  return id;
}

/** The recorded process, as long as it still runs; null otherwise (a stale record is removed). */
export function liveRecordedProcess(file) {
  if (!existsSync(file)) return null;
  let record;
  try {
    record = JSON.parse(readFileSync(file, "utf8"));
  } catch {
    record = null; // an older plain-pid file: it cannot be verified, so it is not trusted
  }
  const id = record && Number.isInteger(record.pid) ? processIdentity(record.pid) : null;
  if (id && sameProcess(id, record)) return { ...record, ...id };
  rmSync(file, { force: true });
  return null;
}

/**
 * Starts a long-running process in its own process group, appending its output to
 * `logFile`, and records it in `pidFile`.
 */
export function startRecorded(cmd, args, { env, logFile, pidFile, cwd, extra }) {
  const out = openSync(logFile, "a");
  const child = spawn(cmd, args, { env, cwd, detached: true, stdio: ["ignore", out, out] });
  closeSync(out);
  child.unref();
  writePidRecord(pidFile, child.pid, extra);
  return child.pid;
}

/**
 * Stops the process recorded in pidFile (SIGTERM to its process group, SIGKILL after
 * `graceMs`), after checking it is still the process that was recorded. Returns true when
 * one was running.
 */
export async function stopRecorded(pidFile, { graceMs = 10_000 } = {}) {
  const id = liveRecordedProcess(pidFile);
  if (!id) return false;
  const same = () => sameProcess(processIdentity(id.pid), id);
  const signal = (sig) => {
    try { process.kill(-id.pid, sig); } catch { try { process.kill(id.pid, sig); } catch { /* gone */ } }
  };
  signal("SIGTERM");
  for (let waited = 0; waited < graceMs && same(); waited += 100) await sleep(100);
  if (same()) signal("SIGKILL");
  for (let waited = 0; waited < 5_000 && same(); waited += 100) await sleep(100);
  rmSync(pidFile, { force: true });
  return true;
}

/** The last lines of a log file, for error messages. */
export function tail(file, lines = 20) {
  if (!existsSync(file)) return "";
  return readFileSync(file, "utf8").trimEnd().split("\n").slice(-lines).join("\n");
}
