// Checks that a port is free before the bootstrap starts a service on it, so that a
// program someone else runs there is never mistaken for ours.
import { createServer } from "node:net";
import { spawnSync } from "node:child_process";

/** Resolves true when nothing listens on host:port (we could bind it), false otherwise. */
export function portIsFree(port, host = "127.0.0.1") {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.once("error", (error) => (error.code === "EADDRINUSE" || error.code === "EACCES" ? resolve(false) : reject(error)));
    srv.listen({ port, host, exclusive: true }, () => srv.close(() => resolve(true)));
  });
}

/** A free port chosen by the kernel. */
export function freePort(host = "127.0.0.1") {
  return new Promise((resolve, reject) => {
    const srv = createServer();
    srv.once("error", reject);
    srv.listen(0, host, () => {
      const { port } = srv.address();
      srv.close(() => resolve(port));
    });
  });
}

/** Who listens on a TCP port, as `ss` reports it ("node, pid 123"), or null when unknown. */
export function portHolder(port) {
  const r = spawnSync("ss", ["-Hltnp", `sport = :${port}`], { encoding: "utf8" });
  if (r.status !== 0 || !r.stdout) return null;
  const users = [...r.stdout.matchAll(/\("([^"]+)",pid=(\d+)/g)].map((m) => `${m[1]}, pid ${m[2]}`);
  return users.length ? [...new Set(users)].join("; ") : null;
}

/**
 * Throws a clear error when `port` is taken. `what` names the service, `envVar` the
 * variable that chooses another port.
 */
export async function assertPortFree(port, { what, envVar, command = "npm start" }) {
  if (await portIsFree(port)) return;
  const holder = portHolder(port);
  throw new Error(
    `Port ${port} on 127.0.0.1, wanted for ${what}, is already in use${holder ? ` by ${holder}` : " by another program"}. ` +
      `It was not started by this checkout's bootstrap, so it is left alone. ` +
      `Stop that program, or choose another port: ${envVar}=<free port> ${command}`,
  );
}
