// Migrations and seeders through sequelize-cli (config in config/database.cjs).
import { run } from "./run.mjs";
import { step } from "./log.mjs";

export function migrate(root, env) {
  step("Database: running migrations…");
  const r = run(`${root}/node_modules/.bin/sequelize-cli`, ["db:migrate"], { env, capture: true, cwd: root });
  const applied = (r.stdout.match(/migrated/g) ?? []).length;
  step(applied ? `Database: ${applied} migration(s) applied` : "Database: schema up to date");
}

export function seed(root, env) {
  step("Database: loading demo data (seeders run once each)…");
  const r = run(`${root}/node_modules/.bin/sequelize-cli`, ["db:seed:all"], { env, capture: true, cwd: root });
  const applied = (r.stdout.match(/migrated/g) ?? []).length;
  step(applied ? `Database: ${applied} seeder(s) applied` : "Database: demo data already loaded");
  demo(root, env);
}

// The demo's studies and plans, made through the domain operations (lib/demo/run.ts): each
// step of lib/demo/steps once, recorded in demo_steps. Node runs it with a hook that maps
// `server-only` to an empty module (scripts/lib/server-only-hook.mjs).
export function demo(root, env) {
  step("Demo: applying the demo steps not yet recorded (lib/demo/steps)…");
  const r = run(process.execPath, ["--import", `${root}/scripts/lib/server-only-hook.mjs`, "--import", "tsx", `${root}/lib/demo/run.ts`], { env, capture: true, cwd: root });
  for (const line of r.stdout.split("\n").filter((l) => l.trim())) step(`Demo: ${line}`);
}
