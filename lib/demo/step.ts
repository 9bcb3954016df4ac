import "server-only";
import type { Transaction } from "sequelize";
import type { DemoContext } from "./context";

/**
 * One step of the demo scenario (PRODUCT.md "Demo scenario"): a file `lib/demo/steps/NN-name.ts`
 * whose default export is `demoStep(title, run)`. The runner (lib/demo/run.ts) runs the steps
 * not yet applied to the database in the order of their file names, each in a transaction of
 * its own `t`, and records it in `demo_steps` in that transaction, so a step is applied once
 * and wholly or not at all. A step makes its records through the domain operations (passing
 * `t` as their last argument), never by raw inserts, so the demo stays consistent with what
 * the app itself would have written (audit log included).
 */
export interface DemoStep {
  title: string;
  run: (ctx: DemoContext, t: Transaction) => Promise<void>;
  /**
   * The step adds jobs (a submit for review mails the safety officers): the runner installs
   * the job queue first (lib/demo/job-queue.ts), since the worker starts after the demo.
   */
  jobQueue: boolean;
}

/** Defines a demo step (the default export of a step file). */
export function demoStep(title: string, run: DemoStep["run"], options: { jobQueue?: boolean } = {}): DemoStep {
  return { title, run, jobQueue: options.jobQueue ?? false };
}

/** A step file's name without `.ts`: two or more digits, a hyphen, lower-case words (`10-lab-equipment`). */
export const STEP_NAME = /^[0-9]{2,}-[a-z0-9-]+$/;
