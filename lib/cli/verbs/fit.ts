/** The `fit` verb (the README): runs and a model in, estimates, ANOVA, diagnostics and the canonical analysis out. */
import { fitResponseSurface } from "../../surface";

export function run(input: unknown): unknown {
  return fitResponseSurface(input).output;
}
