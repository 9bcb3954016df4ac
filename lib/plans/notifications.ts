/**
 * The e-mails of review and release, as text (pure): a plan waiting for review (to the
 * lab's safety officers), a review decision (to the author), and stock short for a
 * release (to the stockkeepers). The release mail with its prep sheet and worklist is
 * built in the job worker (lib/plans/server/release-mail.ts). Every mail that lists
 * cautions carries the planning notice.
 */
import { CAUTION_RULES, PLANNING_NOTICE, compareCautions, type Caution } from "../hazards/caution-rules";
import { SIGNATURE_MEANINGS, type ReviewDecision } from "./signature";

export interface MailText {
  subject: string;
  text: string;
}

/** Paths of the pages a mail links to, below the app's URL. */
export const planPaths = {
  plan: (lab: string, studyId: string, planId: string) => `/labs/${lab}/studies/${studyId}/plans/${planId}`,
  review: (lab: string, planId: string) => `/labs/${lab}/review/${planId}`,
  queue: (lab: string) => `/labs/${lab}/review`,
};

const title = (code: string) => (CAUTION_RULES as Record<string, { title: string } | undefined>)[code]?.title ?? code;

/** One line per caution, worst first: "WARNING TL-V01 Sealed vessel above … (runs 1, 4)". */
export function cautionLines(cautions: readonly Caution[]): string[] {
  return [...cautions].sort(compareCautions).map((c) => `- ${c.severity.toUpperCase()} ${c.code} ${title(c.code)}${c.component ? ` — ${c.component}` : ""} (runs ${c.runs.join(", ")})`);
}

/** To the lab's safety officers: a plan was submitted for review. */
export function reviewRequestedMail(m: {
  labName: string;
  planName: string;
  studyName: string;
  authorName: string;
  runCount: number | null;
  cautions: readonly Caution[];
  signOffReasons: readonly string[];
  link: string;
}): MailText {
  return {
    subject: `Review requested: ${m.planName}`.slice(0, 300),
    text: [
      `${m.authorName} submitted a plan for safety review in ${m.labName}.`,
      "",
      `Plan: ${m.planName}`,
      `Study: ${m.studyName}`,
      `Runs: ${m.runCount ?? "—"}`,
      m.signOffReasons.length ? `Sign-off needed for: ${m.signOffReasons.join("; ")}` : "No rule of the lab asks for sign-off; the author asked for a review.",
      "",
      m.cautions.length ? "Cautions:" : "No cautions.",
      ...cautionLines(m.cautions),
      "",
      `Review it here: ${m.link}`,
      "",
      PLANNING_NOTICE,
    ].join("\n"),
  };
}

/** To the plan's author: the reviewer's decision. */
export function reviewDecisionMail(m: { labName: string; planName: string; decision: ReviewDecision; signerName: string; comment: string; link: string }): MailText {
  const meaning = SIGNATURE_MEANINGS[m.decision];
  return {
    subject: `${m.planName}: ${meaning}`.slice(0, 300),
    text: [
      `${m.signerName} signed your plan "${m.planName}" in ${m.labName}: ${meaning}.`,
      "",
      m.comment ? `Comment: ${m.comment}` : "No comment.",
      "",
      m.decision === "approve" ? "You can release it now; any edit voids the approval." : m.decision === "request_changes" ? "Edit the plan and submit it again." : "The plan cannot go ahead; duplicate it to start again.",
      `The plan: ${m.link}`,
    ].join("\n"),
  };
}

export interface ShortfallLine {
  chemicalId: string;
  name: string;
  needed: number;
  available: number;
  unit: string;
}

/** To the stockkeepers: a release found stock short (nothing was reserved). */
export function shortfallMail(m: { labName: string; planName: string; requestedBy: string; shortfalls: readonly ShortfallLine[]; link: string }): MailText {
  const n = (x: number) => (Math.abs(x) >= 100 ? x.toFixed(0) : Math.abs(x) >= 10 ? x.toFixed(1) : x.toFixed(2));
  return {
    subject: `Stock short for ${m.planName}`.slice(0, 300),
    text: [
      `${m.requestedBy} tried to release "${m.planName}" in ${m.labName}, but the inventory cannot cover it. Nothing was reserved.`,
      "",
      ...m.shortfalls.map((s) => `- ${s.name}: needed ${n(s.needed)} ${s.unit}, available ${n(s.available)} ${s.unit}, short ${n(s.needed - s.available)} ${s.unit}`),
      "",
      `The plan: ${m.link}`,
    ].join("\n"),
  };
}
