import { z } from "zod";
import { defineMailRenderer } from "@/lib/jobs/mail/renderer";

/**
 * The release e-mail to the plan's author, built in the job worker (registered as
 * "plan-released" in lib/jobs/mail/renderers.ts): the job carries only the lab and plan
 * ids; the worker reads the plan and renders the prep sheet PDF and the dispense worklist
 * CSV as attachments just before sending (lib/plans/server/release-mail-content.ts, loaded
 * on first use so the app does not load the PDF renderer to queue a mail).
 */
export const planReleasedMail = defineMailRenderer({
  input: z.object({ labId: z.uuid(), planId: z.uuid(), appUrl: z.url().optional() }),
  async render(input) {
    const { releaseMailContent } = await import("./server/release-mail-content");
    return releaseMailContent(input);
  },
});
