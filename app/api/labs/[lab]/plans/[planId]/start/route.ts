import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
import { actionPermission } from "@/lib/plans/actions";
import { startPlan } from "@/lib/plans/server/start-plan";

type Ctx = { params: Promise<{ lab: string; planId: string }> };

/** `POST` (no body) → `{ plan }`: released → running (the bench has started). */
export const POST = route(
  async (_req, { params }: Ctx) => {
    const p = await params;
    const access = await requireLabAccess(p.lab, actionPermission("start"));
    return { plan: await startPlan({ labId: access.lab.id, actorUserId: access.userId, planId: p.planId }) };
  },
  { body: "none" },
);
