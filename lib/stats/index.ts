/** The statistics engine's public API: model terms, least squares, fitting, pruning, prediction, distributions. */
export { buildTerms, parseTerm, termName, termValue, modelRow, termContains, isSquareTerm, termDegree, modelSpecSchema, type Term, type ModelSpec } from "./model-terms";
export { leastSquaresQR, leastSquaresColumns, findAliasedColumns, scaledQr, fullFitOfSubset, ALIAS_TOLERANCE, type LeastSquaresFit, type ScaledQr } from "./least-squares";
export { ShrinkingQr } from "./qr-update";
export { tQuantile, tTwoSidedP, fQuantile, fUpperP } from "./distributions";
export { fitInputSchema, observedRunSchema, excludedRunSchema, pruneSchema, predictPointSchema, type FitInput, type FitInputRaw } from "./fit-schema";
export {
  fitModel,
  fitModelWithPredictor,
  fitParsed,
  codedRunsOf,
  type FitOutput,
  type TermEstimate,
  type AnovaRow,
  type FitStats,
  type Diagnostic,
  type PointPrediction,
  type BlockEffect,
  type BlockSummary,
  type ExcludedRun,
} from "./fit";
export { backwardEliminate, P_TIE_TOLERANCE, type EliminationStep, type EliminationResult, type PrunableColumn, type HeldTerm } from "./prune";
export { pureError, curvatureTest, type CurvatureTest } from "./anova";
export { blockCoding, blockSumOfSquares, type BlockCoding } from "./blocks";
export { predictAt, predictModelScale, rowPrediction, type Prediction } from "./predict";
export type { FittedModel } from "./fitted-model";
