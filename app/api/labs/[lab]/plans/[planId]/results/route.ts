import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { RESULTS_BODY_LIMIT } from "@/lib/results/schemas";
import { getResults } from "@/lib/results/server/get-results";
import { putResults } from "@/lib/results/server/put-results";

type Ctx = { params: Promise<{ lab: string; planId: string }> };

/** `{ results }`: every cell with who entered it and when, what is missing, the runs left out. */
export const GET = route(async (_req, { params }: Ctx) => {
  const p = await params;
  const { lab } = await requireLabAccess(p.lab, "plans.read");
  return { results: await getResults({ labId: lab.id, planId: p.planId }) };
});

/** `{ runs: [{ run, responses: { yield: 72.1 } }] }` or `{ csv, mapping? }` → `{ plan, results, warnings, changed }`. */
export const PUT = route(async (req, { params }: Ctx) => {
  const p = await params;
  const access = await requireLabAccess(p.lab, "plans.execute");
  return putResults({ labId: access.lab.id, actorUserId: access.userId, planId: p.planId, input: await readJson(req) });
}, { maxBytes: RESULTS_BODY_LIMIT });
