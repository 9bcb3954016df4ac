/** The surface engine's public API: the `fit` verb with canonical analysis, optimisation, desirability, grids. */
export { fitResponseSurface, canonicalOfModel, type SurfaceFitOutput, type CanonicalOutput } from "./response-surface";
export { canonicalAnalysis, quadraticParts, RIDGE_TOLERANCE, type CanonicalCoded, type SurfaceKind } from "./canonical";
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
export { optimizeResponse, optimizeInputSchema, type OptimizeInput, type OptimizeOutput, type ResponseAtOptimum } from "./optimize";
export { surfaceGrid, type SurfaceGrid, type SurfaceGridOptions } from "./grid";
