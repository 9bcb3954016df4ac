import "server-only";
import type { Transaction } from "sequelize";
import { parseOrThrow } from "@/lib/errors/app-error";
import { surfaceOfSources, type SurfaceAnswer } from "../surface";
import { studySurfaceQuerySchema } from "../schemas";
import { studyAnalysisSources } from "./read-analysis-sources";

/**
 * The response surface of several plans of a study analysed together, as getPlanSurface (`GET /studies/{study}/analysis/surface?plans=a,b&…`;
 * the block effects averaged out, the first plan's envelope).
 * @throws AppError invalid_input naming the query parameter, not_found (the study).
 */
export async function getStudySurface(opts: { labId: string; studyId: string; query: unknown }, t?: Transaction): Promise<SurfaceAnswer> {
  const query = parseOrThrow(studySurfaceQuerySchema, opts.query, "The surface request is not valid.");
  const s = await studyAnalysisSources({ labId: opts.labId, studyId: opts.studyId, plans: query.plans }, t);
  return surfaceOfSources(s.sources, s.responses, query, s.envelope);
}
