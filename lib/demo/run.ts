import "server-only";
import { readdirSync } from "node:fs";
import { fileURLToPath, pathToFileURL } from "node:url";
import { db, transaction } from "@/lib/server/db";
import { DemoStep as DemoStepRecord } from "@/lib/server/models";
import { demoContext, findDemoLab } from "./context";
import { installJobQueue } from "./job-queue";
import { STEP_NAME, type DemoStep } from "./step";

/**
 * The demo's runner: applies the demo steps (lib/demo/steps/NN-name.ts) that this database
 * has not recorded yet, in the order of their names, each in its own transaction together
 * with its record in `demo_steps`. A step that fails rolls back alone and is not recorded;
 * the runner stops there (later steps may need it) and the next run tries it again. Steps
 * already recorded are never run again, so running the demo twice changes nothing.
 *
 * The bootstrap runs it after the seeders (scripts/lib/database.mjs):
 *
 *   node --import ./scripts/lib/server-only-hook.mjs --import tsx lib/demo/run.ts
 *
 * with DATABASE_URL and NEXTAUTH_SECRET set. Without the demo lab (no seeders) it does nothing.
 */

export interface NamedStep {
  name: string;
  step: DemoStep;
}

/** The step files of lib/demo/steps, in order of their names. */
export async function loadDemoSteps(dir: string = fileURLToPath(new URL("./steps/", import.meta.url))): Promise<NamedStep[]> {
  const files = readdirSync(dir)
    .filter((f) => f.endsWith(".ts") && !f.endsWith(".d.ts"))
    .sort();
  const steps: NamedStep[] = [];
  for (const file of files) {
    const name = file.slice(0, -3);
    if (!STEP_NAME.test(name)) throw new Error(`lib/demo/steps/${file}: a step file is named NN-name.ts (digits, a hyphen, lower-case words).`);
    const mod = (await import(pathToFileURL(`${dir}/${file}`).href)) as { default?: DemoStep };
    if (!mod.default || typeof mod.default.run !== "function") throw new Error(`lib/demo/steps/${file}: export default demoStep(title, run).`);
    steps.push({ name, step: mod.default });
  }
  return steps;
}

/** Advisory lock key of the demo runner: one runner applies steps at a time (two bootstraps on one database). */
const LOCK_KEY = 727_100_421;

export interface DemoRunResult {
  applied: string[];
  alreadyApplied: string[];
  /** True when the database has no demo lab (nothing was done). */
  noDemoLab: boolean;
}

/**
 * Applies the demo steps not yet recorded (module comment). `steps` defaults to the files
 * of lib/demo/steps; `log` receives one line per step.
 * @throws the error of the first step that fails (its transaction rolled back, not recorded).
 */
export async function runDemo(options: { steps?: NamedStep[]; log?: (line: string) => void } = {}): Promise<DemoRunResult> {
  const log = options.log ?? (() => {});
  const base = await findDemoLab();
  if (!base) return { applied: [], alreadyApplied: [], noDemoLab: true };
  const steps = options.steps ?? (await loadDemoSteps());
  const result: DemoRunResult = { applied: [], alreadyApplied: [], noDemoLab: false };
  const recorded = new Set((await DemoStepRecord.findAll({ attributes: ["name"] })).map((r) => r.name));
  if (steps.some((s) => s.step.jobQueue && !recorded.has(s.name))) await installJobQueue();
  for (const { name, step } of steps) {
    const done = await transaction(async (t) => {
      await db().query("SELECT pg_advisory_xact_lock(:key)", { replacements: { key: LOCK_KEY }, transaction: t });
      const records = await DemoStepRecord.findAll({ attributes: ["name", "records"], transaction: t });
      if (records.some((r) => r.name === name)) return false;
      const known = new Map<string, string>();
      for (const r of records) for (const [k, v] of Object.entries(r.records ?? {})) known.set(k, v);
      const own: Record<string, string> = {};
      await step.run(demoContext(base, known, own, (m) => log(`  ${name}: ${m}`)), t);
      await DemoStepRecord.create({ name, title: step.title, records: own }, { transaction: t });
      return true;
    });
    if (done) {
      result.applied.push(name);
      log(`${name} applied: ${step.title}`);
    } else result.alreadyApplied.push(name);
  }
  return result;
}

/** Run as a script: prints what it did; exit 1 with the failing step's error. */
async function main(): Promise<void> {
  const lines: string[] = [];
  try {
    const r = await runDemo({ log: (l) => lines.push(l) });
    for (const l of lines) console.log(l);
    if (r.noDemoLab) console.log("No demo lab in this database (the demo seeders did not run): nothing to do.");
    else console.log(r.applied.length ? `${r.applied.length} demo step(s) applied, ${r.alreadyApplied.length} already there.` : `All ${r.alreadyApplied.length} demo step(s) already applied.`);
  } catch (e) {
    for (const l of lines) console.log(l);
    const detail = e instanceof Error ? (e.stack ?? e.message) : String(e);
    const issues = (e as { issues?: Array<{ path: string; message: string }> }).issues;
    console.error(`A demo step failed (rolled back, not recorded; the next run tries it again):\n${detail}${issues?.length ? `\n${issues.map((i) => `  ${i.path}: ${i.message}`).join("\n")}` : ""}`);
    process.exitCode = 1;
  } finally {
    await db().close();
  }
}

if (process.argv[1] && import.meta.url === pathToFileURL(process.argv[1]).href) await main();
