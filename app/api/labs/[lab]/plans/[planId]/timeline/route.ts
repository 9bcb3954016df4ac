import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
import { getPlanTimeline } from "@/lib/plans/server/get-plan-timeline";

type Ctx = { params: Promise<{ lab: string; planId: string }> };

/** `{ timeline: [{ id, at, kind, actor, title, changes: [{ field, label, before, after }] }] }`, oldest first. */
export const GET = route(async (_req, { params }: Ctx) => {
  const p = await params;
  const { lab } = await requireLabAccess(p.lab, "plans.read");
  return { timeline: await getPlanTimeline({ labId: lab.id, planId: p.planId }) };
});
