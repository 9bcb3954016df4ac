import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
import { actionPermission } from "@/lib/plans/actions";
import { serverEnv } from "@/lib/server/env";
import { submitPlan } from "@/lib/plans/server/submit-plan";

type Ctx = { params: Promise<{ lab: string; planId: string }> };

/** `POST` (no body) → `{ plan }`: draft | changes_requested → in_review; 409 while any caution blocks; e-mails the safety officers. */
export const POST = route(
  async (_req, { params }: Ctx) => {
    const p = await params;
    const access = await requireLabAccess(p.lab, actionPermission("submit"));
    return { plan: await submitPlan({ labId: access.lab.id, actorUserId: access.userId, planId: p.planId, appUrl: serverEnv().APP_URL }) };
  },
  { body: "none" },
);
