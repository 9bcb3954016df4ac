import "server-only";
import PgBoss from "pg-boss";
import { JOB_SCHEMA, jobConfig } from "@/lib/jobs/config";
import { ensureQueues } from "@/lib/jobs/queues";
import { serverEnv } from "@/lib/server/env";

/**
 * Installs the job queue — pg-boss's schema and every queue of lib/jobs/catalog.ts — as the
 * worker does on its start, and stops again: for a demo step that adds jobs (mail), since on
 * a fresh database the bootstrap runs the demo before it starts the worker. Nothing is run.
 */
export async function installJobQueue(): Promise<void> {
  const boss = new PgBoss({ connectionString: serverEnv().DATABASE_URL, schema: JOB_SCHEMA, application_name: "tareline-demo", max: 2, supervise: false, schedule: false });
  await boss.start();
  try {
    await ensureQueues(boss, jobConfig());
  } finally {
    await boss.stop({ graceful: false, wait: true });
  }
}
