import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { actionPermission } from "@/lib/plans/actions";
import { serverEnv } from "@/lib/server/env";
import { reviewPlan } from "@/lib/plans/server/review-plan";

type Ctx = { params: Promise<{ lab: string; planId: string }> };

/**
 * `{ decision: approve | request_changes | reject, comment, password }` → `{ plan }` with its
 * signature; 403 for the plan's author or a role without review rights; 422 naming
 * `password` when it is wrong.
 */
export const POST = route(async (req, { params }: Ctx) => {
  const p = await params;
  // Every decision takes the same permission (lib/plans/states.ts).
  const access = await requireLabAccess(p.lab, actionPermission("approve"));
  return { plan: await reviewPlan({ labId: access.lab.id, actorUserId: access.userId, planId: p.planId, input: await readJson(req), appUrl: serverEnv().APP_URL }) };
});
