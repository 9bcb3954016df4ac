import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
import { renderPlanAnalysisReport } from "@/lib/results/server/render-plan-analysis-report";

type Ctx = { params: Promise<{ lab: string; planId: string }> };

/** The analysis query (and the contour's `x`, `y`, `hold`, …) → the analysis report as a PDF. */
export const GET = route(async (req, { params }: Ctx) => {
  const p = await params;
  const { lab } = await requireLabAccess(p.lab, "plans.read");
  const { pdf, filename } = await renderPlanAnalysisReport({ labId: lab.id, planId: p.planId, query: Object.fromEntries(new URL(req.url).searchParams) });
  return new Response(new Uint8Array(pdf), { headers: { "content-type": "application/pdf", "content-disposition": `attachment; filename="${filename}"`, "cache-control": "no-store" } });
});
