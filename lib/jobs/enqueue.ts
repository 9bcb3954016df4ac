import "server-only";
import PgBoss from "pg-boss";
import type { Transaction } from "sequelize";
import type { z } from "zod";
import { parseOrThrow } from "@/lib/errors/app-error";
import { inTransaction } from "@/lib/server/db";
import type { JobDefinition } from "./define-job";
import { JOB_SCHEMA } from "./config";
import { seal } from "./seal";
import { transactionDb } from "./transaction-db";

/**
 * The app's handle on the queue: it only adds jobs, always through the connection of a
 * transaction (transactionDb), so it has no pool or timers of its own and is never
 * started. The worker (lib/jobs/worker.ts) runs them.
 */
const globalForJobs = globalThis as unknown as { tarelineJobSender?: PgBoss };
function sender(): PgBoss {
  globalForJobs.tarelineJobSender ??= new PgBoss({
    schema: JOB_SCHEMA,
    db: {
      executeSql: () => Promise.reject(new Error("The job sender runs SQL only inside a transaction (lib/jobs/enqueue.ts).")),
    },
  });
  return globalForJobs.tarelineJobSender;
}

/** PostgreSQL's codes for a missing schema or table: pg-boss is not installed. */
const NOT_INSTALLED = new Set(["3F000", "42P01"]);

/**
 * Adds a `job` with `data` in the caller's transaction `t` (or in one of its own): the job
 * exists, and will run, only if that transaction commits. The data is checked with the
 * job's schema first (AppError invalid_input naming each field) and sealed when the job
 * says so. Returns the job's id.
 */
export async function enqueue<S extends z.ZodType>(job: JobDefinition<S>, data: z.input<S>, t?: Transaction): Promise<string> {
  const parsed = parseOrThrow(job.data, data);
  const payload = job.sealed ? seal(parsed) : parsed;
  return inTransaction(t, async (tx) => {
    let id: string | null;
    try {
      id = await sender().send(job.name, payload as object, { db: transactionDb(tx) });
    } catch (error) {
      if (NOT_INSTALLED.has((error as { code?: string }).code ?? "")) {
        throw new Error(`The job queue is not installed in this database: start the job worker once (it creates pg-boss's "${JOB_SCHEMA}" schema and its queues).`);
      }
      throw error;
    }
    // pg-boss adds a job only to a queue that exists; it answers null otherwise.
    if (!id) throw new Error(`The job queue "${job.name}" does not exist: start the job worker once (it creates the queues it serves).`);
    return id;
  });
}
