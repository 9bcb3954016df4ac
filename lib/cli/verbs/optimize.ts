/** The `optimize` verb (CONTRACT.md): the fit input plus a goal and region in, the best conditions out. */
import { optimizeResponse } from "../../surface";

export function run(input: unknown): unknown {
  return optimizeResponse(input);
}
