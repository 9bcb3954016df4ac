import "server-only";
import type { MailContentInput } from "@/lib/jobs/mail/message";
import { Plan } from "@/lib/server/models";
import { PLANNING_NOTICE } from "@/lib/hazards/caution-rules";
import { cautionLines, planPaths } from "../notifications";
import { getPlan } from "./get-plan";
import { appLink, labOf } from "./plan-mail";
import { prepSheetOf, worklistOf } from "./plan-sheets";

/**
 * The release e-mail's content (the "plan-released" renderer, run in the job worker): what
 * was released and reserved, with links, and the prep sheet PDF and the dispense worklist
 * CSV attached (lib/plans/server/plan-sheets.ts, the routes' own functions); safe to build
 * more than once for one job.
 * @throws Error when the plan is gone (the attempt fails and is retried, then given up).
 */
export async function releaseMailContent(input: { labId: string; planId: string; appUrl?: string }): Promise<MailContentInput> {
  const row = await Plan.findOne({ where: { id: input.planId, labId: input.labId }, attributes: ["id"] });
  if (!row) throw new Error(`plan ${input.planId} is not in lab ${input.labId}`);
  const plan = await getPlan({ labId: input.labId, planId: input.planId });
  const lab = await labOf(input.labId);
  const link = appLink(planPaths.plan(lab.slug, plan.studyId, plan.id), input.appUrl);
  const held = plan.reservations.filter((r) => r.status === "held");
  const sheet = await prepSheetOf(plan, lab.name);
  const worklist = worklistOf(plan);
  return {
    attachments: [
      { filename: sheet.filename, contentType: "application/pdf", contentBase64: sheet.pdf.toString("base64") },
      { filename: worklist.filename, contentType: "text/csv", contentBase64: Buffer.from(worklist.csv, "utf8").toString("base64") },
    ],
    subject: `Released: ${plan.name}`.slice(0, 300),
    text: [
      `Your plan "${plan.name}" (${plan.studyName}) in ${lab.name} is released.`,
      plan.signature?.valid ? `Signed by ${plan.signature.signerName} (${plan.signature.meaning}), SHA-256 ${plan.signature.contentHash}.` : "Released without review: no rule of the lab asks for sign-off.",
      "",
      held.length ? "Reserved for it:" : "Nothing is reserved for it (no component names a chemical of the inventory).",
      ...held.map((r) => `- ${r.chemicalName}: ${r.amount.display} from ${r.barcode}`),
      "",
      plan.cautions.length ? "Cautions:" : "No cautions.",
      ...cautionLines(plan.cautions),
      "",
      "Attached: the prep sheet (PDF) and the dispense worklist (CSV).",
      `The plan: ${link}`,
      "",
      PLANNING_NOTICE,
    ].join("\n"),
  };
}
