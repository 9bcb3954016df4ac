/** The `optimize` verb (the README): the fit input plus a goal and region in, the best conditions out. */
import { optimizeResponse } from "../../surface";

export function run(input: unknown): unknown {
  return optimizeResponse(input);
}
