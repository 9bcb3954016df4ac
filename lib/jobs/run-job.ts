import "server-only";
import type { JobContext, JobDefinition } from "./define-job";
import { sealedSchema, unseal } from "./seal";

/** Runs one job as the worker does: unseals its stored data if sealed, checks it, handles it. */
export async function runJob(job: JobDefinition, stored: unknown, context: JobContext): Promise<void> {
  const raw = job.sealed ? unseal(sealedSchema.parse(stored)) : stored;
  await job.handle(job.data.parse(raw), context);
}
