import "server-only";
import type { Transaction } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import { surfaceOfSources, type SurfaceAnswer } from "../surface";
import { surfaceQuerySchema } from "../schemas";
import { planAnalysisSources } from "./read-analysis-sources";

/**
 * The response surface of a plan's analysis (`GET /plans/{plan}/analysis/surface?…`): the
 * analysis query's model over two factors (`x`, `y`; default the two strongest), the others
 * held (`hold=name:value,…`; default their centre), axes `xRange`/`yRange` (default the
 * range of the runs; may run past it), `steps` points per axis; the safe envelope evaluated
 * at every point. Reads only.
 * @throws AppError invalid_input naming the query parameter, not_found.
 */
export async function getPlanSurface(opts: { labId: string; planId: string; query: unknown }, t?: Transaction): Promise<SurfaceAnswer> {
  const query = parseOrThrow(surfaceQuerySchema, opts.query, "The surface request is not valid.");
  const s = await planAnalysisSources(opts, t);
  return surfaceOfSources(s.sources, s.responses, query, s.envelope);
}
