// Run a command, inheriting or capturing its output; throw with a clear message on failure.
import { spawnSync } from "node:child_process";

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

export const sleep = (ms) => new Promise((r) => setTimeout(r, ms));

/**
 * Waits until `probe()` resolves true or the timeout passes; gives up at once when
 * `stillRunning()` (the process being waited for is alive) says false.
 */
export async function waitFor(probe, { timeoutMs = 60_000, intervalMs = 250, what = "service", stillRunning = () => true } = {}) {
  const end = Date.now() + timeoutMs;
  while (Date.now() < end) {
    if (!stillRunning()) throw new Error(`${what} exited while starting.`);
    try { if (await probe()) return; } catch { /* not yet */ }
    await sleep(intervalMs);
  }
  throw new Error(`Timed out after ${timeoutMs / 1000}s waiting for ${what}.`);
}
