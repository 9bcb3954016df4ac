/**
 * `optimizeResponse`: the CONTRACT.md `optimize` verb as a library function. Fits the
 * model (as `fit`), then finds the best conditions in the cube, in the design's sphere,
 * and under linear constraints on natural values; with several responses, maximises
 * the Derringer–Suich overall desirability. Reports the prediction with confidence
 * and prediction intervals, the factors at a limit, and warnings (optimum on the
 * boundary, outside the studied range, a yield predicted above 100 %).
 */
import { z } from "zod";
import { AppError, parseOrThrow } from "../errors/app-error";
import { constraintInCoded, constraintSchema, parseConstraints } from "../doe/constraints";
import { decodeValue } from "../doe/factors";
import { seededRng } from "../doe/randomize";
import { checkRuns, fitFields, type FitInput } from "../stats/fit-schema";
import { fitParsed } from "../stats/fit";
import type { FittedModel } from "../stats/fitted-model";
import { predictAt, predictModelScale } from "../stats/predict";
import { modelSpecSchema } from "../stats/model-terms";
import { quadraticParts } from "./canonical";
import { desirability, desirabilitySpecSchema, overallDesirability } from "./desirability";
import { inRegion, maximizeQuadraticInBall, maximizeQuadraticInCube, multiStartMaximize, type Quadratic, type Region } from "./solvers";

const responseSpecSchema = z.intersection(
  desirabilitySpecSchema,
  z.object({ model: modelSpecSchema.optional(), transform: z.enum(["none", "ln"]).optional() }),
);

/** The `optimize` input (CONTRACT.md): the `fit` input plus goal, region, constraints and added fields. */
export const optimizeInputSchema = z
  .object({
    ...fitFields,
    goal: z.enum(["maximize", "minimize"]).default("maximize"),
    region: z.enum(["cube", "sphere"]).default("cube"),
    /** Sphere radius in coded units (default: the farthest design point from the centre). */
    radius: z.number().positive().finite().optional(),
    constraints: z.array(constraintSchema).optional(),
    /** The response's unit; "%" enables the above-100 % warning. */
    responseUnit: z.string().optional(),
    /** Several responses: maximise the Derringer–Suich overall desirability. */
    responses: z.array(responseSpecSchema).min(1).optional(),
    seed: z.number().int().optional(),
  })
  .superRefine((d, ctx) => {
    const names = d.responses ? d.responses.map((r) => r.name) : [d.responseName];
    checkRuns(d, ctx, names);
    d.responses?.forEach((r, i) => {
      if (r.transform === "ln")
        d.runs.forEach((run, j) => {
          const y = run.responses?.[r.name];
          if (y !== undefined && !(y > 0)) ctx.addIssue({ code: "custom", path: ["runs", j, "responses", r.name], message: "must be positive for the ln transform" });
        });
      if (d.responses!.findIndex((o) => o.name === r.name) !== i) ctx.addIssue({ code: "custom", path: ["responses", i, "name"], message: "repeats another response" });
    });
  });

export type OptimizeInput = z.output<typeof optimizeInputSchema>;

export interface ResponseAtOptimum {
  name: string;
  predicted: number;
  ci95: [number, number] | null;
  pi95: [number, number] | null;
  desirability: number;
}

/** The CONTRACT.md `optimize` output, with added fields. */
export interface OptimizeOutput {
  coded: Record<string, number>;
  natural: Record<string, number>;
  predicted: number;
  ci95: [number, number] | null;
  pi95: [number, number] | null;
  onBoundary: string[];
  warnings: string[];
  region: "cube" | "sphere";
  radius: number | null;
  activeConstraints: string[];
  method: "faces" | "trust-region" | "multi-start";
  /** Overall desirability (several responses), else null. */
  desirability: number | null;
  /** Per-response predictions at the optimum (several responses), else null. */
  responses: ResponseAtOptimum[] | null;
}

const YIELD_LIKE = /yield|conversion|assay|purity|selectivity|recovery/i;

function quadraticOf(model: FittedModel, sign: 1 | -1): Quadratic | null {
  const k = model.factors.length;
  const parts = quadraticParts(model.terms, model.coefficients, k);
  if (!parts) return null;
  return { c: sign * parts.b0, g: parts.b.map((v) => sign * v), H: parts.B.map((r) => r.map((v) => sign * v)) };
}

/**
 * Optimises the fitted response (CONTRACT.md `optimize`). Validates the input; throws
 * an invalid-input AppError naming the field, or an "infeasible" AppError when the
 * constraints leave no point of the region.
 */
export function optimizeResponse(raw: unknown): OptimizeOutput {
  const input = parseOrThrow(optimizeInputSchema, raw, "The optimize input is not valid.");
  const factors = input.factors;
  const names = factors.map((f) => f.name);
  const k = names.length;
  const constraints = parseConstraints(input.constraints, factors);
  const halfSpaces = constraints.map((c, i) => {
    const h = constraintInCoded(c, factors);
    if (!h) throw AppError.field(`constraints.${i}.expr`, "constraints on log-scale factors are not supported by optimize");
    return h;
  });

  // Fit each response.
  const specs = input.responses;
  const fits = (specs ?? [null]).map((spec) => {
    const fi: FitInput = { ...input, model: spec?.model ?? input.model, transform: spec?.transform ?? input.transform };
    return fitParsed(fi, spec ? spec.name : input.responseName).model;
  });
  const first = fits[0]!;
  const radius = input.region === "sphere" ? (input.radius ?? Math.max(...first.codedRuns.map((x) => Math.sqrt(x.reduce((s, v) => s + v * v, 0))))) : null;
  if (radius !== null && !(radius > 0)) throw AppError.field("radius", "the design has no point away from the centre; give a radius");
  const region: Region = { kind: input.region, radius: radius ?? 1, halfSpaces };
  const rng = seededRng(input.seed ?? 1);
  const seeds = first.codedRuns;

  let x: number[];
  let method: OptimizeOutput["method"] = "multi-start";
  if (!specs) {
    const sign = input.goal === "maximize" ? 1 : -1;
    const q = quadraticOf(first, sign);
    const obj = { f: (p: readonly number[]) => sign * predictModelScale(first, p) };
    let exact: number[] | null = null;
    if (q && halfSpaces.length === 0) {
      if (input.region === "cube" && k <= 10) {
        exact = maximizeQuadraticInCube(q).x;
        method = "faces";
      } else if (input.region === "sphere") {
        exact = maximizeQuadraticInBall(q, region.radius).x;
        method = "trust-region";
      }
    }
    if (exact) x = exact;
    else {
      const extra: number[][] = [];
      if (q && input.region === "cube" && k <= 10) extra.push(maximizeQuadraticInCube(q).x);
      if (q && input.region === "sphere") extra.push(maximizeQuadraticInBall(q, region.radius).x);
      x = runMulti(obj, region, [...extra, ...seeds], rng);
    }
  } else {
    const obj = {
      f: (p: readonly number[]) =>
        overallDesirability(
          specs,
          fits.map((m) => (m.transform === "ln" ? Math.exp(predictModelScale(m, p)) : predictModelScale(m, p))),
        ),
    };
    x = runMulti(obj, region, seeds, rng);
  }
  for (let i = 0; i < k; i++) if (Object.is(x[i], -0)) x[i] = 0;

  const coded = Object.fromEntries(names.map((n, i) => [n, x[i]!]));
  const natural = Object.fromEntries(names.map((n, i) => [n, decodeValue(factors[i]!, x[i]!)]));
  const pred = predictAt(first, x);
  const warnings: string[] = [];
  const onBoundary: string[] = [];
  if (input.region === "cube") {
    factors.forEach((f, i) => {
      if (Math.abs(x[i]!) >= 1 - 1e-6) {
        onBoundary.push(f.name);
        warnings.push(`The optimum has ${f.name} at its ${x[i]! > 0 ? "high" : "low"} limit (${natural[f.name]}${f.unit ? " " + f.unit : ""}): the best conditions may lie beyond the studied range.`);
      }
    });
  } else {
    const r = Math.sqrt(x.reduce((s, v) => s + v * v, 0));
    if (r >= region.radius * (1 - 1e-6)) {
      onBoundary.push(...names);
      warnings.push(`The optimum lies on the surface of the design's sphere (radius ${region.radius} in coded units): the best conditions may lie beyond it.`);
    }
  }
  const activeConstraints = constraints.filter((c, i) => {
    const h = halfSpaces[i]!;
    const ax = h.a.reduce((s, a, j) => s + a * x[j]!, 0);
    return ax >= h.b - 1e-6 * (1 + Math.abs(h.b));
  }).map((c) => c.expr);
  for (const c of activeConstraints) warnings.push(`The optimum sits on the constraint "${c}".`);
  // Outside the studied range of the runs.
  factors.forEach((f, i) => {
    const col = first.codedRuns.map((r) => r[i]!);
    const lo = Math.min(...col);
    const hi = Math.max(...col);
    if (x[i]! < lo - 1e-9 || x[i]! > hi + 1e-9) {
      warnings.push(`${f.name} = ${natural[f.name]} lies outside the range of the runs (${decodeValue(f, lo)} to ${decodeValue(f, hi)}): an extrapolation.`);
    }
  });
  const percentLike = (name: string | undefined, unit: string | undefined) => unit === "%" || (name !== undefined && YIELD_LIKE.test(name));
  const checkPercent = (name: string | undefined, unit: string | undefined, value: number) => {
    if (!percentLike(name, unit)) return;
    const label = name ?? "the response";
    if (value > 100) warnings.push(`The predicted ${label} (${value}) is above 100 %: the model extrapolates beyond what is physically possible.`);
    if (value < 0) warnings.push(`The predicted ${label} (${value}) is below 0 %.`);
  };
  let responses: ResponseAtOptimum[] | null = null;
  let D: number | null = null;
  if (specs) {
    responses = specs.map((s, i) => {
      const pr = predictAt(fits[i]!, x);
      checkPercent(s.name, undefined, pr.predicted);
      return { name: s.name, predicted: pr.predicted, ci95: pr.ci95, pi95: pr.pi95, desirability: desirability(s, pr.predicted) };
    });
    D = overallDesirability(specs, responses.map((r) => r.predicted));
    if (D === 0) warnings.push("No point of the region makes every response acceptable (overall desirability 0).");
  } else checkPercent(input.responseName, input.responseUnit, pred.predicted);
  if (!inRegion(region, x, 1e-6)) warnings.push("The optimiser could not keep the point inside the region exactly.");

  return {
    coded,
    natural,
    predicted: pred.predicted,
    ci95: pred.ci95,
    pi95: pred.pi95,
    onBoundary,
    warnings,
    region: input.region,
    radius,
    activeConstraints,
    method,
    desirability: D,
    responses,
  };
}

function runMulti(obj: { f: (p: readonly number[]) => number }, region: Region, seeds: readonly (readonly number[])[], rng: () => number): number[] {
  try {
    return multiStartMaximize(obj, region, seeds, rng).x;
  } catch {
    throw new AppError("infeasible", "No point of the region satisfies the constraints.", [{ path: "constraints", message: "leave no feasible point in the region" }]);
  }
}
