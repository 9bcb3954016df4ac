/**
 * Each run's vial position, from the one vial-map rule (lib/plans/vial-map.ts) the plan
 * page, the prep sheet and the worklist use, so a results file can be mapped by the
 * positions written on the vials. Null when the plan names no block.
 */
import { BLOCK_FORMATS, vialMap, type VialMapRun } from "../plans/vial-map";

/** Run number → vial ("B3", or "2:B3" with several blocks); empty without a block of a known format. */
export function vialsOf(runs: readonly VialMapRun[], positions: number | undefined): Map<number, string> {
  if (positions === undefined || !(positions in BLOCK_FORMATS) || runs.length === 0) return new Map();
  return new Map(vialMap(runs, { positions }).placements.map((p) => [p.run, p.vial]));
}
