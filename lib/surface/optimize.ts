/**
 * The optimum of fitted response surfaces: `findOptimum` finds the best conditions in
 * the cube or the design's sphere, under linear constraints on natural values and
 * inside the safe envelope (a safety callback: no point where a blocking caution fires
 * is ever returned); with several responses it maximises the Derringer–Suich overall
 * desirability. It reports the prediction with confidence and prediction intervals,
 * the factors at a limit, and warnings (optimum on the boundary, at the edge of the
 * safe envelope, outside the studied range, a yield predicted above 100 %).
 * `optimizeResponse` is the CONTRACT.md `optimize` verb: it fits (as `fit`), then calls
 * `findOptimum`.
 */
import { z } from "zod";
import { AppError, parseOrThrow } from "../errors/app-error";
import { constraintInCoded, constraintSchema, parseConstraints, type LinearConstraint } from "../doe/constraints";
import { decodeValue } from "../doe/factors";
import { blockingAt, type BlockingCaution, type SafetyCheck } from "../doe/safe-envelope";
import { seededRng } from "../doe/randomize";
import { checkRuns, fitFields, type FitInput } from "../stats/fit-schema";
import { fitParsed } from "../stats/fit";
import type { FittedModel } from "../stats/fitted-model";
import { predictAt, predictModelScale } from "../stats/predict";
import { modelSpecSchema } from "../stats/model-terms";
import { quadraticParts } from "./canonical";
import { desirability, desirabilitySpecSchema, overallDesirability, type DesirabilitySpec } from "./desirability";
import { maximizeWithFeasibility } from "./safe-search";
import { outsideStudied, studiedRanges } from "./studied-region";
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
    const excluded = new Set(d.exclude.map((e) => e.index));
    d.responses?.forEach((r, i) => {
      if (r.transform === "ln")
        d.runs.forEach((run, j) => {
          if (excluded.has(j)) return;
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

/** How the optimum relates to the safe envelope. */
export interface OptimumSafety {
  /** Whether a safety check was given. */
  checked: boolean;
  /** The blocking cautions at the best point of the region without the envelope; empty when that point is safe. */
  blockedWithoutEnvelope: BlockingCaution[];
  /** The optimum sits at the envelope's edge: a step toward the best unrestricted point is blocked. */
  onEnvelopeEdge: boolean;
  /** Safety checks evaluated. */
  checks: number;
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
  method: "faces" | "trust-region" | "multi-start" | "safe-search";
  /** Overall desirability (several responses), else null. */
  desirability: number | null;
  /** Per-response predictions at the optimum (several responses), else null. */
  responses: ResponseAtOptimum[] | null;
  safety: OptimumSafety;
}

/** What to optimise: one fitted response, or several through their overall desirability. */
export type OptimumTarget =
  | { kind: "response"; model: FittedModel; goal: "maximize" | "minimize"; name?: string; unit?: string }
  | { kind: "desirability"; responses: { spec: DesirabilitySpec; model: FittedModel; unit?: string }[] };

/** Where to look. */
export interface OptimumOptions {
  /** The cube [−1, 1]^k (default) or the design's sphere. */
  region?: "cube" | "sphere";
  /** Sphere radius in coded units (default: the farthest run from the centre). */
  radius?: number;
  /** Linear constraints on natural values (lib/doe/constraints.ts), e.g. the lab's limits. */
  constraints?: readonly LinearConstraint[];
  /** The safe envelope: the optimum is never a point where this reports a blocking caution. */
  safety?: SafetyCheck;
  /** Seed of the random starts (default 1). */
  seed?: number;
}

const YIELD_LIKE = /yield|conversion|assay|purity|selectivity|recovery/i;

function quadraticOf(model: FittedModel, sign: 1 | -1): Quadratic | null {
  const k = model.factors.length;
  const parts = quadraticParts(model.terms, model.coefficients, k);
  if (!parts) return null;
  return { c: sign * parts.b0, g: parts.b.map((v) => sign * v), H: parts.B.map((r) => r.map((v) => sign * v)) };
}

const valueOf = (m: FittedModel, p: readonly number[]) => (m.transform === "ln" ? Math.exp(predictModelScale(m, p)) : predictModelScale(m, p));

/**
 * The best conditions for fitted models (all over the same factors) inside the region,
 * the constraints and the safe envelope. Without an envelope (or when the best point is
 * safe) a quadratic's optimum is exact (face enumeration in the cube, trust region in
 * the sphere; multi-start projected gradient with constraints or desirability); when
 * the best point is blocked, the best safe point is searched for by feasible-direction
 * ascent (lib/surface/safe-search.ts). Throws an "infeasible" AppError when the
 * constraints leave no point of the region (path `constraints`) or no sampled point of
 * the region is safe (path `safety`), and an invalid-input AppError for a constraint on
 * a log-scale factor or a sphere with no radius.
 * Example: findOptimum({ kind: "response", model, goal: "maximize" }, { region: "cube", safety })
 */
export function findOptimum(target: OptimumTarget, options: OptimumOptions = {}): OptimizeOutput {
  const models = target.kind === "response" ? [target.model] : target.responses.map((r) => r.model);
  const first = models[0]!;
  const factors = first.factors;
  const names = factors.map((f) => f.name);
  const k = names.length;
  const regionKind = options.region ?? "cube";
  const constraints = options.constraints ?? [];
  const halfSpaces = constraints.map((c, i) => {
    const h = constraintInCoded(c, factors);
    if (!h) throw AppError.field(`constraints.${i}.expr`, "constraints on log-scale factors are not supported by optimize");
    return h;
  });
  const radius = regionKind === "sphere" ? (options.radius ?? Math.max(...first.codedRuns.map((x) => Math.sqrt(x.reduce((s, v) => s + v * v, 0))))) : null;
  if (radius !== null && !(radius > 0)) throw AppError.field("radius", "the design has no point away from the centre; give a radius");
  const region: Region = { kind: regionKind, radius: radius ?? 1, halfSpaces };
  const rng = seededRng(options.seed ?? 1);
  const seeds = first.codedRuns;

  let obj: { f: (p: readonly number[]) => number };
  let x: number[];
  let method: OptimizeOutput["method"] = "multi-start";
  if (target.kind === "response") {
    const sign = target.goal === "maximize" ? 1 : -1;
    const q = quadraticOf(first, sign);
    obj = { f: (p) => sign * predictModelScale(first, p) };
    let exact: number[] | null = null;
    if (q && halfSpaces.length === 0) {
      if (regionKind === "cube" && k <= 10) {
        exact = maximizeQuadraticInCube(q).x;
        method = "faces";
      } else if (regionKind === "sphere") {
        exact = maximizeQuadraticInBall(q, region.radius).x;
        method = "trust-region";
      }
    }
    if (exact) x = exact;
    else {
      const extra: number[][] = [];
      if (q && regionKind === "cube" && k <= 10) extra.push(maximizeQuadraticInCube(q).x);
      if (q && regionKind === "sphere") extra.push(maximizeQuadraticInBall(q, region.radius).x);
      x = runMulti(obj, region, [...extra, ...seeds], rng);
    }
  } else {
    const specs = target.responses.map((r) => r.spec);
    obj = { f: (p) => overallDesirability(specs, models.map((m) => valueOf(m, p))) };
    x = runMulti(obj, region, seeds, rng);
  }

  const warnings: string[] = [];
  const safety: OptimumSafety = { checked: Boolean(options.safety), blockedWithoutEnvelope: [], onEnvelopeEdge: false, checks: 0 };
  if (options.safety) {
    const check = options.safety;
    const blocked0 = blockingAt(check, factors, x);
    safety.checks = 1;
    if (blocked0.length > 0) {
      safety.blockedWithoutEnvelope = blocked0;
      const unrestricted = [...x];
      let found;
      try {
        found = maximizeWithFeasibility(obj, region, (p) => blockingAt(check, factors, p).length === 0, seeds, rng);
      } catch {
        throw new AppError("infeasible", "No point of the studied region is free of blocking cautions.", [
          { path: "safety", message: `every point tried is blocked (${blocked0.map((c) => c.code).join(", ")} at the best point)` },
        ]);
      }
      x = found.x;
      method = "safe-search";
      safety.checks += found.checks;
      if (found.budgetSpent) warnings.push("The search of the safe envelope used its whole budget of safety checks: a slightly better safe point may exist.");
      // On the edge: a short step toward the best unrestricted point is blocked.
      const d = Math.sqrt(unrestricted.reduce((s, v, i) => s + (v - x[i]!) ** 2, 0));
      const h = Math.min(0.02, d);
      const probe = x.map((v, i) => v + (h * (unrestricted[i]! - v)) / (d || 1));
      const beyond = blockingAt(check, factors, probe);
      safety.checks++;
      safety.onEnvelopeEdge = beyond.length > 0;
      const codes = (cs: BlockingCaution[]) => cs.map((c) => `${c.code} (${c.message})`).join("; ");
      warnings.push(`The best conditions of the region lie outside the safe envelope: ${codes(blocked0)}. The optimum shown is the best point inside it.`);
      if (safety.onEnvelopeEdge) warnings.push(`The optimum sits at the edge of the safe envelope: just beyond it ${codes(beyond)}.`);
    }
    if (blockingAt(check, factors, x).length > 0) throw new AppError("internal", "The optimiser returned a point outside the safe envelope.");
  }
  for (let i = 0; i < k; i++) if (Object.is(x[i], -0)) x[i] = 0;

  const coded = Object.fromEntries(names.map((n, i) => [n, x[i]!]));
  const natural = Object.fromEntries(names.map((n, i) => [n, decodeValue(factors[i]!, x[i]!)]));
  const pred = predictAt(first, x);
  const onBoundary: string[] = [];
  if (regionKind === "cube") {
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
  const activeConstraints = constraints
    .filter((_, i) => {
      const h = halfSpaces[i]!;
      const ax = h.a.reduce((s, a, j) => s + a * x[j]!, 0);
      return ax >= h.b - 1e-6 * (1 + Math.abs(h.b));
    })
    .map((c) => c.expr);
  for (const c of activeConstraints) warnings.push(`The optimum sits on the constraint "${c}".`);
  const ranges = studiedRanges(first);
  for (const i of outsideStudied(ranges, x)) {
    const f = factors[i]!;
    warnings.push(`${f.name} = ${natural[f.name]} lies outside the range of the runs (${decodeValue(f, ranges[i]!.lo)} to ${decodeValue(f, ranges[i]!.hi)}): an extrapolation.`);
  }
  const percentLike = (name: string | undefined, unit: string | undefined) => unit === "%" || (name !== undefined && YIELD_LIKE.test(name));
  const checkPercent = (name: string | undefined, unit: string | undefined, value: number) => {
    if (!percentLike(name, unit)) return;
    const label = name ?? "the response";
    if (value > 100) warnings.push(`The predicted ${label} (${value}) is above 100 %: the model extrapolates beyond what is physically possible.`);
    if (value < 0) warnings.push(`The predicted ${label} (${value}) is below 0 %.`);
  };
  let responses: ResponseAtOptimum[] | null = null;
  let D: number | null = null;
  if (target.kind === "desirability") {
    const specs = target.responses.map((r) => r.spec);
    responses = target.responses.map((r) => {
      const pr = predictAt(r.model, x);
      checkPercent(r.spec.name, r.unit, pr.predicted);
      return { name: r.spec.name, predicted: pr.predicted, ci95: pr.ci95, pi95: pr.pi95, desirability: desirability(r.spec, pr.predicted) };
    });
    D = overallDesirability(specs, responses.map((r) => r.predicted));
    if (D === 0) warnings.push("No point of the region makes every response acceptable (overall desirability 0).");
  } else checkPercent(target.name, target.unit, pred.predicted);
  if (!inRegion(region, x, 1e-6)) warnings.push("The optimiser could not keep the point inside the region exactly.");

  return {
    coded,
    natural,
    predicted: pred.predicted,
    ci95: pred.ci95,
    pi95: pred.pi95,
    onBoundary,
    warnings,
    region: regionKind,
    radius,
    activeConstraints,
    method,
    desirability: D,
    responses,
    safety,
  };
}

/**
 * Optimises the fitted response (CONTRACT.md `optimize`): fits each response as `fit`
 * does, then `findOptimum`. Validates the input; throws an invalid-input AppError
 * naming the field, or an "infeasible" AppError when the constraints leave no point of
 * the region.
 */
export function optimizeResponse(raw: unknown): OptimizeOutput {
  const input = parseOrThrow(optimizeInputSchema, raw, "The optimize input is not valid.");
  const constraints = parseConstraints(input.constraints, input.factors);
  const specs = input.responses;
  const fitOf = (spec: (typeof specs & object)[number] | null) => {
    const fi: FitInput = { ...input, model: spec?.model ?? input.model, transform: spec?.transform ?? input.transform };
    return fitParsed(fi, spec ? spec.name : input.responseName).model;
  };
  const target: OptimumTarget = specs
    ? { kind: "desirability", responses: specs.map((spec) => ({ spec, model: fitOf(spec) })) }
    : { kind: "response", model: fitOf(null), goal: input.goal, name: input.responseName, unit: input.responseUnit };
  return findOptimum(target, { region: input.region, radius: input.radius, constraints, seed: input.seed });
}

function runMulti(obj: { f: (p: readonly number[]) => number }, region: Region, seeds: readonly (readonly number[])[], rng: () => number): number[] {
  try {
    return multiStartMaximize(obj, region, seeds, rng).x;
  } catch {
    throw new AppError("infeasible", "No point of the region satisfies the constraints.", [{ path: "constraints", message: "leave no feasible point in the region" }]);
  }
}
