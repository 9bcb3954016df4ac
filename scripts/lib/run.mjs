// Run a command, inheriting or capturing its output; throw with a clear message on failure.
import { spawnSync, spawn } from "node:child_process";
import { openSync, writeFileSync, readFileSync, existsSync, rmSync } from "node:fs";

export function run(cmd, args, { env, capture = false, allowFail = false, input, cwd } = {}) {
  const r = spawnSync(cmd, args, {
    env: env ?? process.env,
    cwd,
    input,
    encoding: "utf8",
    stdio: capture || input !== undefined ? ["pipe", "pipe", "pipe"] : "inherit",
  });
  if (r.error) {
    if (allowFail) return r;
    throw new Error(`${cmd} could not start: ${r.error.message}`);
  }
  if (r.status !== 0 && !allowFail) {
    const detail = capture ? `\n${r.stdout ?? ""}${r.stderr ?? ""}` : "";
    throw new Error(`${cmd} ${args.join(" ")} exited with ${r.status}${detail}`);
  }
  return r;
}

/** Starts a long-running process detached, logging to `logFile`, and records its pid in `pidFile`. */
export function startDetached(cmd, args, { env, logFile, pidFile, cwd }) {
  const out = openSync(logFile, "a");
  const child = spawn(cmd, args, { env, cwd, detached: true, stdio: ["ignore", out, out] });
  child.unref();
  writeFileSync(pidFile, String(child.pid));
  return child.pid;
}

export function pidAlive(pid) {
  try {
    process.kill(pid, 0);
    return true;
  } catch {
    return false;
  }
}

export function readPid(pidFile) {
  if (!existsSync(pidFile)) return null;
  const pid = Number(readFileSync(pidFile, "utf8").trim());
  return Number.isInteger(pid) && pid > 0 ? pid : null;
}

/** Stops a process (and its group) recorded in pidFile; returns true if one was running. */
export async function stopPid(pidFile) {
  const pid = readPid(pidFile);
  if (!pid) return false;
  let was = pidAlive(pid);
  if (was) {
    try { process.kill(-pid, "SIGTERM"); } catch { try { process.kill(pid, "SIGTERM"); } catch { /* gone */ } }
    for (let i = 0; i < 50 && pidAlive(pid); i++) await sleep(100);
    if (pidAlive(pid)) { try { process.kill(-pid, "SIGKILL"); } catch { /* gone */ } }
  }
  rmSync(pidFile, { force: true });
  return was;
}

export const sleep = (ms) => new Promise((r) => setTimeout(r, ms));

/** Waits until `probe()` resolves true or the timeout passes. */
export async function waitFor(probe, { timeoutMs = 60_000, intervalMs = 250, what = "service" } = {}) {
  const end = Date.now() + timeoutMs;
  while (Date.now() < end) {
    try { if (await probe()) return; } catch { /* not yet */ }
    await sleep(intervalMs);
  }
  throw new Error(`Timed out after ${timeoutMs / 1000}s waiting for ${what}.`);
}
