import "server-only";
import type PgBoss from "pg-boss";
import { JOBS } from "./catalog";
import type { JobConfig } from "./config";

/**
 * Creates every queue of JOBS (lib/jobs/catalog.ts) with the retry settings of `config`, and
 * brings the settings of queues that existed up to date. The worker calls it on start; so
 * does the demo runner (lib/demo/run.ts) before a step that adds jobs, since on a fresh
 * database the bootstrap runs the demo before the worker has started.
 */
export async function ensureQueues(boss: PgBoss, config: JobConfig): Promise<void> {
  for (const job of JOBS) {
    const policy = { retryLimit: config.retryLimit, retryDelay: config.retryDelaySeconds, retryBackoff: true, expireInSeconds: job.expireInSeconds };
    await boss.createQueue(job.name, { name: job.name, ...policy });
    // A queue that existed keeps its old settings on createQueue; bring them up to date.
    await boss.updateQueue(job.name, { name: job.name, ...policy });
  }
}
