/**
 * The `design` input of CONTRACT.md as a zod schema, with the defaults filled in.
 * Fields beyond the contract (all optional): `fraction` (p of a 2^(k−p)), `blocks`,
 * `blockByReplicate`, `hardToChange`, `levels`, `candidates`, `excludeCandidates`,
 * `starts`, `tabuSteps`, `augment`.
 *
 * The work is bounded here (issue 9: a 30-factor request exhausted memory): at most
 * `DESIGN_LIMITS.factors` factors, `DESIGN_LIMITS.runs` runs in the whole design
 * (replicates included), 16 blocks, and the D-optimal bounds of `D_OPTIMAL_LIMITS`;
 * an input beyond them is refused with the field to change.
 */
import { z } from "zod";
import { FACTOR_LETTERS, factorListSchema } from "./factors";
import { boxBehnkenCoded } from "./box-behnken";
import { constraintSchema } from "./constraints";
import { D_OPTIMAL_LIMITS } from "./d-optimal";
import { modelSpecSchema } from "../stats/model-terms";

/** Bounds of every design input. */
export const DESIGN_LIMITS = {
  /** Factors of any design (each has a letter A, B, … skipping I). */
  factors: FACTOR_LETTERS.length,
  /** Runs of the whole design, replicates and centre points included. */
  runs: 10_000,
  /** Blocks of a two-level design (the choice of block words grows as C(40, log2 blocks)). */
  blocks: 16,
  /** Linear constraints. */
  constraints: 50,
} as const;

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
    factors: factorListSchema.refine((f) => f.length <= DESIGN_LIMITS.factors, `at most ${DESIGN_LIMITS.factors} factors`),
    design: z.enum(DESIGN_KINDS),
    alpha: z.union([z.enum(["rotatable", "spherical", "face-centered"]), z.number().finite().positive()]).default("rotatable"),
    placement: z.enum(["circumscribed", "inscribed"]).default("circumscribed"),
    generators: z.array(z.string().max(40)).max(DESIGN_LIMITS.factors).optional(),
    /** p of a 2^(k−p) fraction when no generators are given (default 1, a half fraction). */
    fraction: z.number().int().min(1).optional(),
    /** Centre points (default 3 for central composite and Box–Behnken, else 0). */
    centerPoints: z.number().int().min(0).max(1000).optional(),
    replicates: z.number().int().min(1).max(100).default(1),
    randomize: z.boolean().default(true),
    seed: z.number().int().optional(),
    /** Number of blocks: a power of two for factorials; 1 or 2 for central composite. */
    blocks: z.number().int().min(1).max(DESIGN_LIMITS.blocks).default(1),
    /** Make each replicate its own block. */
    blockByReplicate: z.boolean().default(false),
    /** A hard-to-change factor: runs are grouped by its level within each block. */
    hardToChange: z.string().optional(),
    /** d-optimal: number of runs; fractional factorial: number of runs of the fraction. */
    runs: z.number().int().min(1).max(DESIGN_LIMITS.runs).optional(),
    model: modelSpecSchema.default("quadratic"),
    constraints: z.array(constraintSchema).max(DESIGN_LIMITS.constraints).optional(),
    /** d-optimal: levels of the default grid of candidates (default 3 with square terms, else 2). */
    levels: z.number().int().min(2).max(11).optional(),
    /** d-optimal: candidate points in natural units (default: the grid). */
    candidates: z.array(pointSchema).min(1).max(D_OPTIMAL_LIMITS.candidates).optional(),
    /** d-optimal: candidate points (natural units) the search must not use, e.g. runs a caution blocks. */
    excludeCandidates: z.array(pointSchema).max(D_OPTIMAL_LIMITS.candidates).optional(),
    /** d-optimal: seeded starts of the search (default 3); the work budget may end it sooner. */
    starts: z.number().int().min(1).max(100).optional(),
    /** d-optimal: tabu steps per start after the first local optimum (default 1600; 0 for plain modified Fedorov). */
    tabuSteps: z.number().int().min(0).max(10_000).optional(),
    /** central composite: augment these existing factorial (and centre) runs with axial and centre runs in a new block. */
    augment: z.object({ runs: z.array(givenRunSchema).min(2).max(DESIGN_LIMITS.runs) }).optional(),
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
    d.excludeCandidates?.forEach((c, i) => point(c, ["excludeCandidates", i]));
    if (d.design === "d-optimal" && d.runs !== undefined && d.runs > D_OPTIMAL_LIMITS.runs) {
      ctx.addIssue({ code: "custom", path: ["runs"], message: `a d-optimal design here has at most ${D_OPTIMAL_LIMITS.runs} runs` });
    }
    if (Array.isArray(d.model) && d.model.length > D_OPTIMAL_LIMITS.terms) {
      ctx.addIssue({ code: "custom", path: ["model"], message: `at most ${D_OPTIMAL_LIMITS.terms} terms` });
    }
    const total = plannedRunCount(d);
    if (total !== null && total > DESIGN_LIMITS.runs) {
      const path = d.replicates > 1 && !d.augment ? "replicates" : d.centerPoints !== undefined && d.centerPoints > total / 2 ? "centerPoints" : d.design === "d-optimal" ? "runs" : "factors";
      ctx.addIssue({
        code: "custom",
        path: [path],
        message: `the design would have ${total} runs (at most ${DESIGN_LIMITS.runs}); use fewer replicates, centre points or factors`,
      });
    }
    d.augment?.runs.forEach((r, i) => {
      if (r.coded) point(r.coded, ["augment", "runs", i, "coded"]);
      else if (r.natural) point(r.natural, ["augment", "runs", i, "natural"]);
    });
  });

export type DesignInput = z.output<typeof designInputSchema>;

type DesignFields = Omit<DesignInput, "factors"> & { factors: readonly unknown[] };

/**
 * The number of runs the design will have (replicates and centre points included),
 * from the input alone, or null when the input is refused for another reason first
 * (too many factors for the design type, a fraction that cannot exist).
 */
export function plannedRunCount(d: DesignFields): number | null {
  const k = d.factors.length;
  const centre = d.centerPoints ?? (d.design === "central-composite" || d.design === "box-behnken" ? 3 : 0);
  const fractionRuns = (): number | null => {
    if (d.generators && d.generators.length > 0) return 2 ** (k - d.generators.length);
    if (d.runs !== undefined) return d.runs;
    return 2 ** (k - (d.fraction ?? 1));
  };
  let base: number | null;
  switch (d.design) {
    case "full-factorial":
      base = k <= 10 ? 2 ** k : null;
      break;
    case "fractional-factorial":
      base = k >= 3 && k <= 10 ? fractionRuns() : null;
      break;
    case "central-composite": {
      if (k < 2 || k > 10) return null;
      if (d.augment) return d.augment.runs.length + 2 * k + centre;
      const fractional = Boolean(d.generators?.length) || d.fraction !== undefined;
      const factorial = fractional ? fractionRuns() : 2 ** k;
      base = factorial === null ? null : factorial + 2 * k;
      break;
    }
    case "box-behnken":
      base = k >= 3 && k <= 7 ? boxBehnkenCoded(k).length : null;
      break;
    case "d-optimal":
      base = d.runs ?? null;
      break;
  }
  return base === null ? null : (base + centre) * d.replicates;
}
/** The design input as a caller writes it (defaults optional). */
export type DesignInputRaw = z.input<typeof designInputSchema>;
