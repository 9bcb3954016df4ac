import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
import { restoreRun } from "@/lib/results/server/restore-run";

type Ctx = { params: Promise<{ lab: string; planId: string; exclusionId: string }> };

/** Brings the run back into the analysis (`?reason=` optional) → `{ restored }`. */
export const DELETE = route(async (req, { params }: Ctx) => {
  const p = await params;
  const access = await requireLabAccess(p.lab, "plans.execute");
  const input = Object.fromEntries(new URL(req.url).searchParams);
  return { restored: await restoreRun({ labId: access.lab.id, actorUserId: access.userId, planId: p.planId, exclusionId: p.exclusionId, input }) };
}, { body: "none" });
