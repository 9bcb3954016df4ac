import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { excludeRun } from "@/lib/results/server/exclude-run";
import { getResults } from "@/lib/results/server/get-results";

type Ctx = { params: Promise<{ lab: string; planId: string }> };

/** `{ exclusions }`: the runs left out of the plan's analysis, with their reasons. */
export const GET = route(async (_req, { params }: Ctx) => {
  const p = await params;
  const { lab } = await requireLabAccess(p.lab, "plans.read");
  return { exclusions: (await getResults({ labId: lab.id, planId: p.planId })).exclusions };
});

/** `{ run, response?, reason }` → 201 `{ exclusion }`: the run is left out of the analysis. */
export const POST = route(async (req, { params }: Ctx) => {
  const p = await params;
  const access = await requireLabAccess(p.lab, "plans.execute");
  return Response.json({ exclusion: await excludeRun({ labId: access.lab.id, actorUserId: access.userId, planId: p.planId, input: await readJson(req) }) }, { status: 201 });
});
