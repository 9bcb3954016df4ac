import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
import { actionPermission } from "@/lib/plans/actions";
import { cancelPlan } from "@/lib/plans/server/cancel-plan";

type Ctx = { params: Promise<{ lab: string; planId: string }> };

/** `POST` (no body) → `{ plan }`: cancelled from any state before running; its held reservations are released. */
export const POST = route(
  async (_req, { params }: Ctx) => {
    const p = await params;
    const access = await requireLabAccess(p.lab, actionPermission("cancel"));
    return { plan: await cancelPlan({ labId: access.lab.id, actorUserId: access.userId, planId: p.planId }) };
  },
  { body: "none" },
);
