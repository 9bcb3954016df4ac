/**
 * Mail goes through the job queue (pg-boss in PostgreSQL) and the real job worker that
 * `node scripts/test.mjs` starts with SMTP_URL pointing at TEST_SMTP_PORT. The receiving
 * end is an smtp-server inside this test, taken down and brought back at will. The checks
 * are against things outside the queue code: what that SMTP server received, the
 * invitation row's token hash, and pg-boss's own job table.
 *
 * No timing is asserted: every wait is "until it happens", with a generous timeout.
 */
import { randomBytes } from "node:crypto";
import { afterAll, describe, expect, it } from "vitest";
import { QueryTypes } from "sequelize";
import { SEED, db } from "../support/integration";
import { SmtpCapture, attachmentContent, testSmtpPort, unfoldQuotedPrintable } from "../support/smtp-capture";
import { AppError } from "@/lib/errors/app-error";
import { hashToken, inviteMember } from "@/lib/members/server/invite-member";
import { enqueueMail } from "@/lib/jobs/mail/enqueue-mail";
import { MAX_INLINE_ATTACHMENT_BYTES } from "@/lib/jobs/mail/message";
import { transaction } from "@/lib/server/db";
import { Invitation } from "@/lib/server/models";

const LAB = SEED.labs.kestrel.id;
const ADMIN = SEED.users.admin.id;
const smtp = new SmtpCapture(testSmtpPort());
afterAll(() => smtp.stop());

interface JobRow {
  id: string;
  state: string;
  retry_count: number;
  output: { message?: string } | null;
  data: unknown;
}

async function mailJobsSince(since: string): Promise<JobRow[]> {
  return db().query<JobRow>(
    `SELECT id, state, retry_count, output, data FROM pgboss.job WHERE name = 'mail' AND created_on >= $since ORDER BY created_on`,
    { bind: { since }, type: QueryTypes.SELECT },
  );
}

async function job(id: string): Promise<JobRow> {
  const [row] = await db().query<JobRow>(`SELECT id, state, retry_count, output, data FROM pgboss.job WHERE name = 'mail' AND id = $id`, {
    bind: { id },
    type: QueryTypes.SELECT,
  });
  if (!row) throw new Error(`job ${id} is not in pgboss.job`);
  return row;
}

async function dbNow(): Promise<string> {
  const [row] = await db().query<{ now: string }>("SELECT now()::text AS now", { type: QueryTypes.SELECT });
  return row!.now;
}

const countMailJobs = async () => Number((await db().query<{ n: string }>(`SELECT count(*) AS n FROM pgboss.job WHERE name = 'mail'`, { type: QueryTypes.SELECT }))[0]!.n);
const uniqueEmail = (what: string) => `${what}.${randomBytes(4).toString("hex")}@kestrelbay.example`;

describe("mail through the job queue", () => {
  it("keeps an invitation mail while the SMTP server is down and delivers it when the server returns", async () => {
    await smtp.stop();
    const email = uniqueEmail("outage");
    const since = await dbNow();
    await inviteMember({ labId: LAB, actorUserId: ADMIN, appUrl: "http://127.0.0.1:3000", input: { email, role: "chemist" } });

    const [queued, ...others] = await mailJobsSince(since);
    expect(queued, "the invitation queued exactly one mail").toBeDefined();
    expect(others).toHaveLength(0);

    // The worker tries, finds nobody listening, and pg-boss schedules a retry.
    await expect.poll(async () => (await job(queued!.id)).state, { timeout: 60_000, interval: 250 }).toBe("retry");
    const failed = await job(queued!.id);
    expect(failed.output?.message ?? "", "the attempt failed on the connection").toMatch(/ECONNREFUSED|connect/i);
    expect(smtp.received.some((m) => m.to.includes(email))).toBe(false);

    await smtp.start();
    await expect.poll(() => smtp.to(email) !== undefined, { timeout: 90_000, interval: 250 }).toBe(true);
    await expect.poll(async () => (await job(queued!.id)).state, { timeout: 30_000, interval: 250 }).toBe("completed");
    expect((await job(queued!.id)).retry_count, "delivered by a retry, not the first attempt").toBeGreaterThanOrEqual(1);

    // The delivered link is the invitation's: its token hashes to the stored hash.
    const text = unfoldQuotedPrintable(smtp.to(email)!.raw);
    expect(text).toContain("Kestrel Bay Process Chemistry");
    const token = text.match(/http:\/\/127\.0\.0\.1:3000\/invite\/([A-Za-z0-9_-]+)/)?.[1];
    expect(token, "the message carries an invitation link").toBeTruthy();
    const invitation = await Invitation.findOne({ where: { labId: LAB, email } });
    expect(invitation?.tokenHash).toBe(hashToken(token!));
    // The job's stored data is sealed: neither the address nor the token is readable there.
    const stored = JSON.stringify(failed.data);
    expect(stored).not.toContain(email);
    expect(stored).not.toContain(token!);
    // Its own limit: the waits above (a retry, then delivery) add up past the suite's 30 s on a busy machine.
  }, 240_000);

  it("sends nothing for a flow that rolls back", async () => {
    await smtp.start();
    const before = await countMailJobs();
    const email = uniqueEmail("rolled-back");
    await expect(
      transaction(async (t) => {
        await enqueueMail({ to: email, subject: "Never sent", text: "This flow fails after queueing its mail." }, t);
        throw new Error("the flow fails after queueing");
      }),
    ).rejects.toThrow("the flow fails after queueing");
    // An invitation refused because the address is already a member queues nothing either.
    await expect(
      inviteMember({ labId: LAB, actorUserId: ADMIN, appUrl: "http://127.0.0.1:3000", input: { email: SEED.users.chemist.email, role: "viewer" } }),
    ).rejects.toMatchObject({ code: "conflict" });
    expect(await countMailJobs()).toBe(before);
  });

  it("delivers a small inline attachment byte for byte, and refuses one over the limit naming the field", async () => {
    await smtp.start();
    const email = uniqueEmail("attachment");
    const csv = "vial,temperature_degC\nA1,60\nA2,80\n";
    await enqueueMail({
      to: email,
      subject: "Run list",
      text: "The run list is attached.",
      attachments: [{ filename: "runs.csv", contentType: "text/csv", contentBase64: Buffer.from(csv).toString("base64") }],
    });
    await expect.poll(() => smtp.to(email) !== undefined, { timeout: 60_000, interval: 250 }).toBe(true);
    expect(attachmentContent(smtp.to(email)!.raw, "runs.csv")?.toString("utf8")).toBe(csv);

    const tooBig = Buffer.alloc(MAX_INLINE_ATTACHMENT_BYTES + 1, 7).toString("base64");
    const refused = await enqueueMail({ to: email, subject: "Too big", text: "x", attachments: [{ filename: "big.bin", contentType: "application/octet-stream", contentBase64: tooBig }] }).catch((e: unknown) => e);
    expect(refused).toBeInstanceOf(AppError);
    expect((refused as AppError).code).toBe("invalid_input");
    expect((refused as AppError).issues.map((i) => i.path)).toEqual([expect.stringMatching(/^attachments/)]);
  });
});
