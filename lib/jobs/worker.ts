/**
 * The job worker: a process of its own that serves every queue in JOBS (lib/jobs/catalog.ts)
 * with pg-boss. `npm start` and `npm test` start it (scripts/lib/services.mjs); by hand:
 *
 *   node --conditions=react-server --import tsx lib/jobs/worker.ts
 *
 * with DATABASE_URL, NEXTAUTH_SECRET, SMTP_URL and MAIL_FROM set (see .env.example). On
 * start it creates pg-boss's schema (or upgrades it) and the queues, applying the retry
 * settings of lib/jobs/config.ts, then prints "Job worker: ready". Any number of workers
 * may run against one database, on one machine or several: pg-boss hands each job to one
 * of them (SELECT … FOR UPDATE SKIP LOCKED). SIGTERM or SIGINT stops it after the jobs in
 * hand finish (at most 30 s).
 */
import PgBoss from "pg-boss";
import { serverEnv } from "@/lib/server/env";
import { JOBS } from "./catalog";
import { JOB_SCHEMA, jobConfig } from "./config";
import { ensureQueues } from "./queues";
import { runJob } from "./run-job";

const log = (message: string) => console.log(`${new Date().toISOString()} ${message}`);

async function main(): Promise<void> {
  const env = serverEnv();
  const config = jobConfig();
  const boss = new PgBoss({
    connectionString: env.DATABASE_URL,
    schema: JOB_SCHEMA,
    application_name: "tareline-worker",
    max: config.concurrency + 2,
    // Cron schedules are not used (yet): no clock-skew monitor or cron polling.
    schedule: false,
  });
  boss.on("error", (error) => log(`Job worker: pg-boss reported an error: ${error.message}`));
  await boss.start();

  await ensureQueues(boss, config);
  for (const job of JOBS) {
    for (let i = 0; i < config.concurrency; i++) {
      await boss.work<unknown>(job.name, { pollingIntervalSeconds: config.pollSeconds, batchSize: 1, includeMetadata: true }, async (batch) => {
        for (const j of batch) {
          const attempt = `${job.name} job ${j.id}, attempt ${j.retryCount + 1} of ${j.retryLimit + 1}`;
          try {
            await runJob(job, j.data, { id: j.id, retryCount: j.retryCount, retryLimit: j.retryLimit });
            log(`Job worker: ${attempt}: done`);
          } catch (error) {
            const reason = error instanceof Error ? error.message : String(error);
            log(
              j.retryCount < j.retryLimit
                ? `Job worker: ${attempt} failed (${reason}); pg-boss retries it with backoff`
                : `Job worker: ${attempt} failed (${reason}); no retries left; the job stays in ${JOB_SCHEMA}.job as failed (archived after 12 h)`,
            );
            throw error;
          }
        }
      });
    }
  }
  log(
    `Job worker: ready — serving ${JOBS.map((j) => j.name).join(", ")} (${config.concurrency} at a time per queue, polling every ${config.pollSeconds} s; ` +
      `up to ${config.retryLimit} retries, backoff from ${config.retryDelaySeconds} s)`,
  );

  let stopping = false;
  const stop = (signal: string) => {
    if (stopping) return;
    stopping = true;
    log(`Job worker: ${signal} received; finishing the jobs in hand…`);
    boss
      .stop({ graceful: true, timeout: 30_000, wait: true })
      .then(() => {
        log("Job worker: stopped");
        process.exit(0);
      })
      .catch((error: unknown) => {
        log(`Job worker: stopping failed: ${error instanceof Error ? error.message : String(error)}`);
        process.exit(1);
      });
  };
  process.on("SIGTERM", () => stop("SIGTERM"));
  process.on("SIGINT", () => stop("SIGINT"));
}

main().catch((error: unknown) => {
  log(`Job worker: could not start: ${error instanceof Error ? (error.stack ?? error.message) : String(error)}`);
  process.exit(1);
});
