import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
import { renderPlanWorklist } from "@/lib/plans/server/plan-sheets";

type Ctx = { params: Promise<{ lab: string; planId: string }> };

/** The plan's dispense worklist (text/csv, one row per dispense step); 409 when it has no run sheet. */
export const GET = route(async (_req, { params }: Ctx) => {
  const p = await params;
  const { lab } = await requireLabAccess(p.lab, "plans.read");
  const { filename, csv } = await renderPlanWorklist({ labId: lab.id, planId: p.planId });
  return new Response(csv, {
    headers: { "content-type": "text/csv; charset=utf-8", "content-disposition": `attachment; filename="${filename}"`, "cache-control": "private, no-store" },
  });
});
