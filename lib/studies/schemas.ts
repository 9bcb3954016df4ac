/**
 * A study (PRODUCT.md "The flow of one plan", step 1): a name, the goal in words, the
 * target product, and the responses measured in its plans, each with the direction that
 * counts as better (maximize, minimize, or hit a target inside bounds — the three goals
 * of Derringer–Suich desirability). One schema for the entity; the create, update and
 * list-query variants are derived from it. Forms use the same schemas through zodResolver.
 */
import { optionalText, text, uuid } from "../schemas/text";
import { z } from "zod";

/** A response's name is a key in result rows and analysis requests (`?response=yield`). */
export const RESPONSE_NAME_PATTERN = /^[A-Za-z][A-Za-z0-9_]*$/;

const bound = z.number({ message: "enter a number" }).finite("enter a finite number").optional();

export const RESPONSE_GOALS = ["maximize", "minimize", "target"] as const;
export type ResponseGoal = (typeof RESPONSE_GOALS)[number];
export const RESPONSE_GOAL_LABELS: Record<ResponseGoal, string> = { maximize: "Maximize", minimize: "Minimize", target: "Hit a target" };

/**
 * One response. `low`/`high` bound what is acceptable: for `target` both are required and
 * must contain the target; for maximize/minimize they are optional (when both are given,
 * low < high).
 */
export const studyResponseSchema = z
  .object({
    name: text(40)
      .min(1, "name the response")
      .regex(RESPONSE_NAME_PATTERN, "letters, digits and _ only, starting with a letter (it is used as a key, e.g. yield)"),
    /** Unit of the response, e.g. "%", "area %", "mg". */
    unit: text(40).default(""),
    goal: z.enum(RESPONSE_GOALS, { message: "choose maximize, minimize or target" }),
    target: bound,
    low: bound,
    high: bound,
  })
  .superRefine((r, ctx) => {
    if (r.goal === "target") {
      if (r.target === undefined) ctx.addIssue({ code: "custom", path: ["target"], message: "give the target value" });
      if (r.low === undefined) ctx.addIssue({ code: "custom", path: ["low"], message: "give the lowest acceptable value" });
      if (r.high === undefined) ctx.addIssue({ code: "custom", path: ["high"], message: "give the highest acceptable value" });
      if (r.target !== undefined && r.low !== undefined && r.target < r.low) ctx.addIssue({ code: "custom", path: ["target"], message: "must not be below the lowest acceptable value" });
      if (r.target !== undefined && r.high !== undefined && r.target > r.high) ctx.addIssue({ code: "custom", path: ["target"], message: "must not be above the highest acceptable value" });
    } else if (r.target !== undefined) {
      ctx.addIssue({ code: "custom", path: ["target"], message: `a target applies only to the goal "target"` });
    }
    if (r.low !== undefined && r.high !== undefined && !(r.low < r.high)) ctx.addIssue({ code: "custom", path: ["high"], message: "must be above the lowest acceptable value" });
  });
export type StudyResponse = z.output<typeof studyResponseSchema>;
export type StudyResponseInput = z.input<typeof studyResponseSchema>;

/** The responses of a study: at least one, names unique (ignoring case, as keys in CSV headers are). */
export const studyResponsesSchema = z
  .array(studyResponseSchema)
  .min(1, "name at least one response to measure")
  .max(20, "at most 20 responses")
  .superRefine((list, ctx) => {
    const seen = new Map<string, number>();
    list.forEach((r, i) => {
      const key = r.name.toLowerCase();
      const prior = seen.get(key);
      if (prior !== undefined) ctx.addIssue({ code: "custom", path: [i, "name"], message: `the same name as response ${prior + 1}` });
      else seen.set(key, i);
    });
  });

/** The study entity. */
export const studySchema = z.object({
  id: uuid(),
  name: text(200).min(1, "name the study"),
  /** The goal in words, e.g. "maximise assay yield of the biaryl; keep the homocoupling impurity under 2 area %". */
  goal: optionalText(2000),
  /** The product the study makes, in words or as a structure name. */
  targetProduct: optionalText(300),
  responses: studyResponsesSchema,
  authorId: uuid(),
  authorName: z.string(),
  version: z.number().int().min(1),
  archivedAt: z.iso.datetime().nullable(),
  createdAt: z.iso.datetime(),
  updatedAt: z.iso.datetime(),
  /** Plans in the study. */
  planCount: z.number().int().min(0),
});
export type StudyRow = z.output<typeof studySchema>;

/** What `POST /studies` takes (CONTRACT.md "Studies"). */
export const studyCreateSchema = studySchema.pick({ name: true, goal: true, targetProduct: true, responses: true });
export type StudyCreateInput = z.input<typeof studyCreateSchema>;
export type StudyCreateValues = z.output<typeof studyCreateSchema>;

/** What `PATCH /studies/{study}` takes: any of the create fields, and the version edited. */
export const studyUpdateSchema = studyCreateSchema.partial().extend({
  version: z.number({ message: "give the version you edited" }).int().min(1),
});
export type StudyUpdateInput = z.input<typeof studyUpdateSchema>;

export const STUDY_SORTS = ["name", "updatedAt", "createdAt"] as const;

/** The list query of `GET /studies`: name filter, sort and server paging. */
export const studyQuerySchema = z.object({
  q: text(200).optional(),
  sort: z.enum(STUDY_SORTS).default("updatedAt"),
  dir: z.enum(["asc", "desc"]).default("desc"),
  page: z.coerce.number().int().min(1).max(100000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
  /** Archived studies are left out unless asked for. */
  archived: z.enum(["exclude", "include", "only"]).default("exclude"),
});
export type StudyQuery = z.output<typeof studyQuerySchema>;

export interface StudyPage {
  studies: StudyRow[];
  total: number;
  page: number;
  pageSize: number;
}
