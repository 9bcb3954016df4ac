import type { z } from "zod";

/** What a handler learns about the job it runs. */
export interface JobContext {
  id: string;
  /** 0 on the first attempt, 1 on the first retry, … */
  retryCount: number;
  retryLimit: number;
}

/**
 * A kind of background job: its pg-boss queue, the schema of its data (checked when it is
 * enqueued, in the caller's transaction, and again in the worker), and the handler the
 * worker runs. A handler that throws fails the attempt; pg-boss retries it with
 * exponential backoff (lib/jobs/config.ts) until the retry limit.
 */
export interface JobDefinition<S extends z.ZodType = z.ZodType> {
  /** The queue name (letters, digits, `-`, `_`). */
  name: string;
  data: S;
  /**
   * Keep the data encrypted in the database (lib/jobs/seal.ts): for data that carries
   * secrets, such as the link in an invitation e-mail.
   */
  sealed: boolean;
  /** An attempt still running after this long counts as failed (and is retried). */
  expireInSeconds: number;
  handle(data: z.output<S>, job: JobContext): Promise<void>;
}

/** Declares a job; add it to JOBS in lib/jobs/catalog.ts so the worker serves its queue. */
export function defineJob<S extends z.ZodType>(definition: JobDefinition<S>): JobDefinition<S> {
  return definition;
}
