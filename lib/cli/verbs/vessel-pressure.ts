/**
 * `vessel-pressure` verb (the README): solvent system, temperatures and
 * volumes of one sealed vessel in; `totalBar`, `vaporBar`, `airBar`, `gasBar`,
 * `fillFractionHot` and `cautions` out (absolute pressures).
 */
import { vesselPressure } from "../../hazards/vessel-pressure";

export function run(input: unknown): unknown {
  return vesselPressure(input);
}
