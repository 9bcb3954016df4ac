import "server-only";
import nodemailer, { type Transporter } from "nodemailer";
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
    });
  }
  return globalForMail.tarelineMail;
}

export interface MailMessage {
  to: string;
  subject: string;
  text: string;
}

/** Sends one plain-text message through SMTP_URL (the local fake mail service in development). */
export async function sendMail(message: MailMessage): Promise<void> {
  await transporter().sendMail({ from: serverEnv().MAIL_FROM, ...message });
}
