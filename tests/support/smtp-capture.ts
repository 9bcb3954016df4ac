/**
 * An SMTP server inside the test (smtp-server, the receiving side of the protocol, not
 * Tareline code) on a fixed port, so that a test can take it down and bring it back while
 * the job worker keeps trying to deliver to that port.
 */
import { SMTPServer } from "smtp-server";

export interface CapturedMail {
  to: string[];
  raw: string;
}

export class SmtpCapture {
  readonly received: CapturedMail[] = [];
  private server: SMTPServer | null = null;

  constructor(readonly port: number) {}

  async start(): Promise<void> {
    if (this.server) return;
    const server = new SMTPServer({
      authOptional: true,
      disabledCommands: ["STARTTLS"],
      logger: false,
      onData: (stream, session, callback) => {
        const chunks: Buffer[] = [];
        stream.on("data", (c: Buffer) => chunks.push(c));
        stream.on("end", () => {
          this.received.push({ to: session.envelope.rcptTo.map((r) => r.address), raw: Buffer.concat(chunks).toString("utf8") });
          callback();
        });
      },
    });
    await new Promise<void>((resolve, reject) => {
      server.once("error", reject);
      server.listen(this.port, "127.0.0.1", () => resolve());
    });
    this.server = server;
  }

  async stop(): Promise<void> {
    const server = this.server;
    this.server = null;
    if (server) await new Promise<void>((resolve) => server.close(() => resolve()));
  }

  /** The first message delivered to `address`, if any. */
  to(address: string): CapturedMail | undefined {
    return this.received.find((m) => m.to.includes(address));
  }
}

/** The test SMTP port `scripts/test.mjs` gave the job worker (its SMTP_URL). */
export function testSmtpPort(): number {
  const port = Number(process.env.TEST_SMTP_PORT);
  if (!Number.isInteger(port) || port <= 0) {
    throw new Error("TEST_SMTP_PORT is not set: run this test through `node scripts/test.mjs integration` (it starts the job worker with a matching SMTP_URL).");
  }
  return port;
}

/** Undoes quoted-printable soft line breaks and escapes (RFC 2045 §6.7) in a message's text. */
export function unfoldQuotedPrintable(raw: string): string {
  return raw.replace(/=\r?\n/g, "").replace(/=([0-9A-F]{2})/g, (_, hex: string) => String.fromCharCode(parseInt(hex, 16)));
}

/**
 * The decoded content of the MIME part whose Content-Disposition names `filename`
 * (base64 transfer encoding, RFC 2045 §6.8), or null.
 */
export function attachmentContent(raw: string, filename: string): Buffer | null {
  const parts = raw.split(/\r?\n--[^\r\n]+\r?\n/);
  for (const part of parts) {
    const [head, ...body] = part.split(/\r?\n\r?\n/);
    if (!head || !new RegExp(`filename="?${filename.replace(/[.*+?^${}()|[\]\\]/g, "\\$&")}"?`).test(head)) continue;
    if (!/Content-Transfer-Encoding:\s*base64/i.test(head)) return null;
    return Buffer.from(body.join("\n").split(/\r?\n--/)[0]!.replace(/\s+/g, ""), "base64");
  }
  return null;
}
