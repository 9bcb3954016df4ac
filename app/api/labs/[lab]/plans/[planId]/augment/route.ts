import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { augmentPlan } from "@/lib/plans/server/augment-plan";

type Ctx = { params: Promise<{ lab: string; planId: string }> };

/** `{ alpha?, centerPoints?, name? }` (or no body) → 201 `{ plan, augmentation }`: the axial and centre runs of a central composite design, a new draft. */
export const POST = route(async (req, { params }: Ctx) => {
  const p = await params;
  const access = await requireLabAccess(p.lab, "plans.edit");
  const body = await readJson(req);
  const made = await augmentPlan({ labId: access.lab.id, actorUserId: access.userId, planId: p.planId, input: body === undefined ? {} : body });
  return Response.json(made, { status: 201 });
});
