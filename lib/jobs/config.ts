import "server-only";
import { z } from "zod";

/** The PostgreSQL schema pg-boss keeps its tables in (it creates and upgrades it itself). */
export const JOB_SCHEMA = "pgboss";

/**
 * Settings of the job queue, from the environment (see .env.example). Retries use
 * pg-boss's exponential backoff: attempt n + 1 waits between d·2^(n−1) and d·2^n seconds
 * after attempt n fails (d = TARELINE_JOB_RETRY_DELAY_SECONDS), so the defaults keep a
 * message for 1.4 to 2.8 days of an unreachable mail server before giving up.
 */
const jobConfigSchema = z.object({
  TARELINE_JOB_RETRY_LIMIT: z.coerce.number().int().min(0).max(30).default(12),
  TARELINE_JOB_RETRY_DELAY_SECONDS: z.coerce.number().int().min(1).max(3600).default(30),
  TARELINE_JOB_POLL_SECONDS: z.coerce.number().min(0.5).max(60).default(2),
  TARELINE_WORKER_CONCURRENCY: z.coerce.number().int().min(1).max(20).default(2),
});

export interface JobConfig {
  retryLimit: number;
  retryDelaySeconds: number;
  pollSeconds: number;
  concurrency: number;
}

export function jobConfig(env: NodeJS.ProcessEnv = process.env): JobConfig {
  const parsed = jobConfigSchema.safeParse(env);
  if (!parsed.success) {
    const fields = parsed.error.issues.map((i) => `${i.path.join(".")}: ${i.message}`).join("; ");
    throw new Error(`Job queue configuration is not valid (${fields}). See .env.example.`);
  }
  const c = parsed.data;
  return { retryLimit: c.TARELINE_JOB_RETRY_LIMIT, retryDelaySeconds: c.TARELINE_JOB_RETRY_DELAY_SECONDS, pollSeconds: c.TARELINE_JOB_POLL_SECONDS, concurrency: c.TARELINE_WORKER_CONCURRENCY };
}
