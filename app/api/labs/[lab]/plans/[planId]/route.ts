import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { deletePlan } from "@/lib/plans/server/delete-plan";
import { getPlan, planResponse } from "@/lib/plans/server/get-plan";
import { updatePlan } from "@/lib/plans/server/update-plan";

type Ctx = { params: Promise<{ lab: string; planId: string }> };

/** `{ plan }`: the document, run sheet, cautions and the values they were computed with. */
export const GET = route(async (_req, { params }: Ctx) => {
  const p = await params;
  const { lab } = await requireLabAccess(p.lab, "plans.read");
  return planResponse(await getPlan({ labId: lab.id, planId: p.planId }));
});

/** `{ document, version }` → `{ plan }`; 409 naming `version` when stale. */
export const PUT = route(async (req, { params }: Ctx) => {
  const p = await params;
  const access = await requireLabAccess(p.lab, "plans.edit");
  return { plan: await updatePlan({ labId: access.lab.id, actorUserId: access.userId, planId: p.planId, input: await readJson(req) }) };
});

/** Deletes a draft (`?version=` optional) → `{ deleted: id }`; 409 for any other state. */
export const DELETE = route(async (req, { params }: Ctx) => {
  const p = await params;
  const access = await requireLabAccess(p.lab, "plans.edit");
  const input = Object.fromEntries(new URL(req.url).searchParams);
  const { id } = await deletePlan({ labId: access.lab.id, actorUserId: access.userId, planId: p.planId, input });
  return { deleted: id };
}, { body: "none" });
