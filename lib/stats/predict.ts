/**
 * Prediction from a fitted model with confidence and prediction intervals
 * (Montgomery, Design and Analysis of Experiments, §10.6): at x0 with model row f0,
 * ŷ = f0'b, se(ŷ) = s·√(f0'(X'X)⁻¹f0); the 95 % confidence interval on the mean is
 * ŷ ± t(0.975, df)·se(ŷ) and the prediction interval for a new run is
 * ŷ ± t(0.975, df)·s·√(1 + f0'(X'X)⁻¹f0). With the ln transform the interval ends are
 * transformed back (exp), giving intervals on the original scale.
 */
import { tQuantile } from "./distributions";
import type { FittedModel } from "./fitted-model";
import { modelRow } from "./model-terms";

export interface Prediction {
  /** Predicted response on the original scale. */
  predicted: number;
  /** Prediction on the model scale (ln y when transformed). */
  predictedModelScale: number;
  /** Standard error of the fitted mean on the model scale (null without residual df). */
  stdError: number | null;
  ci95: [number, number] | null;
  pi95: [number, number] | null;
}

/** The model's value at coded point x, on the model scale (fast; no intervals). */
export function predictModelScale(model: FittedModel, x: ArrayLike<number>): number {
  let s = 0;
  const row = modelRow(model.terms, x);
  for (let j = 0; j < row.length; j++) s += row[j]! * model.coefficients[j]!;
  return s;
}

/**
 * The fitted value f'b of a model row f and its unscaled variance q = f'(X'X)⁻¹f
 * (clipped at 0 against rounding): se(ŷ) = s·√q, and a new run's se = s·√(1 + q).
 */
export function rowPrediction(coefficients: readonly number[], covUnscaled: readonly (readonly number[])[], f: ArrayLike<number>): { yhat: number; q: number } {
  const p = f.length;
  let yhat = 0;
  let q = 0;
  for (let i = 0; i < p; i++) {
    yhat += f[i]! * coefficients[i]!;
    let s = 0;
    for (let j = 0; j < p; j++) s += covUnscaled[i]![j]! * f[j]!;
    q += f[i]! * s;
  }
  return { yhat, q: Math.max(q, 0) };
}

/** Prediction with 95 % confidence and prediction intervals at coded point x. */
export function predictAt(model: FittedModel, x: ArrayLike<number>): Prediction {
  const { yhat, q } = rowPrediction(model.coefficients, model.covUnscaled, modelRow(model.terms, x));
  const back = (v: number) => (model.transform === "ln" ? Math.exp(v) : v);
  if (model.s2 === null || model.dfResidual <= 0) {
    return { predicted: back(yhat), predictedModelScale: yhat, stdError: null, ci95: null, pi95: null };
  }
  const t = tQuantile(0.975, model.dfResidual);
  const se = Math.sqrt(model.s2 * q);
  const sp = Math.sqrt(model.s2 * (1 + q));
  return {
    predicted: back(yhat),
    predictedModelScale: yhat,
    stdError: se,
    ci95: [back(yhat - t * se), back(yhat + t * se)],
    pi95: [back(yhat - t * sp), back(yhat + t * sp)],
  };
}
