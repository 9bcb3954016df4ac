import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
import { actionPermission } from "@/lib/plans/actions";
import { serverEnv } from "@/lib/server/env";
import { releasePlan } from "@/lib/plans/server/release-plan";

type Ctx = { params: Promise<{ lab: string; planId: string }> };

/** `POST` (no body) → `{ plan }` with its reservations; 409 when a caution blocks, sign-off is required without a valid signature, or stock is short (then the body also has `shortfalls`). */
export const POST = route(
  async (_req, { params }: Ctx) => {
    const p = await params;
    const access = await requireLabAccess(p.lab, actionPermission("release"));
    return { plan: await releasePlan({ labId: access.lab.id, actorUserId: access.userId, planId: p.planId, appUrl: serverEnv().APP_URL }) };
  },
  { body: "none" },
);
