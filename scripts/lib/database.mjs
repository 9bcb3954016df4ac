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
}
