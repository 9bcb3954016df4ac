import { z } from "zod";
import { ROLE_LABELS } from "@/lib/auth/roles";
import { roleSchema } from "@/lib/members/schemas";
import { defineMailRenderer } from "@/lib/jobs/mail/renderer";

/** The invitation e-mail, built by the job worker from what inviteMember enqueues. */
export const invitationMail = defineMailRenderer({
  input: z.object({
    labName: z.string().min(1),
    role: roleSchema,
    link: z.url(),
    validDays: z.number().int().positive(),
  }),
  async render({ labName, role, link, validDays }) {
    return {
      subject: `You are invited to ${labName} on Tareline`,
      text: [
        `You have been invited to join ${labName} on Tareline as ${ROLE_LABELS[role].toLowerCase()}.`,
        "",
        `Open this link to set your password and join (valid for ${validDays} days):`,
        link,
        "",
        "If you did not expect this, ignore this message.",
      ].join("\n"),
    };
  },
});
