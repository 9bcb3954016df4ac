/** The surface engine's public API: the `fit` verb with canonical analysis, optimisation, desirability, grids. */
export { fitResponseSurface, canonicalOfModel, type SurfaceFitOutput, type CanonicalOutput } from "./response-surface";
export {
  canonicalAnalysis,
  describeCanonical,
  quadraticParts,
  RIDGE_TOLERANCE,
  type CanonicalCoded,
  type CanonicalDirection,
  type CanonicalWords,
  type RidgeKind,
  type SurfaceKind,
} from "./canonical";
export { desirability, overallDesirability, desirabilitySpecSchema, type DesirabilitySpec } from "./desirability";
export {
  maximizeQuadraticInCube,
  maximizeQuadraticInBall,
  multiStartMaximize,
  projectedGradientAscent,
  projectOntoRegion,
  compassSearch,
  inRegion,
  evalQuadratic,
  type Quadratic,
  type Region,
  type Objective,
} from "./solvers";
export {
  optimizeResponse,
  findOptimum,
  optimizeInputSchema,
  type OptimizeInput,
  type OptimizeOutput,
  type OptimumTarget,
  type OptimumOptions,
  type OptimumSafety,
  type ResponseAtOptimum,
} from "./optimize";
export { maximizeWithFeasibility, type SafeSearchOptions, type SafeSearchResult } from "./safe-search";
export { surfaceGrid, type SurfaceGrid, type SurfaceGridOptions, type GridCaution } from "./grid";
export { studiedRanges, outsideStudied } from "./studied-region";
export {
  planConfirmation,
  confirmationHolds,
  predictMeanOf,
  DEFAULT_SETTABLE_STEPS,
  type ConfirmationOptions,
  type ConfirmationPlan,
  type ConfirmationVerdict,
  type MeanPrediction,
} from "./confirmation";
export { steepestAscent, type SteepestAscentOptions, type SteepestAscentPath, type PathPoint } from "./steepest-ascent";
