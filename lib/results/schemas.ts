/**
 * Results and analysis requests (CONTRACT.md "Results and analysis"), one schema each:
 * the results entry (`PUT /plans/{plan}/results`, typed runs or a CSV file), the CSV
 * preview, a run left out of the analysis, and the analysis query
 * (`GET /plans/{plan}/analysis?response=&model=&alpha=&hierarchy=&transform=`, and the
 * study's `?plans=a,b&…`). The checks that need the plan (run numbers, response names)
 * live in lib/results/entries.ts and name the same paths.
 */
// First: chooses zod's interpreter before any object schema is built (lib/schemas/text.ts).
import { text, uuid } from "../schemas/text";
import { z } from "zod";
import { consumeInputSchema } from "@/inventory/schemas";
import { RESPONSE_NAME_PATTERN } from "../studies/schemas";

/** The largest CSV the results routes take (a 1536-run plan with a few responses is ~100 kB). */
export const RESULTS_CSV_MAX_CHARS = 2_000_000;
/** Body cap of the results routes (lib/api/route.ts `maxBytes`). */
export const RESULTS_BODY_LIMIT = 4_000_000;
/** The most runs one request may carry. */
export const MAX_RESULT_RUNS = 20_000;

const responseKey = z.string({ message: "must be a response name" }).regex(RESPONSE_NAME_PATTERN, "is not a response name (letters, digits and _)").max(40);

/** A result value: a finite number, or null for a failed run. Numbers only — a string is refused. */
export const resultValueSchema = z.number({ message: "must be a number (or null for a failed run)" }).finite("must be a finite number").nullable();

/** One run of a results entry (`responses: null` marks every response of the run failed). */
export const resultRunSchema = z.object({
  /** The run's number in the run sheet. */
  run: z.number({ message: "must be a run number" }).int("must be a whole run number").min(1, "run numbers start at 1"),
  responses: z.record(responseKey, resultValueSchema, { message: "give the responses as { name: value }" }).nullable().optional(),
  /** Why the run failed (for the values given as null). */
  reason: text(500).min(1, "say why the run failed").optional(),
  /** Responses whose entered result is removed (a value typed into the wrong run). */
  clear: z.array(responseKey).max(20).optional(),
});
export type ResultRunInput = z.input<typeof resultRunSchema>;
export type ResultRun = z.output<typeof resultRunSchema>;

/** How the columns of a results CSV map to runs and responses; missing entries are guessed from the headers. */
export const resultsCsvMappingSchema = z.object({
  /** The column holding the run number. */
  run: text(200).optional(),
  /** The column holding the vial position ("B3", or "2:B3" with several blocks). */
  vial: text(200).optional(),
  /** The column holding a failure reason (a row with a reason and no values is a failed run). */
  reason: text(200).optional(),
  /** Response name → column. */
  responses: z.record(responseKey, text(200)).optional(),
});
export type ResultsCsvMapping = z.output<typeof resultsCsvMappingSchema>;

/** A results CSV with its optional mapping (the preview, and the confirmation through the PUT). */
export const resultsCsvSchema = z.object({
  csv: z.string({ message: "must be the file's text" }).min(1, "the file is empty").max(RESULTS_CSV_MAX_CHARS, `at most ${RESULTS_CSV_MAX_CHARS} characters`),
  mapping: resultsCsvMappingSchema.optional(),
});

/** The amount actually used from one held reservation when the results complete the plan (default: the planned amount). */
export const consumptionLineSchema = consumeInputSchema.safeExtend({ reservationId: uuid("must be a reservation id") });

/**
 * `PUT /plans/{plan}/results`: `runs` typed (or pasted) in the grid, or a CSV file
 * (`csv`, `mapping?`) confirmed after its preview — the same checks either way.
 * `consumption` adjusts what the completed plan consumed, per reservation.
 */
export const resultsPutSchema = z
  .object({
    runs: z.array(resultRunSchema, { message: "a list of runs" }).min(1, "enter at least one run").max(MAX_RESULT_RUNS, `at most ${MAX_RESULT_RUNS} runs`).optional(),
    csv: resultsCsvSchema.shape.csv.optional(),
    mapping: resultsCsvMappingSchema.optional(),
    consumption: z.array(consumptionLineSchema, { message: "a list of reservations and amounts" }).max(500).optional(),
  })
  .superRefine((v, ctx) => {
    if (v.runs === undefined && v.csv === undefined) ctx.addIssue({ code: "custom", path: ["runs"], message: "give the runs' results (or a CSV file as csv)" });
    if (v.runs !== undefined && v.csv !== undefined) ctx.addIssue({ code: "custom", path: ["csv"], message: "give either runs or a CSV file, not both" });
    if (v.mapping !== undefined && v.csv === undefined) ctx.addIssue({ code: "custom", path: ["mapping"], message: "a mapping applies to a CSV file" });
  });
export type ResultsPutInput = z.input<typeof resultsPutSchema>;

/** `POST /plans/{plan}/exclusions`: leave a run out of the analysis, for one response or all. */
export const exclusionCreateSchema = z.object({
  run: resultRunSchema.shape.run,
  response: responseKey.optional(),
  reason: text(500).min(3, "say why the run is left out (at least 3 characters)"),
});
export type ExclusionCreateInput = z.input<typeof exclusionCreateSchema>;

/** `DELETE /plans/{plan}/exclusions/{exclusionId}?reason=`: bring the run back (the reason is optional). */
export const exclusionRestoreSchema = z.object({ reason: text(500).optional() });

const flag = (name: string) =>
  z
    .enum(["true", "false", "1", "0"], { message: `${name} is true or false` })
    .optional()
    .transform((v) => (v === undefined ? undefined : v === "true" || v === "1"));

/** A model as the query gives it: linear, interaction, quadratic, or terms comma-separated. */
const modelParam = z
  .string()
  .max(4000)
  .optional()
  .transform((v): "linear" | "interaction" | "quadratic" | string[] => {
    const s = (v ?? "").trim();
    if (s === "" ) return "quadratic";
    if (s === "linear" || s === "interaction" || s === "quadratic") return s;
    return s.split(",").map((t) => t.trim()).filter(Boolean);
  });

/** `GET /plans/{plan}/analysis?response=&model=&alpha=&hierarchy=&transform=`; without `alpha` nothing is pruned. */
export const analysisQuerySchema = z.object({
  response: responseKey.optional(),
  model: modelParam,
  alpha: z.coerce.number({ message: "alpha is a number" }).gt(0, "alpha is above 0").lt(1, "alpha is below 1").optional(),
  hierarchy: flag("hierarchy").transform((v) => v ?? true),
  transform: z.enum(["none", "ln"], { message: "transform is none or ln" }).default("none"),
  /** Where the optimum is looked for: the cube of the factor ranges (default) or the design's sphere. */
  region: z.enum(["cube", "sphere"], { message: "region is cube or sphere" }).default("cube"),
  /** Other responses optimised together with `response` through their desirability (the study's goals), comma-separated. */
  combine: z
    .string()
    .max(400)
    .optional()
    .transform((v) => [...new Set((v ?? "").split(",").map((s) => s.trim()).filter(Boolean))])
    .pipe(z.array(responseKey).max(10, "at most 10 responses")),
});
export type AnalysisQuery = z.output<typeof analysisQuerySchema>;

/** `GET /studies/{study}/analysis?plans=a,b&…`: the plan query plus the plans to analyse together. */
export const studyAnalysisQuerySchema = analysisQuerySchema.extend({
  plans: z
    .string({ message: "name the plans, comma-separated" })
    .transform((v) => [...new Set(v.split(",").map((s) => s.trim()).filter(Boolean))])
    .pipe(z.array(uuid("must be a plan id")).min(1, "name at least one plan").max(20, "at most 20 plans")),
});
export type StudyAnalysisQuery = z.output<typeof studyAnalysisQuerySchema>;

/** Sliders and axes of a surface: `x`, `y` (factor names), `xRange`/`yRange` ("from,to" in natural units), `hold` ("name:value,…"), `steps`. */
const numberPair = (name: string) =>
  z
    .string()
    .max(100)
    .optional()
    .transform((v, ctx): [number, number] | undefined => {
      if (v === undefined || v.trim() === "") return undefined;
      const parts = v.split(",").map((s) => s.trim());
      const nums = parts.map((s) => (s === "" ? NaN : Number(s)));
      if (nums.length !== 2 || nums.some((n) => !Number.isFinite(n)) || !(nums[0]! < nums[1]!)) {
        ctx.addIssue({ code: "custom", message: `${name} is "from,to" in natural units with from < to` });
        return z.NEVER;
      }
      return [nums[0]!, nums[1]!];
    });

/** The largest surface grid the routes compute (points per axis). */
export const SURFACE_MAX_STEPS = 151;

const surfaceParams = (defaultSteps: number) => ({
  x: z.string().max(100).optional(),
  y: z.string().max(100).optional(),
  xRange: numberPair("xRange"),
  yRange: numberPair("yRange"),
  hold: z
    .string()
    .max(2000)
    .optional()
    .transform((v, ctx): Record<string, number> => {
      const out: Record<string, number> = {};
      for (const part of (v ?? "").split(",").map((s) => s.trim()).filter(Boolean)) {
        const i = part.lastIndexOf(":");
        const name = i > 0 ? part.slice(0, i).trim() : "";
        const raw = i > 0 ? part.slice(i + 1).trim() : "";
        const value = raw === "" ? NaN : Number(raw);
        if (!name || !Number.isFinite(value)) {
          ctx.addIssue({ code: "custom", path: name ? [name] : [], message: `hold is "factor:value,…" with finite numbers (got "${part.slice(0, 60)}")` });
          continue;
        }
        out[name] = value;
      }
      return out;
    }),
  steps: z.coerce.number({ message: "steps is a number" }).int("steps is a whole number").min(11, "at least 11 points per axis").max(SURFACE_MAX_STEPS, `at most ${SURFACE_MAX_STEPS} points per axis`).default(defaultSteps),
});

/** `GET /plans/{plan}/analysis/surface?…`: the analysis query plus the surface's axes and sliders. */
export const surfaceQuerySchema = analysisQuerySchema.extend(surfaceParams(41));
export type SurfaceQuery = z.output<typeof surfaceQuerySchema>;

/** `GET /studies/{study}/analysis/surface?plans=a,b&…`. */
export const studySurfaceQuerySchema = studyAnalysisQuerySchema.extend(surfaceParams(41));

/** `GET /plans/{plan}/analysis-report.pdf?…`: the analysis query plus the contour's axes and sliders (defaults: the two strongest factors, the others at the optimum). */
export const reportQuerySchema = analysisQuerySchema.extend(surfaceParams(61));
export const studyReportQuerySchema = studyAnalysisQuerySchema.extend(surfaceParams(61));
export type ReportQuery = z.output<typeof reportQuerySchema>;

/** The analysis a JSON body refers to (the analysis query's parameters; `model` a name, terms comma-separated, or a list of terms). */
const analysisBodyShape = {
  response: responseKey.optional(),
  model: z
    .union([z.string().max(4000), z.array(text(200).min(1, "name the term")).min(1, "name at least one term").max(60, "at most 60 terms")], { message: "a model name or a list of terms" })
    .optional()
    .transform((v) => (Array.isArray(v) ? v : modelParam.parse(v))),
  alpha: z.number({ message: "alpha is a number (or null: nothing pruned)" }).gt(0, "alpha is above 0").lt(1, "alpha is below 1").nullable().optional(),
  hierarchy: z.boolean({ message: "hierarchy is true or false" }).default(true),
  transform: z.enum(["none", "ln"], { message: "transform is none or ln" }).default("none"),
  region: z.enum(["cube", "sphere"], { message: "region is cube or sphere" }).default("cube"),
  combine: z.array(responseKey, { message: "a list of response names" }).max(10, "at most 10 responses").default([]),
};

/** The analysis query of a JSON body of `analysisBodyShape`. */
export function analysisQueryOfBody(v: Omit<AnalysisQuery, "alpha" | "combine"> & { alpha?: number | null; combine: string[] }): AnalysisQuery {
  return {
    ...(v.response !== undefined ? { response: v.response } : {}),
    model: v.model,
    ...(typeof v.alpha === "number" ? { alpha: v.alpha } : {}),
    hierarchy: v.hierarchy,
    transform: v.transform,
    region: v.region,
    combine: [...new Set(v.combine)],
  };
}

/** The most replicate runs a confirmation plan takes. */
export const MAX_CONFIRMATION_REPLICATES = 24;

/**
 * `POST /plans/{plan}/confirmation` (CONTRACT.md): `{ response, replicates: 3 }` — the
 * analysis whose optimum is confirmed (the analysis query's parameters; default as the
 * analysis route), the replicate runs, settable steps per factor name in natural units
 * (overriding the defaults by unit; 0 = not rounded), and a name for the new plan.
 */
export const confirmationRequestSchema = z.object({
  ...analysisBodyShape,
  replicates: z.number({ message: "replicates is a whole number" }).int("replicates is a whole number").min(1, "at least 1 replicate").max(MAX_CONFIRMATION_REPLICATES, `at most ${MAX_CONFIRMATION_REPLICATES} replicates`).default(3),
  steps: z
    .record(text(100).min(1), z.number({ message: "a step is a number" }).finite("a step is a finite number").min(0, "a step is zero (not rounded) or positive"), { message: "give the steps as { factor: step }" })
    .optional(),
  name: text(300).min(1, "name the plan").optional(),
});
export type ConfirmationRequest = z.input<typeof confirmationRequestSchema>;
