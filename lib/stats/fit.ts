/**
 * Response-surface model fitting (PRODUCT.md "Model fit"; Montgomery, Design and
 * Analysis of Experiments, ch. 10 and 11; Myers, Montgomery & Anderson-Cook, Response
 * Surface Methodology, ch. 2): ordinary least squares by column-scaled QR in coded
 * units; per-term estimate, standard error, t, p, 95 % interval; R², adjusted R²,
 * predicted R² from PRESS, RMSE; ANOVA with blocks, lack of fit against pure error;
 * the curvature test from centre points; backward elimination respecting hierarchy,
 * step by step (lib/stats/prune.ts); runs left out with a reason; residual
 * diagnostics. Canonical analysis of a second-order fit is the caller's
 * (lib/surface/response-surface.ts): statistics does not depend on the surface engine.
 */
import { AppError, parseOrThrow } from "../errors/app-error";
import { codeValue, decodeValue } from "../doe/factors";
import { curvatureTest, pureError, type CurvatureTest } from "./anova";
import { blockCoding, blockSumOfSquares, type BlockCoding } from "./blocks";
import { fUpperP, tQuantile, tTwoSidedP } from "./distributions";
import { fitInputSchema, type FitInput } from "./fit-schema";
import type { FittedModel } from "./fitted-model";
import { fullFitOfSubset, leastSquaresColumns, ALIAS_TOLERANCE } from "./least-squares";
import { buildTerms, termValue, type Term } from "./model-terms";
import { predictAt, rowPrediction } from "./predict";
import { backwardEliminate, type EliminationStep, type PrunableColumn } from "./prune";

/** One estimated term (CONTRACT.md `fit` output). Null statistics when no residual df. */
export interface TermEstimate {
  term: string;
  estimate: number;
  stdError: number | null;
  t: number | null;
  p: number | null;
  ci95: [number, number] | null;
}

export interface AnovaRow {
  df: number;
  ss: number;
  ms: number | null;
  f?: number | null;
  p?: number | null;
}

export interface FitStats {
  n: number;
  /** Parameters fitted: the terms, plus B − 1 block columns when blocked. */
  p: number;
  dfResidual: number;
  rmse: number | null;
  r2: number | null;
  adjR2: number | null;
  predR2: number | null;
  press: number | null;
}

export interface Diagnostic {
  /** 1-based position in the input's `runs` (runs left out keep their numbers). */
  run: number;
  /** 0-based index in the input's `runs`. */
  index: number;
  /** The run's block label, null when the fit has no blocks. */
  block: string | null;
  observed: number;
  fitted: number;
  residual: number;
  leverage: number;
  studentized: number | null;
  cooksDistance: number | null;
}

/** One block's effect in sum-to-zero coding: its deviation from the average over blocks. */
export interface BlockEffect {
  label: string;
  runs: number;
  effect: number;
  stdError: number | null;
}

/** The block term of a fit of several plans (or blocks) together. */
export interface BlockSummary {
  /** Sum-to-zero coding: the effects add up to zero and the intercept is the average over blocks. */
  coding: "sum-to-zero";
  effects: BlockEffect[];
}

/** A run left out of the fit, with the reason given and what the fitted model predicts for it. */
export interface ExcludedRun {
  index: number;
  run: number;
  reason: string;
  /** The observed response (original scale), null when the run gave none (a failed run). */
  observed: number | null;
  /** The model's prediction at the run, in its block when that block is in the fit (original scale). */
  predicted: number;
  /** 95 % prediction interval for a new run there, null without residual df. */
  pi95: [number, number] | null;
}

/** The CONTRACT.md `fit` output with added fields. */
export interface FitOutput {
  terms: TermEstimate[];
  dropped: string[];
  aliased: string[];
  stats: FitStats;
  anova: {
    /** Between blocks (entered before the model terms); null without blocks. */
    blocks: AnovaRow | null;
    model: AnovaRow;
    residual: AnovaRow;
    lackOfFit: AnovaRow | null;
    pureError: AnovaRow | null;
    total: { df: number; ss: number };
  };
  blocks: BlockSummary | null;
  /** Backward elimination, step by step; null without `prune`. */
  pruning: { alpha: number; hierarchy: boolean; steps: EliminationStep[] } | null;
  excluded: ExcludedRun[];
  curvature: CurvatureTest | null;
  transform: "none" | "ln";
  diagnostics: Diagnostic[];
  /** Predictions at the requested points (`predict`), original scale. */
  predictions: PointPrediction[];
  warnings: string[];
}

export interface PointPrediction {
  coded: Record<string, number>;
  natural: Record<string, number>;
  predicted: number;
  stdError: number | null;
  ci95: [number, number] | null;
  pi95: [number, number] | null;
}

/**
 * The coded matrix of the runs (rows in the order given) and the responses (NaN where
 * a run gives none, allowed only for runs left out).
 */
export function codedRunsOf(input: Pick<FitInput, "factors" | "runs">, responseName?: string): { X: number[][]; y: number[] } {
  const X = input.runs.map((r, i) =>
    input.factors.map((f) => {
      if (r.coded) return r.coded[f.name]!;
      const v = r.natural![f.name]!;
      if (f.scale === "log" && !(v > 0)) throw AppError.field(`runs.${i}.natural.${f.name}`, "must be positive for a log-scale factor");
      return codeValue(f, v);
    }),
  );
  const y = input.runs.map((r) => (responseName !== undefined ? (r.responses?.[responseName] ?? r.response) : r.response) ?? NaN);
  return { X, y };
}

/** A column of the model matrix: a term of the surface, or one sum-to-zero block column. */
type Column = { kind: "term"; term: Term } | { kind: "block"; block: number; label: string };

function columnValue(c: Column, x: readonly number[], block: number | null, nBlocks: number): number {
  if (c.kind === "term") return termValue(c.term, x);
  if (block === null) return 0;
  return block === nBlocks - 1 ? -1 : block === c.block ? 1 : 0;
}

/** The model matrix, column-major (n × columns). */
function modelMatrix(columns: readonly Column[], X: readonly number[][], coding: BlockCoding): Float64Array {
  const n = X.length;
  const M = new Float64Array(n * columns.length);
  const B = coding.labels.length;
  X.forEach((x, i) => {
    for (let j = 0; j < columns.length; j++) M[j * n + i] = columnValue(columns[j]!, x, coding.blockOf[i]!, B);
  });
  return M;
}

const columnName = (c: Column) => (c.kind === "term" ? c.term.name : `block[${c.label}]`);

function termOf(c: Column): Term {
  if (c.kind !== "term") throw new RangeError("not a term column");
  return c.term;
}

/**
 * Fits the model of an already parsed `fit` input. Returns the CONTRACT.md output and
 * the fitted model for prediction (blocks averaged out). Columns: the intercept, then
 * B − 1 sum-to-zero block columns when the runs carry blocks, then the other terms in
 * model order (so a term confounded with blocks is the one reported aliased). Runs in
 * `exclude` are left out of everything and reported with their reason and prediction.
 * Throws an invalid-input AppError (path `runs`, or `exclude` when the exclusions
 * leave too few runs) when there are fewer runs than columns to estimate.
 */
export function fitParsed(input: FitInput, responseName = input.responseName): { output: FitOutput; model: FittedModel } {
  const factors = input.factors;
  const names = factors.map((f) => f.name);
  const allTerms = buildTerms(input.model, names);
  const { X: XAll, y: yAll } = codedRunsOf(input, responseName);
  const reasons = new Map(input.exclude.map((e) => [e.index, e.reason]));
  const keptIdx = input.runs.map((_, i) => i).filter((i) => !reasons.has(i));
  const Xc = keptIdx.map((i) => XAll[i]!);
  const yRaw = keptIdx.map((i) => yAll[i]!);
  const toModel = (v: number) => (input.transform === "ln" ? Math.log(v) : v);
  const back = (v: number) => (input.transform === "ln" ? Math.exp(v) : v);
  const y = yRaw.map(toModel);
  const n = y.length;
  const blocked = input.runs.some((r) => r.block !== undefined);
  const labelOf = (i: number) => (blocked ? String(input.runs[i]!.block) : null);
  const coding = blockCoding(keptIdx.map(labelOf));
  const B = coding.labels.length;
  const warnings: string[] = [];

  const intercept = allTerms[0]!;
  const columns: Column[] = [
    { kind: "term", term: intercept },
    ...coding.labels.slice(0, -1).map((label, b): Column => ({ kind: "block", block: b, label })),
    ...allTerms.slice(1).map((term): Column => ({ kind: "term", term })),
  ];
  if (n < columns.length) {
    const what = B > 1 ? `${allTerms.length} terms and ${B - 1} block columns` : `${allTerms.length} terms`;
    const path = input.exclude.length > 0 && input.runs.length >= columns.length ? "exclude" : "runs";
    throw new AppError("invalid_input", `${n} runs are too few for a model of ${what}.`, [
      { path, message: `at least ${columns.length} runs are needed for this model (${n} ${path === "exclude" ? "left after the exclusions" : "given"})` },
    ]);
  }
  // Aliased (inestimable) columns, in column order: later columns aliased with earlier ones.
  // One factorisation of the full model; the reported fit (with (X'X)⁻¹ and leverages) is
  // taken from it for the columns that stay, after pruning if asked.
  const first = leastSquaresColumns(modelMatrix(columns, Xc, coding), n, columns.length, y, ALIAS_TOLERANCE, { diagnostics: false });
  const aliased = first.aliased.map((j) => columnName(columns[j]!));
  if (aliased.length) warnings.push(`Not estimable from these runs (aliased with earlier terms${B > 1 ? " or with blocks" : ""}): ${aliased.join(", ")}.`);
  let cols = first.kept.map((j) => columns[j]!);
  let stay = cols.map((_, j) => j);
  const dropped: string[] = [];
  let pruning: FitOutput["pruning"] = null;
  if (input.prune) {
    if (n - cols.length <= 0) warnings.push("No residual degrees of freedom: the model cannot be pruned by p-values.");
    else {
      const prunable: PrunableColumn[] = cols.map((c) => ({
        name: columnName(c),
        term: c.kind === "term" ? c.term : null,
        fixed: c.kind === "block" || c.term === intercept,
      }));
      const be = backwardEliminate(first, prunable, input.prune);
      pruning = { alpha: input.prune.alpha, hierarchy: input.prune.hierarchy, steps: be.steps };
      dropped.push(...be.dropped.map((j) => columnName(cols[j]!)));
      stay = be.kept;
    }
  }
  const fit = fullFitOfSubset(first, stay, y);
  cols = stay.map((j) => cols[j]!);

  const p = cols.length;
  const dfRes = n - p;
  const s2 = dfRes > 0 ? fit.rss / dfRes : null;
  const tq = dfRes > 0 ? tQuantile(0.975, dfRes) : null;
  const termPos = cols.map((c, j) => (c.kind === "term" ? j : -1)).filter((j) => j >= 0);
  const blockPos = cols.map((c, j) => (c.kind === "block" ? j : -1)).filter((j) => j >= 0);
  const termsOut: TermEstimate[] = termPos.map((j) => {
    const name = columnName(cols[j]!);
    const est = fit.coefficients[j]!;
    if (s2 === null || tq === null) return { term: name, estimate: est, stdError: null, t: null, p: null, ci95: null };
    const se = Math.sqrt(s2 * fit.covUnscaled[j]![j]!);
    const tv = se > 0 ? est / se : null;
    return { term: name, estimate: est, stdError: se, t: tv, p: tv === null ? null : tTwoSidedP(tv, dfRes), ci95: [est - tq * se, est + tq * se] };
  });

  // ANOVA: blocks first (between-block SS), then the model terms, then the residual.
  const mean = y.reduce((a, b) => a + b, 0) / n;
  const sst = y.reduce((a, v) => a + (v - mean) ** 2, 0);
  const ssBlocks = B > 1 ? blockSumOfSquares(coding, y) : 0;
  const ssWithin = sst - ssBlocks;
  const ssModel = Math.max(ssWithin - fit.rss, 0);
  const dfModel = termPos.length - 1;
  const msModel = dfModel > 0 ? ssModel / dfModel : null;
  const fModel = msModel !== null && s2 !== null && s2 > 0 ? msModel / s2 : null;
  const pe = pureError(Xc, y, B > 1 ? coding.blockOf : undefined);
  let lackOfFit: AnovaRow | null = null;
  let pureErr: AnovaRow | null = null;
  if (pe.df > 0) {
    const msPe = pe.ss / pe.df;
    pureErr = { df: pe.df, ss: pe.ss, ms: msPe };
    const dfLof = dfRes - pe.df;
    const ssLof = Math.max(fit.rss - pe.ss, 0);
    const msLof = dfLof > 0 ? ssLof / dfLof : null;
    const fLof = msLof !== null && msPe > 0 ? msLof / msPe : null;
    lackOfFit = { df: dfLof, ss: ssLof, ms: msLof, f: fLof, p: fLof === null ? null : fUpperP(fLof, dfLof, pe.df) };
  }

  let press: number | null = 0;
  const diagnostics: Diagnostic[] = [];
  for (let i = 0; i < n; i++) {
    const h = fit.leverage[i]!;
    const e = fit.residuals[i]!;
    if (press !== null) press = h < 1 - 1e-10 ? press + (e / (1 - h)) ** 2 : null;
    const stud = s2 !== null && s2 > 0 && h < 1 - 1e-10 ? e / Math.sqrt(s2 * (1 - h)) : null;
    diagnostics.push({
      run: keptIdx[i]! + 1,
      index: keptIdx[i]!,
      block: B > 1 ? coding.labels[coding.blockOf[i]!]! : null,
      observed: y[i]!,
      fitted: fit.fitted[i]!,
      residual: e,
      leverage: h,
      studentized: stud,
      cooksDistance: stud === null ? null : (stud * stud * h) / (p * (1 - h)),
    });
  }
  // With blocks, R² and its relatives are taken on the variation left after the blocks.
  const r2 = ssWithin > 0 ? 1 - fit.rss / ssWithin : null;
  const stats: FitStats = {
    n,
    p,
    dfResidual: dfRes,
    rmse: s2 === null ? null : Math.sqrt(s2),
    r2,
    adjR2: r2 !== null && dfRes > 0 ? 1 - fit.rss / dfRes / (ssWithin / (n - B)) : null,
    predR2: press !== null && ssWithin > 0 ? 1 - press / ssWithin : null,
    press,
  };

  let blocks: BlockSummary | null = null;
  if (B > 1) {
    const C = fit.covUnscaled;
    const effects: BlockEffect[] = coding.labels.map((label, b) => {
      if (b < B - 1) {
        const j = blockPos[b]!;
        return { label, runs: coding.sizes[b]!, effect: fit.coefficients[j]!, stdError: s2 === null ? null : Math.sqrt(s2 * C[j]![j]!) };
      }
      let v = 0;
      for (const j of blockPos) for (const k of blockPos) v += C[j]![k]!;
      const effect = -blockPos.reduce((acc, j) => acc + fit.coefficients[j]!, 0);
      return { label, runs: coding.sizes[b]!, effect, stdError: s2 === null ? null : Math.sqrt(s2 * v) };
    });
    blocks = { coding: "sum-to-zero", effects };
  }

  // Runs left out: the fitted model's prediction there, in the run's block when that block is in the fit.
  const excluded: ExcludedRun[] = input.exclude.map((e) => {
    const label = labelOf(e.index);
    const b = label === null ? -1 : coding.labels.indexOf(label);
    const f = cols.map((c) => columnValue(c, XAll[e.index]!, b < 0 ? null : b, B));
    const { yhat, q } = rowPrediction(fit.coefficients, fit.covUnscaled, f);
    const half = s2 !== null && tq !== null ? tq * Math.sqrt(s2 * (1 + q)) : null;
    const obs = yAll[e.index]!;
    return {
      index: e.index,
      run: e.index + 1,
      reason: e.reason,
      observed: Number.isFinite(obs) ? obs : null,
      predicted: back(yhat),
      pi95: half === null ? null : [back(yhat - half), back(yhat + half)],
    };
  });
  const orphan = input.exclude.filter((e) => blocked && !coding.labels.includes(labelOf(e.index)!));
  if (orphan.length) warnings.push(`Run${orphan.length > 1 ? "s" : ""} ${orphan.map((e) => e.index + 1).join(", ")} left out belong${orphan.length > 1 ? "" : "s"} to a block with no runs left in the fit: the prediction there averages over the blocks.`);

  const output: FitOutput = {
    terms: termsOut,
    dropped,
    aliased,
    stats,
    anova: {
      blocks: B > 1 ? { df: B - 1, ss: ssBlocks, ms: ssBlocks / (B - 1) } : null,
      model: { df: dfModel, ss: ssModel, ms: msModel, f: fModel, p: fModel === null ? null : fUpperP(fModel, dfModel, dfRes) },
      residual: { df: dfRes, ss: fit.rss, ms: s2 },
      lackOfFit,
      pureError: pureErr,
      total: { df: n - 1, ss: sst },
    },
    blocks,
    pruning,
    excluded,
    curvature: B > 1 ? null : curvatureTest(Xc, y),
    transform: input.transform,
    diagnostics,
    predictions: [],
    warnings,
  };
  const model: FittedModel = {
    factors,
    terms: termPos.map((j) => termOf(cols[j]!)),
    coefficients: termPos.map((j) => fit.coefficients[j]!),
    covUnscaled: termPos.map((i) => termPos.map((j) => fit.covUnscaled[i]![j]!)),
    s2,
    dfResidual: dfRes,
    transform: input.transform,
    codedRuns: Xc,
    observed: yRaw,
    blocks: B > 1 ? coding.labels : [],
  };
  return { output, model };
}

/**
 * Fits a response-surface model (CONTRACT.md `fit`). Validates the input; throws an
 * invalid-input AppError naming the field (e.g. `runs.3.natural.time`), or at `runs`
 * when there are fewer runs than terms.
 * Example: fitModel({ factors, runs, model: "quadratic" }).terms[0].term === "intercept"
 */
export function fitModel(raw: unknown): FitOutput {
  return fitModelWithPredictor(raw).output;
}

/**
 * As `fitModel`, and also returns the fitted model for `predictAt`, `surfaceGrid` and
 * the optimisers (lib/surface). Throws as `fitModel`.
 */
export function fitModelWithPredictor(raw: unknown): { output: FitOutput; model: FittedModel } {
  const input = parseOrThrow(fitInputSchema, raw, "The fit input is not valid.");
  const { output, model } = fitParsed(input);
  output.predictions = (input.predict ?? []).map((pt, i) => {
    const x = input.factors.map((f) => {
      if (pt.coded) return pt.coded[f.name]!;
      const v = pt.natural![f.name]!;
      if (f.scale === "log" && !(v > 0)) throw AppError.field(`predict.${i}.natural.${f.name}`, "must be positive for a log-scale factor");
      return codeValue(f, v);
    });
    const pr = predictAt(model, x);
    return {
      coded: Object.fromEntries(input.factors.map((f, j) => [f.name, x[j]!])),
      natural: Object.fromEntries(input.factors.map((f, j) => [f.name, decodeValue(f, x[j]!)])),
      predicted: pr.predicted,
      stdError: pr.stdError,
      ci95: pr.ci95,
      pi95: pr.pi95,
    };
  });
  return { output, model };
}
