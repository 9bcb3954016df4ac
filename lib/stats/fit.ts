/**
 * Response-surface model fitting (PRODUCT.md "Model fit"; Montgomery, Design and
 * Analysis of Experiments, ch. 10 and 11; Myers, Montgomery & Anderson-Cook, Response
 * Surface Methodology, ch. 2): ordinary least squares by column-scaled QR in coded
 * units; per-term estimate, standard error, t, p, 95 % interval; R², adjusted R²,
 * predicted R² from PRESS, RMSE; ANOVA with lack of fit against pure error; the
 * curvature test from centre points; backward elimination respecting hierarchy;
 * residual diagnostics. Canonical analysis of a second-order fit is the caller's
 * (lib/surface/response-surface.ts): statistics does not depend on the surface engine.
 */
import { Matrix } from "ml-matrix";
import { AppError, parseOrThrow } from "../errors/app-error";
import { codeValue, decodeValue } from "../doe/factors";
import type { FittedModel } from "./fitted-model";
import { predictAt } from "./predict";
import { fitInputSchema, type FitInput } from "./fit-schema";
import { fUpperP, tQuantile, tTwoSidedP } from "./distributions";
import { fullFitOfSubset, leastSquaresQR, refitSubset, type LeastSquaresFit } from "./least-squares";
import { buildTerms, modelRow, termContains, type Term } from "./model-terms";

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
  p: number;
  dfResidual: number;
  rmse: number | null;
  r2: number | null;
  adjR2: number | null;
  predR2: number | null;
  press: number | null;
}

export interface Diagnostic {
  run: number;
  observed: number;
  fitted: number;
  residual: number;
  leverage: number;
  studentized: number | null;
  cooksDistance: number | null;
}

export interface CurvatureTest {
  ss: number;
  df: 1;
  f: number | null;
  p: number | null;
  meanFactorial: number;
  meanCenter: number;
  nFactorial: number;
  nCenter: number;
}

/** The CONTRACT.md `fit` output with added fields. */
export interface FitOutput {
  terms: TermEstimate[];
  dropped: string[];
  aliased: string[];
  stats: FitStats;
  anova: {
    model: AnovaRow;
    residual: AnovaRow;
    lackOfFit: AnovaRow | null;
    pureError: AnovaRow | null;
    total: { df: number; ss: number };
  };
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

/** The coded matrix of the runs (rows in the order given) and the responses. */
export function codedRunsOf(input: Pick<FitInput, "factors" | "runs">, responseName?: string): { X: number[][]; y: number[] } {
  const X = input.runs.map((r, i) =>
    input.factors.map((f) => {
      if (r.coded) return r.coded[f.name]!;
      const v = r.natural![f.name]!;
      if (f.scale === "log" && !(v > 0)) throw AppError.field(`runs.${i}.natural.${f.name}`, "must be positive for a log-scale factor");
      return codeValue(f, v);
    }),
  );
  const y = input.runs.map((r) => (responseName !== undefined ? (r.responses?.[responseName] ?? r.response)! : r.response!));
  return { X, y };
}

/** Groups identical design points (coded values equal to 1e-9): sorts rows, then scans. */
function groupPoints(X: readonly number[][]): number[][] {
  const idx = X.map((_, i) => i);
  const k = X[0]?.length ?? 0;
  const cmp = (a: number, b: number) => {
    for (let j = 0; j < k; j++) {
      const d = X[a]![j]! - X[b]![j]!;
      if (Math.abs(d) > 1e-9) return d;
    }
    return 0;
  };
  idx.sort(cmp);
  const groups: number[][] = [];
  for (const i of idx) {
    const last = groups[groups.length - 1];
    if (last && cmp(last[0]!, i) === 0) last.push(i);
    else groups.push([i]);
  }
  return groups;
}

/** Pure-error sum of squares from replicated points: Σ over groups of Σ(y − ȳ_g)², df = n − groups. */
export function pureError(X: readonly number[][], y: readonly number[]): { ss: number; df: number; groups: number } {
  const groups = groupPoints(X);
  let ss = 0;
  for (const g of groups) {
    const m = g.reduce((a, i) => a + y[i]!, 0) / g.length;
    for (const i of g) ss += (y[i]! - m) ** 2;
  }
  return { ss, df: X.length - groups.length, groups: groups.length };
}

/**
 * Curvature test of a two-level design with centre points (Montgomery §6.8):
 * SS = n_F·n_C·(ȳ_F − ȳ_C)²/(n_F + n_C) on 1 df, against the pure error of the centre
 * points (df n_C − 1). Null without factorial (all ±1) points or without centre points.
 */
export function curvatureTest(X: readonly number[][], y: readonly number[]): CurvatureTest | null {
  const fac: number[] = [];
  const cen: number[] = [];
  X.forEach((x, i) => {
    if (x.every((v) => Math.abs(Math.abs(v) - 1) < 1e-9)) fac.push(y[i]!);
    else if (x.every((v) => Math.abs(v) < 1e-9)) cen.push(y[i]!);
  });
  if (fac.length === 0 || cen.length === 0) return null;
  const mF = fac.reduce((a, b) => a + b, 0) / fac.length;
  const mC = cen.reduce((a, b) => a + b, 0) / cen.length;
  const ss = (fac.length * cen.length * (mF - mC) ** 2) / (fac.length + cen.length);
  let f: number | null = null;
  let p: number | null = null;
  if (cen.length >= 2) {
    const msPe = cen.reduce((a, v) => a + (v - mC) ** 2, 0) / (cen.length - 1);
    if (msPe > 0) {
      f = ss / msPe;
      p = fUpperP(f, 1, cen.length - 1);
    }
  }
  return { ss, df: 1, f, p, meanFactorial: mF, meanCenter: mC, nFactorial: fac.length, nCenter: cen.length };
}

function modelMatrix(terms: readonly Term[], X: readonly number[][]): Matrix {
  const M = new Matrix(X.length, terms.length);
  const row = new Float64Array(terms.length);
  X.forEach((x, i) => {
    modelRow(terms, x, row);
    for (let j = 0; j < terms.length; j++) M.set(i, j, row[j]!);
  });
  return M;
}

/** p-values closer than this count as tied in backward elimination. */
export const P_TIE_TOLERANCE = 1e-9;

/**
 * Backward elimination at level α (Montgomery §10.3): repeatedly drops the term with
 * the largest p-value above α; with `hierarchy`, a term stays while a higher-order
 * term containing it (a*b or a^2 for a) is in the model. The intercept always stays.
 * Ties: p-values within P_TIE_TOLERANCE (1e-9) of the largest count as equal, and of
 * those the term latest in model order leaves first (so the choice never rests on the
 * last digit of rounding). Works on the full fit's factorisation (p-row subproblems).
 * `terms` are the fit's kept terms; returns indices into them: kept, and dropped in
 * the order dropped.
 */
export function backwardEliminate(full: LeastSquaresFit, terms: readonly Term[], alpha: number, hierarchy: boolean): { kept: number[]; dropped: number[] } {
  const n = full.fitted.length;
  let active = terms.map((_, j) => j);
  const dropped: number[] = [];
  for (;;) {
    const df = n - active.length;
    if (df <= 0) break;
    const fit = refitSubset(full, active);
    const s2 = fit.rss / df;
    const candidates: { j: number; p: number }[] = [];
    active.forEach((j, a) => {
      const t = terms[j]!;
      if (t.exponents.every((e) => e === 0)) return;
      if (hierarchy && active.some((o) => o !== j && termContains(terms[o]!, t))) return;
      const se = Math.sqrt(s2 * fit.covUnscaled[a]![a]!);
      const p = se > 0 ? tTwoSidedP(fit.coefficients[a]! / se, df) : 0;
      if (p > alpha) candidates.push({ j, p });
    });
    if (candidates.length === 0) break;
    const maxP = Math.max(...candidates.map((c) => c.p));
    const worst = Math.max(...candidates.filter((c) => c.p >= maxP - P_TIE_TOLERANCE).map((c) => c.j));
    dropped.push(worst);
    active = active.filter((j) => j !== worst);
  }
  return { kept: active, dropped };
}

/**
 * Fits the model of an already parsed `fit` input. Returns the CONTRACT.md output and
 * the fitted model for prediction. Throws an invalid-input AppError (path `runs`)
 * when there are fewer runs than estimable terms.
 */
export function fitParsed(input: FitInput, responseName = input.responseName): { output: FitOutput; model: FittedModel } {
  const factors = input.factors;
  const names = factors.map((f) => f.name);
  const allTerms = buildTerms(input.model, names);
  const { X: Xc, y: yRaw } = codedRunsOf(input, responseName);
  const y = input.transform === "ln" ? yRaw.map(Math.log) : yRaw;
  const n = y.length;
  const warnings: string[] = [];
  if (n < allTerms.length) {
    throw new AppError("invalid_input", `${n} runs are too few for a model of ${allTerms.length} terms.`, [
      { path: "runs", message: `at least ${allTerms.length} runs are needed for this model (${n} given)` },
    ]);
  }
  const Xfull = modelMatrix(allTerms, Xc);
  // Aliased (inestimable) terms, in model order: later terms aliased with earlier ones.
  const first = leastSquaresQR(Xfull, y);
  const aliased = first.aliased.map((j) => allTerms[j]!.name);
  if (aliased.length) warnings.push(`Not estimable from these runs (aliased with earlier terms): ${aliased.join(", ")}.`);
  let terms = first.kept.map((j) => allTerms[j]!);
  let fit = first;
  const dropped: string[] = [];
  if (input.prune) {
    if (n - terms.length <= 0) warnings.push("No residual degrees of freedom: the model cannot be pruned by p-values.");
    else {
      const be = backwardEliminate(first, terms, input.prune.alpha, input.prune.hierarchy);
      dropped.push(...be.dropped.map((j) => terms[j]!.name));
      if (be.dropped.length) {
        fit = fullFitOfSubset(first, be.kept, y);
        terms = be.kept.map((j) => terms[j]!);
      }
    }
  }
  const p = terms.length;
  const dfRes = n - p;
  const s2 = dfRes > 0 ? fit.rss / dfRes : null;
  const tq = dfRes > 0 ? tQuantile(0.975, dfRes) : null;
  const termsOut: TermEstimate[] = terms.map((t, j) => {
    const est = fit.coefficients[j]!;
    if (s2 === null || tq === null) return { term: t.name, estimate: est, stdError: null, t: null, p: null, ci95: null };
    const se = Math.sqrt(s2 * fit.covUnscaled[j]![j]!);
    const tv = se > 0 ? est / se : null;
    return { term: t.name, estimate: est, stdError: se, t: tv, p: tv === null ? null : tTwoSidedP(tv, dfRes), ci95: [est - tq * se, est + tq * se] };
  });
  const mean = y.reduce((a, b) => a + b, 0) / n;
  const sst = y.reduce((a, v) => a + (v - mean) ** 2, 0);
  const hasIntercept = terms.some((t) => t.exponents.every((e) => e === 0));
  const ssModel = Math.max(sst - fit.rss, 0);
  const dfModel = p - (hasIntercept ? 1 : 0);
  const msRes = s2;
  const msModel = dfModel > 0 ? ssModel / dfModel : null;
  const fModel = msModel !== null && msRes !== null && msRes > 0 ? msModel / msRes : null;
  const pe = pureError(Xc, y);
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
      run: i + 1,
      observed: y[i]!,
      fitted: fit.fitted[i]!,
      residual: e,
      leverage: h,
      studentized: stud,
      cooksDistance: stud === null ? null : (stud * stud * h) / (p * (1 - h)),
    });
  }
  const r2 = sst > 0 ? 1 - fit.rss / sst : null;
  const stats: FitStats = {
    n,
    p,
    dfResidual: dfRes,
    rmse: s2 === null ? null : Math.sqrt(s2),
    r2,
    adjR2: r2 !== null && dfRes > 0 ? 1 - (fit.rss / dfRes) / (sst / (n - 1)) : null,
    predR2: press !== null && sst > 0 ? 1 - press / sst : null,
    press,
  };
  const output: FitOutput = {
    terms: termsOut,
    dropped,
    aliased,
    stats,
    anova: {
      model: { df: dfModel, ss: ssModel, ms: msModel, f: fModel, p: fModel === null ? null : fUpperP(fModel, dfModel, dfRes) },
      residual: { df: dfRes, ss: fit.rss, ms: msRes },
      lackOfFit,
      pureError: pureErr,
      total: { df: n - 1, ss: sst },
    },
    curvature: curvatureTest(Xc, y),
    transform: input.transform,
    diagnostics,
    predictions: [],
    warnings,
  };
  const model: FittedModel = {
    factors,
    terms,
    coefficients: fit.coefficients,
    covUnscaled: fit.covUnscaled,
    s2,
    dfResidual: dfRes,
    transform: input.transform,
    codedRuns: Xc,
    observed: yRaw,
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
