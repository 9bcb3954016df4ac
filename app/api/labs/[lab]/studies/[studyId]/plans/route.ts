import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { createPlan } from "@/lib/plans/server/create-plan";

type Ctx = { params: Promise<{ lab: string; studyId: string }> };

/** `{ document }` → 201 `{ plan }`, a draft of the study. */
export const POST = route(async (req, { params }: Ctx) => {
  const p = await params;
  const access = await requireLabAccess(p.lab, "plans.edit");
  return Response.json({ plan: await createPlan({ labId: access.lab.id, actorUserId: access.userId, studyId: p.studyId, input: await readJson(req) }) }, { status: 201 });
});
