/**
 * The fitted model as the other engines use it: what prediction, surfaces and
 * optimisation need from a fit, in coded units and on the model scale (ln y when the
 * response was transformed).
 */
import type { Factor } from "../doe/factors";
import type { Term } from "./model-terms";

/** A fitted model kept for prediction and optimisation (coded units, model scale). */
export interface FittedModel {
  factors: Factor[];
  terms: Term[];
  coefficients: number[];
  /** (X'X)⁻¹ for the terms. */
  covUnscaled: number[][];
  /** Residual mean square s² (null when dfResidual = 0). */
  s2: number | null;
  dfResidual: number;
  transform: "none" | "ln";
  /** The coded design points, for the design's region. */
  codedRuns: number[][];
  /** The observed responses (original scale) of the runs fitted. */
  observed: number[];
  /**
   * Block labels when several plans were fitted with a block term, else empty. The
   * terms, coefficients and (X'X)⁻¹ here are those of the surface only: block effects
   * are left at zero (sum-to-zero coding), so every prediction averages over the blocks.
   */
  blocks: string[];
}
