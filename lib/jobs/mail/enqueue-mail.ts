import "server-only";
import type { Transaction } from "sequelize";
import type { z } from "zod";
import { enqueue } from "../enqueue";
import type { MailMessageInput } from "./message";
import type { MAIL_RENDERERS, MailRendererName } from "./renderers";
import { sendMailJob } from "./send-mail-job";

/** A mail whose content the named renderer builds in the worker from `input`. */
export type RenderedMail = {
  [N in MailRendererName]: { to: string; render: N; input: z.input<(typeof MAIL_RENDERERS)[N]["input"]> };
}[MailRendererName];

/**
 * A mail to send: either the whole message (`to`, `subject`, `text`, optional `html`, small
 * `attachments` as base64), or `{ to, render, input }` for a message a registered renderer
 * builds in the worker (lib/jobs/mail/renderers.ts).
 */
export type OutgoingMail = MailMessageInput | RenderedMail;

/**
 * Queues `mail` in the caller's transaction `t` (or one of its own), so it is sent only if
 * the flow commits; the job worker delivers it, retrying with backoff while the SMTP server
 * is unreachable. Throws AppError invalid_input naming the field when the mail is not valid.
 * Returns the job's id.
 */
export function enqueueMail(mail: OutgoingMail, t?: Transaction): Promise<string> {
  return enqueue(sendMailJob, mail, t);
}
