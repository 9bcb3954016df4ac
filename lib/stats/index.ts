/** The statistics engine's public API: model terms, least squares, fitting, prediction, distributions. */
export { buildTerms, parseTerm, termName, termValue, modelRow, termContains, isSquareTerm, termDegree, modelSpecSchema, type Term, type ModelSpec } from "./model-terms";
export { leastSquaresQR, findAliasedColumns, scaledQr, refitSubset, fullFitOfSubset, ALIAS_TOLERANCE, type LeastSquaresFit, type ScaledQr } from "./least-squares";
export { tQuantile, tTwoSidedP, fQuantile, fUpperP } from "./distributions";
export { fitInputSchema, observedRunSchema, pruneSchema, predictPointSchema, type FitInput, type FitInputRaw } from "./fit-schema";
export {
  fitModel,
  fitModelWithPredictor,
  fitParsed,
  backwardEliminate,
  P_TIE_TOLERANCE,
  pureError,
  curvatureTest,
  codedRunsOf,
  type FitOutput,
  type TermEstimate,
  type AnovaRow,
  type FitStats,
  type Diagnostic,
  type CurvatureTest,
  type PointPrediction,
} from "./fit";
export { predictAt, predictModelScale, type Prediction } from "./predict";
export type { FittedModel } from "./fitted-model";
