import type { z } from "zod";
import type { MailContentInput } from "./message";

/**
 * A message produced in the worker rather than carried by the job: the job holds the
 * renderer's (small) input, and the worker builds the content — reading the database or
 * rendering a PDF attachment if it must — just before sending. A renderer that throws
 * fails the attempt, which is retried like a failed delivery.
 */
export interface MailRenderer<S extends z.ZodType = z.ZodType> {
  input: S;
  render(input: z.output<S>): Promise<MailContentInput>;
}

/** Declares a renderer; register it under a name in MAIL_RENDERERS (lib/jobs/mail/renderers.ts). */
export function defineMailRenderer<S extends z.ZodType>(renderer: MailRenderer<S>): MailRenderer<S> {
  return renderer;
}
