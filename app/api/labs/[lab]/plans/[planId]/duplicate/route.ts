import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { duplicatePlan } from "@/lib/plans/server/duplicate-plan";

type Ctx = { params: Promise<{ lab: string; planId: string }> };

/** `{ name? }` (or no body) → 201 `{ plan }`, a new draft derived from this plan. */
export const POST = route(async (req, { params }: Ctx) => {
  const p = await params;
  const access = await requireLabAccess(p.lab, "plans.edit");
  const hasBody = (req.headers.get("content-length") ?? "0") !== "0" || req.body !== null;
  const input = hasBody ? await readJson(req).catch(() => ({})) : {};
  return Response.json({ plan: await duplicatePlan({ labId: access.lab.id, actorUserId: access.userId, planId: p.planId, input }) }, { status: 201 });
});
