import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
import { renderPlanPrepSheet } from "@/lib/plans/server/plan-sheets";

type Ctx = { params: Promise<{ lab: string; planId: string }> };

/** The plan's prep sheet (application/pdf), as the plan is now; 409 when it has no run sheet. */
export const GET = route(async (_req, { params }: Ctx) => {
  const p = await params;
  const { lab } = await requireLabAccess(p.lab, "plans.read");
  const { filename, pdf } = await renderPlanPrepSheet({ labId: lab.id, planId: p.planId });
  return new Response(new Uint8Array(pdf), {
    headers: { "content-type": "application/pdf", "content-disposition": `attachment; filename="${filename}"`, "cache-control": "private, no-store" },
  });
});
