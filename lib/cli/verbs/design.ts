/** The `design` verb (the README): a design input in, the runs of the design out. */
import { generateDesign } from "../../doe";

export function run(input: unknown): unknown {
  return generateDesign(input);
}
