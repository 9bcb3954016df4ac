/** The `fit` verb (the README): runs and a model in, estimates, ANOVA and diagnostics out. */
import { fitModel } from "../../stats";

export function run(input: unknown): unknown {
  return fitModel(input);
}
