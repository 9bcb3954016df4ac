/**
 * `npm start` as root from a checkout the `postgres` system user cannot enter — a copy of
 * this checkout inside a fresh `mktemp -d` folder (mode 0700), as a clone in /root would
 * be. It runs the real bootstrap there on ports of its own: the cluster is created where
 * postgres can reach it, migrations and demo data are applied, the job worker, the fake
 * mail service and the app start and answer; a second run finds everything running; `npm
 * stop` stops it all. Then the copy and its cluster are removed.
 *
 * It is about root: as another user it is skipped with a message. The copy is the files git
 * tracks plus untracked files that are not ignored (what a clone of this work would hold),
 * node_modules hard-linked, and the browser build of the e2e suite when it is up to date
 * (otherwise the copy builds its own, which takes longer).
 */
import { execFile, execFileSync, spawnSync } from "node:child_process";
import { cpSync, existsSync, mkdirSync, mkdtempSync, readFileSync, rmSync, statSync } from "node:fs";
import { tmpdir } from "node:os";
import { dirname, join } from "node:path";
import { afterAll, beforeAll, describe, expect, it } from "vitest";
import pg from "pg";

const root = process.cwd();
const isRoot = process.getuid?.() === 0;
const CLUSTERS = "/var/lib/tareline/clusters";

if (!isRoot) {
  console.log(
    "[bootstrap] SKIPPED: this test checks `npm start` as root from a folder the postgres user cannot enter; " +
      "run `npm test` (or `node scripts/test.mjs bootstrap`) as root to run it.",
  );
}

function freePort(): Promise<number> {
  return import("node:net").then(
    ({ createServer }) =>
      new Promise((resolve, reject) => {
        const srv = createServer();
        srv.once("error", reject);
        srv.listen(0, "127.0.0.1", () => {
          const { port } = srv.address() as { port: number };
          srv.close(() => resolve(port));
        });
      }),
  );
}

function buildIsFresh(distDir: string): boolean {
  const id = join(root, distDir, "BUILD_ID");
  if (!existsSync(id)) return false;
  const files = execFileSync("git", ["ls-files", "-co", "--exclude-standard", "-z", "app", "components", "lib", "inventory", "models", "public"], { cwd: root, encoding: "utf8" })
    .split("\0")
    .filter(Boolean);
  const newest = Math.max(...files.filter((f) => existsSync(join(root, f))).map((f) => statSync(join(root, f)).mtimeMs));
  return statSync(id).mtimeMs >= newest;
}

describe.skipIf(!isRoot)("npm start as root from a 0700 folder", () => {
  let parent = "";
  let clone = "";
  let env: NodeJS.ProcessEnv = { NODE_ENV: "production" };
  const ports = { app: 0, pg: 0, smtp: 0, web: 0 };

  const script = (name: "start" | "stop") =>
    new Promise<{ code: number; output: string }>((resolve) => {
      execFile(process.execPath, [`scripts/${name}.mjs`], { cwd: clone, env, maxBuffer: 32 * 1024 * 1024 }, (error, stdout, stderr) => {
        const output = `${stdout}${stderr}`;
        resolve({ code: error ? Number((error as { code?: number }).code ?? 1) : 0, output });
      });
    });
  const clusterDir = () => (JSON.parse(readFileSync(join(clone, ".data/dev/cluster.json"), "utf8")) as { dir: string }).dir;

  beforeAll(async () => {
    parent = mkdtempSync(join(tmpdir(), "tareline-bootstrap-"));
    clone = join(parent, "tareline");
    console.log(`[bootstrap] copying the checkout into ${clone}`);
    const files = execFileSync("git", ["ls-files", "-co", "--exclude-standard", "-z"], { cwd: root, encoding: "utf8" }).split("\0").filter(Boolean);
    for (const f of files) {
      if (!existsSync(join(root, f))) continue; // deleted but not yet committed
      mkdirSync(dirname(join(clone, f)), { recursive: true });
      cpSync(join(root, f), join(clone, f), { preserveTimestamps: true });
    }
    execFileSync("cp", ["-al", join(root, "node_modules"), join(clone, "node_modules")]);
    const distDir = buildIsFresh(".next-test") ? ".next-test" : null;
    if (distDir) {
      cpSync(join(root, distDir), join(clone, distDir), { recursive: true, preserveTimestamps: true, filter: (src) => !src.startsWith(join(root, distDir, "cache")) });
    } else {
      console.log("[bootstrap] no up-to-date .next-test build to copy: the copy builds its own (slower)");
    }
    ports.app = await freePort();
    ports.pg = await freePort();
    ports.smtp = Number(process.env.TARELINE_SMTP_PORT ?? (await freePort()));
    ports.web = Number(process.env.TARELINE_MAIL_WEB_PORT ?? (await freePort()));
    env = {
      // Only what a person's shell would have, plus the ports: nothing of this test run's setup.
      NODE_ENV: "production",
      PATH: process.env.PATH,
      HOME: process.env.HOME,
      LANG: process.env.LANG ?? "C.UTF-8",
      PORT: String(ports.app),
      TARELINE_PGPORT: String(ports.pg),
      TARELINE_SMTP_PORT: String(ports.smtp),
      TARELINE_MAIL_WEB_PORT: String(ports.web),
      ...(distDir ? { NEXT_DIST_DIR: distDir } : {}),
    };
  }, 180_000);

  afterAll(async () => {
    if (!clone || !existsSync(clone)) return;
    const stop = await script("stop");
    if (stop.code !== 0) console.log(stop.output);
    const recorded = existsSync(join(clone, ".data/dev/cluster.json")) ? clusterDir() : null;
    // Only a cluster folder this test's copy made, under the clusters folder, is removed.
    if (recorded && recorded.startsWith(`${CLUSTERS}/`) && !existsSync(join(recorded, "pg/postmaster.pid"))) rmSync(recorded, { recursive: true, force: true });
    rmSync(parent, { recursive: true, force: true });
  }, 120_000);

  it("is a folder the postgres user cannot enter", () => {
    expect((statSync(parent).mode & 0o777).toString(8)).toBe("700");
    const r = spawnSync("runuser", ["-u", "postgres", "--", "test", "-x", parent]);
    expect(r.status, "postgres is refused entry").not.toBe(0);
  });

  it("sets up and starts everything there", async () => {
    const { code, output } = await script("start");
    if (code !== 0) console.log(output);
    expect(code).toBe(0);
    expect(output).toContain(`PostgreSQL (dev): creating a cluster in ${CLUSTERS}/`);
    expect(output).toMatch(/Database: \d+ migration\(s\) applied/);
    expect(output).toMatch(/Database: \d+ seeder\(s\) applied/);
    expect(output).toContain("Tareline is running.");

    const dir = clusterDir();
    expect(dir.startsWith(`${CLUSTERS}/`)).toBe(true);
    const owner = execFileSync("stat", ["-c", "%U", join(dir, "pg")], { encoding: "utf8" }).trim();
    expect(owner).toBe("postgres");
    expect(readFileSync(join(dir, "pg/PG_VERSION"), "utf8").trim()).toMatch(/^\d+$/);

    const health = await fetch(`http://127.0.0.1:${ports.app}/api/health`);
    expect(health.status).toBe(200);
    expect(await health.json()).toEqual({ ok: true });
    expect((await fetch(`http://127.0.0.1:${ports.web}/api/email`)).status, "the fake mail inbox answers").toBe(200);

    // The demo data and the job queue are in the copy's own database.
    const url = readFileSync(join(clone, ".env.local"), "utf8").match(/^DATABASE_URL=(.+)$/m)?.[1];
    expect(url).toContain(`127.0.0.1:${ports.pg}/tareline_dev`);
    const client = new pg.Client({ connectionString: url });
    await client.connect();
    try {
      const labs = await client.query<{ name: string }>("SELECT name FROM labs ORDER BY name");
      expect(labs.rows.map((r) => r.name)).toEqual(["Harrow Fen Analytical", "Kestrel Bay Process Chemistry"]);
      const queues = await client.query<{ name: string }>("SELECT name FROM pgboss.queue");
      expect(queues.rows.map((r) => r.name)).toContain("mail");
    } finally {
      await client.end();
    }
    expect(readFileSync(join(clone, ".run/worker.log"), "utf8")).toContain("Job worker: ready");
  }, 300_000);

  it("finds everything running on a second run", async () => {
    const { code, output } = await script("start");
    if (code !== 0) console.log(output);
    expect(code).toBe(0);
    expect(output).not.toContain("creating a cluster");
    expect(output).toContain(`PostgreSQL (dev): already running on 127.0.0.1:${ports.pg}`);
    expect(output).toContain("Fake mail service: already running");
    expect(output).toContain("Job worker: already running");
    expect(output).toContain(`Next.js: already running at http://127.0.0.1:${ports.app}`);
  }, 120_000);

  it("stops everything with npm stop", async () => {
    const { code, output } = await script("stop");
    expect(code).toBe(0);
    for (const line of ["Next.js: stopped", "Job worker: stopped", "Fake mail service: stopped", "PostgreSQL (dev): stopped"]) expect(output).toContain(line);
    await expect(fetch(`http://127.0.0.1:${ports.app}/api/health`)).rejects.toThrow();
    expect(existsSync(join(clusterDir(), "pg/postmaster.pid")), "the server is down").toBe(false);
  }, 120_000);
});
