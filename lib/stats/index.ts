/** The statistics engine's public API: model terms, least squares, fitting, distributions. */
export { buildTerms, parseTerm, termName, termValue, modelRow, termContains, isSquareTerm, termDegree, modelSpecSchema, type Term, type ModelSpec } from "./model-terms";
export { leastSquaresQR, findAliasedColumns, scaledQr, refitSubset, fullFitOfSubset, ALIAS_TOLERANCE, type LeastSquaresFit, type ScaledQr } from "./least-squares";
export { tQuantile, tTwoSidedP, fQuantile, fUpperP } from "./distributions";
export { fitInputSchema, observedRunSchema, pruneSchema, predictPointSchema, type FitInput, type FitInputRaw } from "./fit-schema";
export {
  fitModel,
  fitModelWithPredictor,
  fitParsed,
  backwardEliminate,
  pureError,
  curvatureTest,
  codedRunsOf,
  type FitOutput,
  type FittedModel,
  type TermEstimate,
  type AnovaRow,
  type FitStats,
  type Diagnostic,
  type CanonicalOutput,
  type CurvatureTest,
  type PointPrediction,
} from "./fit";
