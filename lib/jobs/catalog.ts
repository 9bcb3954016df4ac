import "server-only";
import type { JobDefinition } from "./define-job";
import { sendMailJob } from "./mail/send-mail-job";

/**
 * Every kind of job, by queue: the worker creates these queues and runs their handlers.
 * A feature that needs background work defines its job with defineJob and adds it here.
 */
export const JOBS: readonly JobDefinition[] = [sendMailJob];
