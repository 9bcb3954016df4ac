import "server-only";
import { z } from "zod";
import { checkMailServer, deliverMail } from "@/lib/server/mail";
import { defineJob } from "../define-job";
import { mailMessageSchema, renderedContentSchema, type MailMessage } from "./message";
import type { MailRenderer } from "./renderer";
import { MAIL_RENDERERS, MAIL_RENDERER_NAMES } from "./renderers";

/** A mail whose content a registered renderer builds in the worker. */
export const renderedMailSchema = z
  .object({ to: z.email(), render: z.enum(MAIL_RENDERER_NAMES), input: z.unknown() })
  .superRefine((mail, ctx) => {
    const result = MAIL_RENDERERS[mail.render].input.safeParse(mail.input);
    if (!result.success) for (const issue of result.error.issues) ctx.addIssue({ code: "custom", message: issue.message, path: ["input", ...issue.path] });
  });

/** What the mail queue carries: a whole message, or a renderer's name and input. */
export const outgoingMailSchema = z.union([mailMessageSchema, renderedMailSchema]);

/** The message a queued mail stands for: rendered now when it names a renderer. */
async function messageOf(mail: z.output<typeof outgoingMailSchema>): Promise<MailMessage> {
  if (!("render" in mail)) return mail;
  // Rendering can be costly (PDF attachments): not while the SMTP server is down (the attempt fails as delivery would).
  await checkMailServer();
  // Each renderer parses its own input: seen through the common interface, any of them fits.
  const renderer: MailRenderer = MAIL_RENDERERS[mail.render];
  const content = renderedContentSchema.parse(await renderer.render(renderer.input.parse(mail.input)));
  return { ...content, to: mail.to };
}

/**
 * The mail queue: every e-mail Tareline sends goes through it (enqueueMail). Its data is
 * sealed (links in mail are secrets). A failed delivery — the SMTP server down or refusing —
 * fails the attempt and pg-boss retries it with exponential backoff.
 */
export const sendMailJob = defineJob({
  name: "mail",
  data: outgoingMailSchema,
  sealed: true,
  expireInSeconds: 300,
  async handle(mail) {
    await deliverMail(await messageOf(mail));
  },
});
