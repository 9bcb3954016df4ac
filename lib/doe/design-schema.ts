/**
 * The `design` input of CONTRACT.md as a zod schema, with the defaults filled in.
 * Fields beyond the contract (all optional): `fraction` (p of a 2^(k−p)), `blocks`,
 * `blockByReplicate`, `hardToChange`, `levels`, `candidates`, `starts`, `augment`.
 */
import { z } from "zod";
import { factorListSchema } from "./factors";
import { constraintSchema } from "./constraints";
import { modelSpecSchema } from "../stats/model-terms";

/** The design families of CONTRACT.md `design`. */
export const DESIGN_KINDS = ["full-factorial", "fractional-factorial", "central-composite", "box-behnken", "d-optimal"] as const;
export type DesignKind = (typeof DESIGN_KINDS)[number];

const pointSchema = z.record(z.string(), z.number().finite());

/** One run given to the design engine (an existing run to augment): coded or natural values. */
export const givenRunSchema = z
  .object({ coded: pointSchema.optional(), natural: pointSchema.optional() })
  .refine((r) => r.coded !== undefined || r.natural !== undefined, "give coded or natural values");

/**
 * The `design` input (CONTRACT.md), with defaults; cross-field checks name the field
 * (e.g. `runs` is required for d-optimal, `blocks` must be a power of two).
 */
export const designInputSchema = z
  .object({
    factors: factorListSchema,
    design: z.enum(DESIGN_KINDS),
    alpha: z.union([z.enum(["rotatable", "spherical", "face-centered"]), z.number().finite().positive()]).default("rotatable"),
    placement: z.enum(["circumscribed", "inscribed"]).default("circumscribed"),
    generators: z.array(z.string()).optional(),
    /** p of a 2^(k−p) fraction when no generators are given (default 1, a half fraction). */
    fraction: z.number().int().min(1).optional(),
    /** Centre points (default 3 for central composite and Box–Behnken, else 0). */
    centerPoints: z.number().int().min(0).max(1000).optional(),
    replicates: z.number().int().min(1).max(100).default(1),
    randomize: z.boolean().default(true),
    seed: z.number().int().optional(),
    /** Number of blocks: a power of two for factorials; 1 or 2 for central composite. */
    blocks: z.number().int().min(1).max(64).default(1),
    /** Make each replicate its own block. */
    blockByReplicate: z.boolean().default(false),
    /** A hard-to-change factor: runs are grouped by its level within each block. */
    hardToChange: z.string().optional(),
    /** d-optimal: number of runs; fractional factorial: number of runs of the fraction. */
    runs: z.number().int().min(1).max(100000).optional(),
    model: modelSpecSchema.default("quadratic"),
    constraints: z.array(constraintSchema).optional(),
    /** d-optimal: levels of the default grid of candidates (default 3 with square terms, else 2). */
    levels: z.number().int().min(2).max(11).optional(),
    /** d-optimal: candidate points in natural units (default: the grid). */
    candidates: z.array(pointSchema).min(1).optional(),
    /** d-optimal: random starts of the exchange (default 6). */
    starts: z.number().int().min(1).max(100).optional(),
    /** central composite: augment these existing factorial (and centre) runs with axial and centre runs in a new block. */
    augment: z.object({ runs: z.array(givenRunSchema).min(2) }).optional(),
  })
  .superRefine((d, ctx) => {
    const k = d.factors.length;
    const names = d.factors.map((f) => f.name);
    if (d.hardToChange !== undefined && !names.includes(d.hardToChange)) {
      ctx.addIssue({ code: "custom", path: ["hardToChange"], message: "is not one of the factors" });
    }
    if (d.design === "full-factorial" && k > 10) ctx.addIssue({ code: "custom", path: ["factors"], message: "a full factorial takes at most 10 factors" });
    if (d.design === "fractional-factorial" && (k < 3 || k > 10)) {
      ctx.addIssue({ code: "custom", path: ["factors"], message: "a fractional factorial takes 3 to 10 factors" });
    }
    if (d.design === "central-composite" && (k < 2 || k > 10)) {
      ctx.addIssue({ code: "custom", path: ["factors"], message: "a central composite design takes 2 to 10 factors" });
    }
    if (d.design === "box-behnken" && (k < 3 || k > 7)) {
      ctx.addIssue({ code: "custom", path: ["factors"], message: "a Box–Behnken design takes 3 to 7 factors" });
    }
    if (d.design === "d-optimal" && d.runs === undefined) ctx.addIssue({ code: "custom", path: ["runs"], message: "is required for a d-optimal design" });
    if (d.design === "box-behnken" && d.blocks > 1) ctx.addIssue({ code: "custom", path: ["blocks"], message: "Box–Behnken designs here are not blocked (use blockByReplicate)" });
    if (d.design === "d-optimal" && d.blocks > 1) ctx.addIssue({ code: "custom", path: ["blocks"], message: "d-optimal designs here are not blocked (use blockByReplicate)" });
    if ((d.design === "full-factorial" || d.design === "fractional-factorial") && (d.blocks & (d.blocks - 1)) !== 0) {
      ctx.addIssue({ code: "custom", path: ["blocks"], message: "must be a power of two for a two-level design" });
    }
    if (d.design === "central-composite" && d.blocks > 2) ctx.addIssue({ code: "custom", path: ["blocks"], message: "a central composite design takes 1 or 2 blocks" });
    if (d.augment && d.design !== "central-composite") ctx.addIssue({ code: "custom", path: ["augment"], message: "applies to central composite designs only" });
    if (d.runs !== undefined && d.design === "fractional-factorial" && (d.runs & (d.runs - 1)) !== 0) {
      ctx.addIssue({ code: "custom", path: ["runs"], message: "a two-level fraction has a power of two runs" });
    }
    const point = (p: Record<string, number>, path: (string | number)[]) => {
      for (const key of Object.keys(p)) if (!names.includes(key)) ctx.addIssue({ code: "custom", path: [...path, key], message: "is not one of the factors" });
      for (const n of names) if (p[n] === undefined) ctx.addIssue({ code: "custom", path: [...path, n], message: "is missing" });
    };
    d.candidates?.forEach((c, i) => point(c, ["candidates", i]));
    d.augment?.runs.forEach((r, i) => {
      if (r.coded) point(r.coded, ["augment", "runs", i, "coded"]);
      else if (r.natural) point(r.natural, ["augment", "runs", i, "natural"]);
    });
  });

export type DesignInput = z.output<typeof designInputSchema>;
/** The design input as a caller writes it (defaults optional). */
export type DesignInputRaw = z.input<typeof designInputSchema>;
