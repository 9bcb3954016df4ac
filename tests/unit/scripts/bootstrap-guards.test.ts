/**
 * The bootstrap's guards (scripts/lib/lock.mjs, processes.mjs, ports.mjs), exercised the way
 * the scripts use them: in separate Node processes, against real processes and sockets.
 * What is checked comes from the kernel, not from the scripts: whether a process still runs
 * (/proc/<pid>/stat), whether a port accepts a listener.
 */
import { spawn, type ChildProcess } from "node:child_process";
import { mkdirSync, mkdtempSync, readFileSync, readdirSync, realpathSync, rmSync, writeFileSync, existsSync } from "node:fs";
import { createServer, type Server } from "node:net";
import { tmpdir } from "node:os";
import { createHash } from "node:crypto";
import { join } from "node:path";
import { pathToFileURL } from "node:url";
import { afterAll, describe, expect, it } from "vitest";

const lib = (name: string) => pathToFileURL(join(process.cwd(), "scripts/lib", name)).href;
const dir = mkdtempSync(join(tmpdir(), "tareline-guards-"));
const children: ChildProcess[] = [];
afterAll(() => {
  for (const c of children) if (c.exitCode === null) c.kill("SIGKILL");
  rmSync(dir, { recursive: true, force: true });
});

/** Runs an ES module snippet in a fresh Node process; collects its output as it comes. */
function node(code: string) {
  const child = spawn(process.execPath, ["--input-type=module", "-e", code], { stdio: ["pipe", "pipe", "pipe"] });
  children.push(child);
  const out = { text: "" };
  child.stdout.on("data", (c: Buffer) => (out.text += c.toString()));
  child.stderr.on("data", (c: Buffer) => (out.text += c.toString()));
  const exited = new Promise<number | null>((resolve) => child.on("exit", (code) => resolve(code)));
  return { child, out, exited };
}

const alive = (pid: number) => {
  try {
    const state = readFileSync(`/proc/${pid}/stat`, "utf8").split(") ")[1]?.[0];
    return state !== undefined && state !== "Z";
  } catch {
    return false;
  }
};

function sleeper() {
  const child = spawn("sleep", ["300"], { stdio: "ignore" });
  children.push(child);
  return child;
}

describe("per-checkout lock", () => {
  it("makes a second run wait, saying so, until the first has finished", async () => {
    const lock = join(dir, "test.lock");
    const take = (who: string) =>
      node(`
        const { acquireLock } = await import(${JSON.stringify(lib("lock.mjs"))});
        await acquireLock(${JSON.stringify(lock)}, "npm test");
        console.log("${who} holds the lock");
        process.stdin.on("data", () => process.exit(0));
      `);
    const first = take("first");
    await expect.poll(() => first.out.text, { timeout: 20_000 }).toContain("first holds the lock");
    const second = take("second");
    await expect.poll(() => second.out.text, { timeout: 20_000 }).toContain(`another npm test is running in this checkout (pid ${first.child.pid})`);
    expect(second.out.text).not.toContain("second holds the lock");

    first.child.stdin!.write("done\n");
    expect(await first.exited).toBe(0);
    await expect.poll(() => second.out.text, { timeout: 20_000 }).toContain("second holds the lock");
    second.child.stdin!.write("done\n");
    expect(await second.exited).toBe(0);
    expect(existsSync(lock), "the lock is released on exit").toBe(false);
  });

  it("takes over a lock whose holder has ended", async () => {
    const lock = join(dir, "stale.lock");
    const gone = node(`
      const { processIdentity } = await import(${JSON.stringify(lib("processes.mjs"))});
      console.log(JSON.stringify({ ...processIdentity(process.pid), what: "npm test" }));
    `);
    expect(await gone.exited).toBe(0);
    writeFileSync(lock, gone.out.text);
    const next = node(`
      const { acquireLock } = await import(${JSON.stringify(lib("lock.mjs"))});
      await acquireLock(${JSON.stringify(lock)}, "npm test");
      console.log("holds the lock");
    `);
    expect(await next.exited).toBe(0);
    expect(next.out.text).toContain("was left by a run that has ended; taking it over");
    expect(next.out.text).toContain("holds the lock");
  });
});

describe("recorded processes", () => {
  it("never signals a pid that now belongs to another process, and stops the recorded one", async () => {
    const foreign = sleeper();
    const pidFile = join(dir, "next.pid");
    // A record whose pid is right but whose start time is not: what a recycled pid looks like.
    const record = node(`
      const { processIdentity } = await import(${JSON.stringify(lib("processes.mjs"))});
      const id = processIdentity(${foreign.pid});
      console.log(JSON.stringify({ ...id, startTicks: String(Number(id.startTicks) - 1) }));
    `);
    expect(await record.exited).toBe(0);
    writeFileSync(pidFile, record.out.text);
    const stopStale = node(`
      const { stopRecorded } = await import(${JSON.stringify(lib("processes.mjs"))});
      console.log("stopped:", await stopRecorded(${JSON.stringify(pidFile)}));
    `);
    expect(await stopStale.exited).toBe(0);
    expect(stopStale.out.text).toContain("stopped: false");
    expect(alive(foreign.pid!), "the foreign process was left alone").toBe(true);
    expect(existsSync(pidFile), "the stale record is dropped").toBe(false);

    const stopRight = node(`
      const { writePidRecord, stopRecorded } = await import(${JSON.stringify(lib("processes.mjs"))});
      writePidRecord(${JSON.stringify(pidFile)}, ${foreign.pid});
      console.log("stopped:", await stopRecorded(${JSON.stringify(pidFile)}));
    `);
    expect(await stopRight.exited).toBe(0);
    expect(stopRight.out.text).toContain("stopped: true");
    await expect.poll(() => alive(foreign.pid!), { timeout: 10_000 }).toBe(false);
  });
});

describe("port check", () => {
  it("refuses a port another program listens on, naming the port and the variable that moves it", async () => {
    const server: Server = createServer();
    await new Promise<void>((resolve) => server.listen(0, "127.0.0.1", () => resolve()));
    const port = (server.address() as { port: number }).port;
    const check = () =>
      node(`
        const { assertPortFree } = await import(${JSON.stringify(lib("ports.mjs"))});
        try { await assertPortFree(${port}, { what: "the Tareline app (Next.js)", envVar: "PORT" }); console.log("free"); }
        catch (e) { console.log(e.message); }
      `);
    const taken = check();
    await taken.exited;
    expect(taken.out.text).toContain(`Port ${port} on 127.0.0.1, wanted for the Tareline app (Next.js), is already in use by `);
    expect(taken.out.text, "ss names the process that holds it").toContain(`pid ${process.pid}`);
    expect(taken.out.text).toContain("PORT=<free port> npm start");
    await new Promise<void>((resolve) => server.close(() => resolve()));
    const free = check();
    await free.exited;
    expect(free.out.text.trim()).toBe("free");
  });
});

describe("cluster location", () => {
  /** clusterPaths(checkout, "dev").base, computed in a fresh process. */
  async function clusterBase(checkout: string): Promise<string> {
    const r = node(`
      const { clusterPaths } = await import(${JSON.stringify(lib("postgres.mjs"))});
      console.log(clusterPaths(${JSON.stringify(checkout)}, "dev").base);
    `);
    expect(await r.exited).toBe(0);
    return r.out.text.trim();
  }
  const checkout = (name: string) => {
    const d = join(dir, name);
    mkdirSync(d, { recursive: true });
    return realpathSync(d);
  };
  const record = (at: string, content: object) => {
    mkdirSync(join(at, ".data/dev"), { recursive: true });
    writeFileSync(join(at, ".data/dev/cluster.json"), JSON.stringify(content));
  };
  const isRoot = process.getuid?.() === 0;

  it("puts a new cluster where its server's user can reach it: outside the checkout as root, inside otherwise", async () => {
    const fresh = checkout("fresh");
    const hash = createHash("sha256").update(fresh).digest("hex").slice(0, 16);
    expect(await clusterBase(fresh)).toBe(isRoot ? `/var/lib/tareline/clusters/${hash}-dev` : `${fresh}/.data/dev`);
  });

  it("keeps a cluster of the earlier layout (.data/dev/pg) where it is", async () => {
    const legacy = checkout("legacy");
    mkdirSync(join(legacy, ".data/dev/pg"), { recursive: true });
    writeFileSync(join(legacy, ".data/dev/pg/PG_VERSION"), "15\n");
    expect(await clusterBase(legacy)).toBe(`${legacy}/.data/dev`);
  });

  it("follows a checkout that moved, and gives a copy whose original still exists a cluster of its own", async () => {
    const elsewhere = "/var/lib/tareline/clusters/0000000000000000-dev";
    const moved = checkout("moved");
    record(moved, { checkout: join(dir, "gone"), dir: elsewhere });
    expect(await clusterBase(moved)).toBe(elsewhere);

    const original = checkout("original");
    record(original, { checkout: original, dir: elsewhere });
    const copy = checkout("copy");
    record(copy, { checkout: original, dir: elsewhere });
    expect(await clusterBase(original)).toBe(elsewhere);
    expect(await clusterBase(copy)).not.toBe(elsewhere);
  });

  it("runs a cluster with the binaries of its PG_VERSION, and says what to install when they are missing", async () => {
    const binaries = (dataDir: string) =>
      node(`
        const { serverBinaries } = await import(${JSON.stringify(lib("postgres.mjs"))});
        try { console.log(serverBinaries(${JSON.stringify(dataDir)})); } catch (e) { console.log(e.message); }
      `);
    const installed = existsSync("/usr/lib/postgresql") ? readdirSync("/usr/lib/postgresql").filter((v) => existsSync(`/usr/lib/postgresql/${v}/bin/pg_ctl`)) : [];
    const data = join(dir, "pgdata");
    mkdirSync(data, { recursive: true });
    if (installed[0]) {
      writeFileSync(join(data, "PG_VERSION"), `${installed[0]}\n`);
      const ok = binaries(data);
      await ok.exited;
      expect(ok.out.text.trim()).toBe(`/usr/lib/postgresql/${installed[0]}/bin`);
    }
    writeFileSync(join(data, "PG_VERSION"), "99\n");
    const missing = binaries(data);
    await missing.exited;
    expect(missing.out.text).toContain("was made by PostgreSQL 99, but /usr/lib/postgresql/99/bin is missing");
    expect(missing.out.text).toContain("apt-get install -y postgresql-99");
  });
});
