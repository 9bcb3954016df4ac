import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
import { renderStudyAnalysisReport } from "@/lib/results/server/render-study-analysis-report";

type Ctx = { params: Promise<{ lab: string; studyId: string }> };

/** `?plans=a,b&…` → the analysis report of the plans analysed together, as a PDF. */
export const GET = route(async (req, { params }: Ctx) => {
  const p = await params;
  const { lab } = await requireLabAccess(p.lab, "plans.read");
  const { pdf, filename } = await renderStudyAnalysisReport({ labId: lab.id, studyId: p.studyId, query: Object.fromEntries(new URL(req.url).searchParams) });
  return new Response(new Uint8Array(pdf), { headers: { "content-type": "application/pdf", "content-disposition": `attachment; filename="${filename}"`, "cache-control": "no-store" } });
});
