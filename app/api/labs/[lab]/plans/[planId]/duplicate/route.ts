import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { duplicatePlan } from "@/lib/plans/server/duplicate-plan";

type Ctx = { params: Promise<{ lab: string; planId: string }> };

/** `{ name? }` (or no body) → 201 `{ plan }`, a new draft derived from this plan. */
export const POST = route(async (req, { params }: Ctx) => {
  const p = await params;
  const access = await requireLabAccess(p.lab, "plans.edit");
  const body = await readJson(req);
  const input = body === undefined ? {} : body;
  return Response.json({ plan: await duplicatePlan({ labId: access.lab.id, actorUserId: access.userId, planId: p.planId, input }) }, { status: 201 });
});
