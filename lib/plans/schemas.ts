/**
 * A plan (CONTRACT.md "Plans"): one schema for the entity, with the request and
 * list-query variants derived from it. The plan's content is the plan document of the
 * `plan` verb (lib/chemistry `planDocumentSchema`); a request's `document` is taken as
 * an object here and validated by that schema after the lab's defaults are filled in
 * (lib/plans/document.ts), so every issue path points into what the person sent
 * (`document.factors.0.high`).
 */
// First: chooses zod's interpreter before the engine's plan-document schema is built (lib/schemas/text.ts).
import { text, uuid } from "../schemas/text";
import { z } from "zod";
import { planDocumentSchema } from "../chemistry/plan-document";
import { PLAN_STATES } from "./states";

export const PLAN_DERIVATIONS = ["duplicate", "confirmation", "augmentation"] as const;
export type PlanDerivation = (typeof PLAN_DERIVATIONS)[number];

/** The plan entity as stored (the list and detail views add to it). */
export const planSchema = z.object({
  id: z.uuid(),
  studyId: z.uuid(),
  /** The document's name, or "Untitled plan". */
  name: z.string().min(1).max(300),
  state: z.enum(PLAN_STATES),
  /** Optimistic lock: send it back with an update; every saved change adds one. */
  version: z.number().int().min(1),
  /** SHA-256 (hex) of the document's RFC 8785 canonical JSON. */
  contentHash: z.string().regex(/^[0-9a-f]{64}$/),
  document: planDocumentSchema,
  /** Runs of the design (null when the design cannot be generated). */
  runCount: z.number().int().min(0).nullable(),
  authorId: z.uuid(),
  derivedFromPlanId: z.uuid().nullable(),
  derivation: z.enum(PLAN_DERIVATIONS).nullable(),
  /** What a derived plan was derived with (lib/results/confirmation-plan.ts, lib/plans/augmentation.ts), null otherwise. */
  derivationDetails: z.record(z.string(), z.unknown()).nullable(),
  createdAt: z.iso.datetime(),
  updatedAt: z.iso.datetime(),
});

/** A plan document as a request carries it: a JSON object, validated in full after the lab's defaults are filled in. */
const requestDocument = z.record(z.string(), z.unknown(), { message: "give the plan document as a JSON object" });

/** `POST /studies/{study}/plans` */
export const planCreateSchema = z.object({ document: requestDocument });
export type PlanCreateInput = z.input<typeof planCreateSchema>;

/** `PUT /plans/{plan}`: the whole new document and the version it was edited from. */
export const planUpdateSchema = planCreateSchema.extend(planSchema.pick({ version: true }).shape);
export type PlanUpdateInput = z.input<typeof planUpdateSchema>;

/** `POST /plans/{plan}/duplicate`: optionally a name for the copy (default "Copy of …"). */
export const planDuplicateSchema = z.object({ name: text(300).min(1, "name the copy").optional() }).prefault({});

/**
 * `POST /plans/{plan}/augment`: the next design after a two-level factorial — α of the axial
 * runs (rotatable F^¼, the α that blocks orthogonally, face-centred, or a number ≥ 1; cut
 * to the factor limits and the safe envelope), the centre runs of the new block (default: as
 * many as the factorial has, at least 2) and a name for the new plan.
 */
export const planAugmentSchema = z
  .object({
    alpha: z
      .union([z.enum(["rotatable", "orthogonal", "face-centered"]), z.number().finite().min(1, "α is at least 1 (face-centred)").max(10, "α is at most 10")], {
        message: "α is rotatable, orthogonal, face-centered or a number",
      })
      .default("rotatable"),
    centerPoints: z.number({ message: "a whole number of centre runs" }).int("a whole number of centre runs").min(0).max(20, "at most 20 centre runs").optional(),
    name: text(300).min(1, "name the plan").optional(),
  })
  .prefault({});
export type PlanAugmentInput = z.input<typeof planAugmentSchema>;

/** `DELETE /plans/{plan}?version=`: the version is optional; when given it must be current. */
export const planDeleteSchema = z.object({ version: z.coerce.number().int().min(1).optional() });

/** One row of a plan list. */
export const planSummarySchema = planSchema.omit({ document: true }).extend({
  studyName: z.string(),
  authorName: z.string(),
});
export type PlanSummary = z.output<typeof planSummarySchema>;

export const PLAN_SORTS = ["updatedAt", "createdAt", "name", "state"] as const;

/** `GET /plans?state=&author=&study=&q=&sort=&dir=&page=&pageSize=`; `state` may list several, comma-separated. */
export const planQuerySchema = z.object({
  state: z
    .string()
    .optional()
    .transform((v) => (v ? v.split(",").map((s) => s.trim()).filter(Boolean) : []))
    .pipe(z.array(z.enum(PLAN_STATES, { message: `use one of ${PLAN_STATES.join(", ")}` }))),
  /** A member's user id, or "me". */
  author: z.union([uuid(), z.literal("me")], { message: "a user id, or me" }).optional(),
  study: uuid("a study id").optional(),
  q: text(200).optional(),
  sort: z.enum(PLAN_SORTS).default("updatedAt"),
  dir: z.enum(["asc", "desc"]).default("desc"),
  page: z.coerce.number().int().min(1).max(100000).default(1),
  pageSize: z.coerce.number().int().min(1).max(200).default(25),
});
export type PlanQuery = z.output<typeof planQuerySchema>;

export interface PlanPage {
  plans: PlanSummary[];
  total: number;
  page: number;
  pageSize: number;
}
