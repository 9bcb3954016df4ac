/**
 * The requests of review and release (CONTRACT.md `POST /plans/{plan}/review`): one zod
 * schema each, shared by the route handlers and the sign dialog.
 */
// First: chooses zod's interpreter before any object schema is built (lib/schemas/text.ts).
import { safeString, text } from "../schemas/text";
import { z } from "zod";
import { REVIEW_DECISIONS } from "./signature";

/**
 * `{ decision, comment, password }`: the reviewer's decision, a comment (required when
 * asking for changes or rejecting: the author needs to know why) and their own password
 * entered again (the e-signature).
 */
export const planReviewSchema = z
  .object({
    decision: z.enum(REVIEW_DECISIONS, { message: `use one of ${REVIEW_DECISIONS.join(", ")}` }),
    comment: text(4000).default(""),
    password: safeString(1000).min(1, "enter your password to sign"),
  })
  .superRefine((v, ctx) => {
    if (v.decision !== "approve" && v.comment.length < 3) ctx.addIssue({ code: "custom", path: ["comment"], message: "say what must change, or why (at least 3 characters)" });
  });
export type PlanReviewInput = z.input<typeof planReviewSchema>;
