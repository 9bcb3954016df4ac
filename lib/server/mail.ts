import "server-only";
import nodemailer, { type Transporter } from "nodemailer";
import type { MailMessage } from "@/lib/jobs/mail/message";
import { serverEnv } from "./env";

const globalForMail = globalThis as unknown as { tarelineMail?: Transporter };

function transporter(): Transporter {
  if (!globalForMail.tarelineMail) {
    const url = new URL(serverEnv().SMTP_URL);
    globalForMail.tarelineMail = nodemailer.createTransport({
      host: url.hostname,
      port: Number(url.port || 25),
      secure: url.protocol === "smtps:",
      ignoreTLS: url.protocol === "smtp:" && ["127.0.0.1", "localhost", "::1"].includes(url.hostname),
      auth: url.username ? { user: decodeURIComponent(url.username), pass: decodeURIComponent(url.password) } : undefined,
      connectionTimeout: 30_000,
      greetingTimeout: 30_000,
      socketTimeout: 60_000,
    });
  }
  return globalForMail.tarelineMail;
}

/**
 * Hands one message to SMTP_URL (the local fake mail service in development); throws when
 * the server is unreachable or refuses it. Only the mail job (lib/jobs/mail/send-mail-job.ts)
 * calls this: everything else queues mail with enqueueMail, so that it is retried.
 */
export async function deliverMail(message: MailMessage): Promise<void> {
  await transporter().sendMail({
    from: serverEnv().MAIL_FROM,
    to: message.to,
    subject: message.subject,
    text: message.text,
    html: message.html,
    attachments: message.attachments.map((a) => ({ filename: a.filename, contentType: a.contentType, content: Buffer.from(a.contentBase64, "base64") })),
  });
}

/**
 * Throws, as deliverMail would, when SMTP_URL does not answer (connects and greets, then
 * hangs up). The mail job asks before building a rendered message, so an outage costs no
 * rendering of attachments (a prep sheet PDF) on every retry.
 */
export async function checkMailServer(): Promise<void> {
  await transporter().verify();
}
