import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { createConfirmationPlan } from "@/lib/results/server/create-confirmation-plan";

type Ctx = { params: Promise<{ lab: string; planId: string }> };

/** `{ response, replicates: 3, model?, alpha?, hierarchy?, transform?, steps?, name? }` → 201 `{ plan, confirmation }`: a draft at the rounded optimum. */
export const POST = route(async (req, { params }: Ctx) => {
  const p = await params;
  const access = await requireLabAccess(p.lab, "plans.edit");
  const body = await readJson(req);
  const made = await createConfirmationPlan({ labId: access.lab.id, actorUserId: access.userId, planId: p.planId, input: body === undefined ? {} : body });
  return Response.json(made, { status: 201 });
});
