/**
 * The D-criterion of a design and the D-efficiency of one design relative to another
 * (Atkinson, Donev & Tobias, Optimum Experimental Designs, with SAS, 2007, ch. 10–11,
 * from memory): for a model with p terms and a design of n runs with model matrix X,
 *     D-efficiency = 100·|X'X|^(1/p)/n   (in %, coded units),
 * and the efficiency of design A relative to design B is the ratio of their
 * information per run,
 *     eff(A, B) = (|X_A'X_A|/n_A^p ÷ |X_B'X_B|/n_B^p)^(1/p)
 *               = exp((ln|X_A'X_A| − ln|X_B'X_B|)/p)·n_B/n_A,
 * so 0.9 means A needs about 1/0.9 times B's runs for the same precision of the
 * coefficients (in the sense of the generalised variance). Both designs must be coded
 * the same way (the same factor ranges) for the ratio to mean anything.
 */
import { buildTerms, type ModelSpec, type Term } from "../stats/model-terms";
import { candidateMatrix, informationMatrix, logDetSpd } from "./d-optimal";
import { codeValue, type Factor } from "./factors";

/** ln |X'X| of coded points for the model terms (−Infinity when X'X is singular). */
export function designLogDet(terms: readonly Term[], points: readonly (readonly number[])[]): number {
  const p = terms.length;
  if (points.length === 0) return -Infinity;
  const F = candidateMatrix(terms, points);
  return logDetSpd(informationMatrix(F, p, Array.from(points, (_, i) => i)), p);
}

/**
 * D-efficiency in %: 100·|X'X|^(1/p)/n for coded points (0 when X'X is singular).
 * Example: the 2² factorial for intercept, a, b, ab has X'X = 4I, so 100·4/4 = 100.
 */
export function dEfficiency(terms: readonly Term[], points: readonly (readonly number[])[]): number {
  const ld = designLogDet(terms, points);
  return Number.isFinite(ld) ? (100 * Math.exp(ld / terms.length)) / points.length : 0;
}

/**
 * The D-efficiency of design A relative to design B for the model terms, per run
 * (formula above); both as coded points in one coding. 0 when A cannot estimate the
 * model; null when B cannot (there is nothing to compare with).
 * Example: relativeDEfficiency(terms, faceCentred, rotatable) — 1 means as informative per run.
 */
export function relativeDEfficiency(terms: readonly Term[], a: readonly (readonly number[])[], b: readonly (readonly number[])[]): number | null {
  const lb = designLogDet(terms, b);
  if (!Number.isFinite(lb)) return null;
  const la = designLogDet(terms, a);
  if (!Number.isFinite(la)) return 0;
  return (Math.exp((la - lb) / terms.length) * b.length) / a.length;
}

/** A run given by its natural factor values. */
export interface NaturalRun {
  natural: Readonly<Record<string, number>>;
}

/**
 * `relativeDEfficiency` for runs in natural units: both designs are coded with the same
 * `factors` (normally the original design's ranges) and the model is built from
 * `model` (as in the `fit` verb). Throws an invalid-input AppError for a model term that
 * names no factor, or a non-positive value of a log-scale factor.
 */
export function relativeDEfficiencyOfRuns(
  factors: readonly Factor[],
  model: ModelSpec,
  a: readonly NaturalRun[],
  b: readonly NaturalRun[],
): number | null {
  const terms = buildTerms(model, factors.map((f) => f.name));
  const code = (runs: readonly NaturalRun[]) => runs.map((r) => factors.map((f) => codeValue(f, r.natural[f.name]!)));
  return relativeDEfficiency(terms, code(a), code(b));
}
