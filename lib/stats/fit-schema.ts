/**
 * The `fit` input of CONTRACT.md as a zod schema. Added fields (optional):
 * `responseName` picks one response from runs that carry several in `responses`;
 * `predict` lists points at which to predict with intervals; a run's `block` labels
 * the plan (or block) it came from, for several plans analysed together; `exclude`
 * leaves runs out by index with a reason.
 */
import { z } from "zod";
import { factorListSchema } from "../doe/factors";
import { modelSpecSchema } from "./model-terms";

const pointSchema = z.record(z.string(), z.number().finite());

/** One observed run: coded or natural factor values and the response (or several). */
export const observedRunSchema = z.object({
  natural: pointSchema.optional(),
  coded: pointSchema.optional(),
  response: z.number().finite().optional(),
  responses: z.record(z.string(), z.number().finite()).optional(),
  /** The block (plan, day, batch) the run belongs to; give it on every run or on none. */
  block: z.union([z.string().trim().min(1).max(80), z.number().finite()]).optional(),
});

/** A run left out of the fit: its index in `runs` (0-based) and why (shown and recorded). */
export const excludedRunSchema = z.object({
  index: z.number().int().min(0),
  reason: z.string().trim().min(1, "give a reason").max(500),
});

/** Backward elimination settings: level α (default 0.05) and whether hierarchy is kept (default true). */
export const pruneSchema = z.object({
  alpha: z.number().gt(0).lt(1).default(0.05),
  hierarchy: z.boolean().default(true),
});

/** The fields shared by `fit` and `optimize`. */
export const fitFields = {
  factors: factorListSchema,
  runs: z.array(observedRunSchema).min(1, "at least one run is needed"),
  model: modelSpecSchema.default("quadratic"),
  transform: z.enum(["none", "ln"]).default("none"),
  prune: pruneSchema.optional(),
  responseName: z.string().min(1).optional(),
  /** Runs left out (by index, with the reason); their responses may be missing. */
  exclude: z.array(excludedRunSchema).max(100000).default([]),
};

type FitShape = {
  factors: { name: string }[];
  runs: z.output<typeof observedRunSchema>[];
  transform: "none" | "ln";
  responseName?: string;
  exclude: z.output<typeof excludedRunSchema>[];
};

/**
 * Checks the runs against the factors: values present, known names, responses present
 * and (for ln) positive on every run that is not excluded; blocks on every run or none;
 * exclusions inside `runs` and not repeated.
 */
export function checkRuns(d: FitShape, ctx: z.RefinementCtx, responseNames: (string | undefined)[] = [d.responseName]): void {
  const names = d.factors.map((f) => f.name);
  const excluded = new Set<number>();
  d.exclude.forEach((e, i) => {
    if (e.index >= d.runs.length) ctx.addIssue({ code: "custom", path: ["exclude", i, "index"], message: `there are only ${d.runs.length} runs (indices from 0)` });
    else if (excluded.has(e.index)) ctx.addIssue({ code: "custom", path: ["exclude", i, "index"], message: "is excluded twice" });
    excluded.add(e.index);
  });
  const withBlock = d.runs.filter((r) => r.block !== undefined).length;
  if (withBlock > 0 && withBlock < d.runs.length) {
    const i = d.runs.findIndex((r) => r.block === undefined);
    ctx.addIssue({ code: "custom", path: ["runs", i, "block"], message: "give every run a block, or none" });
  }
  d.runs.forEach((r, i) => {
    const pt = r.coded ?? r.natural;
    const key = r.coded ? "coded" : "natural";
    if (!pt) {
      ctx.addIssue({ code: "custom", path: ["runs", i], message: "give coded or natural values" });
      return;
    }
    for (const k of Object.keys(pt)) if (!names.includes(k)) ctx.addIssue({ code: "custom", path: ["runs", i, key, k], message: "is not one of the factors" });
    for (const n of names) if (pt[n] === undefined) ctx.addIssue({ code: "custom", path: ["runs", i, key, n], message: "is missing" });
    if (excluded.has(i)) return;
    for (const rn of responseNames) {
      const y = rn === undefined ? r.response : (r.responses?.[rn] ?? (rn === d.responseName ? r.response : undefined));
      const path = rn === undefined ? ["runs", i, "response"] : r.responses ? ["runs", i, "responses", rn] : ["runs", i, "response"];
      if (y === undefined) ctx.addIssue({ code: "custom", path, message: "is missing" });
      else if (d.transform === "ln" && !(y > 0)) ctx.addIssue({ code: "custom", path, message: "must be positive for the ln transform" });
    }
  });
}

/** A point at which to predict: coded or natural values of every factor. */
export const predictPointSchema = z
  .object({ coded: pointSchema.optional(), natural: pointSchema.optional() })
  .refine((p) => p.coded !== undefined || p.natural !== undefined, "give coded or natural values");

/** The `fit` input (CONTRACT.md) with defaults: model quadratic, transform none. */
export const fitInputSchema = z
  .object({
    ...fitFields,
    /** Points at which to predict with 95 % confidence and prediction intervals. */
    predict: z.array(predictPointSchema).optional(),
  })
  .superRefine((d, ctx) => {
    checkRuns(d, ctx);
    const names = d.factors.map((f) => f.name);
    d.predict?.forEach((p, i) => {
      const pt = p.coded ?? p.natural;
      const key = p.coded ? "coded" : "natural";
      if (!pt) return;
      for (const n of names) if (pt[n] === undefined) ctx.addIssue({ code: "custom", path: ["predict", i, key, n], message: "is missing" });
      for (const n of Object.keys(pt)) if (!names.includes(n)) ctx.addIssue({ code: "custom", path: ["predict", i, key, n], message: "is not one of the factors" });
    });
  });

export type FitInput = z.output<typeof fitInputSchema>;
export type FitInputRaw = z.input<typeof fitInputSchema>;
