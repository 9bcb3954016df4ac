/**
 * What a job carries: the mail schema (checked when a mail is queued, naming the field),
 * and sealed data (AES-256-GCM, an authenticated cipher: NIST SP 800-38D §5.2 — altered
 * ciphertext must be refused, not decrypted to something else).
 */
import { describe, expect, it } from "vitest";
import { z } from "zod";

process.env.DATABASE_URL ??= "postgres://unused@127.0.0.1:1/unused";
process.env.NEXTAUTH_SECRET ??= "unit-tests-secret-0123456789abcdef";

const { seal, unseal } = await import("@/lib/jobs/seal");
const { runJob } = await import("@/lib/jobs/run-job");
const { defineJob } = await import("@/lib/jobs/define-job");
const { outgoingMailSchema } = await import("@/lib/jobs/mail/send-mail-job");
const { MAIL_RENDERERS } = await import("@/lib/jobs/mail/renderers");

describe("sealed job data", () => {
  it("round-trips, hides the plain text, and refuses altered ciphertext", () => {
    const secret = { to: "someone@kestrelbay.example", link: "http://127.0.0.1:3000/invite/abc123" };
    const sealed = seal(secret);
    expect(sealed.sealed).not.toContain("kestrelbay");
    expect(sealed.sealed).not.toContain("abc123");
    expect(unseal(sealed)).toEqual(secret);
    expect(seal(secret).sealed, "a fresh nonce each time").not.toBe(sealed.sealed);

    const parts = sealed.sealed.split(".");
    const body = Buffer.from(parts[3]!, "base64url");
    body[0] = body[0]! ^ 1;
    const altered = { sealed: [parts[0], parts[1], parts[2], body.toString("base64url")].join(".") };
    expect(() => unseal(altered)).toThrow(/cannot be decrypted/);
  });

  it("runs a sealed job's handler with its checked data", async () => {
    const seen: unknown[] = [];
    const job = defineJob({
      name: "unit-test",
      data: z.object({ n: z.number().int() }),
      sealed: true,
      expireInSeconds: 60,
      async handle(data) {
        seen.push(data);
      },
    });
    await runJob(job, seal({ n: 3 }), { id: "j1", retryCount: 0, retryLimit: 0 });
    expect(seen).toEqual([{ n: 3 }]);
    await expect(runJob(job, seal({ n: "three" }), { id: "j2", retryCount: 0, retryLimit: 0 })).rejects.toThrow();
    await expect(runJob(job, { n: 3 }, { id: "j3", retryCount: 0, retryLimit: 0 }), "unsealed data for a sealed job").rejects.toThrow();
  });
});

describe("queued mail", () => {
  it("names the field of a renderer's input that is wrong", () => {
    const r = outgoingMailSchema.safeParse({ to: "a@kestrelbay.example", render: "invitation", input: { labName: "Kestrel Bay", role: "chemist", link: "not a url", validDays: 7 } });
    expect(r.success).toBe(false);
    expect(r.error?.issues.map((i) => i.path.join("."))).toContain("input.link");
  });

  it("renders the invitation with the lab, the role and the link", async () => {
    const content = await MAIL_RENDERERS.invitation.render({ labName: "Kestrel Bay Process Chemistry", role: "safety_officer", link: "http://127.0.0.1:3000/invite/tok", validDays: 7 });
    expect(content.subject).toBe("You are invited to Kestrel Bay Process Chemistry on Tareline");
    expect(content.text).toContain("as safety officer");
    expect(content.text).toContain("http://127.0.0.1:3000/invite/tok");
    expect(content.text).toContain("valid for 7 days");
  });
});
