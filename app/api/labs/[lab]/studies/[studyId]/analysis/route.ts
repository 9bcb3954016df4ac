import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
import { analyzeStudy } from "@/lib/results/server/analyze-study";

type Ctx = { params: Promise<{ lab: string; studyId: string }> };

/** `?plans=a,b&response=&model=&alpha=&hierarchy=&transform=` → the plans analysed together with a block term. */
export const GET = route(async (req, { params }: Ctx) => {
  const p = await params;
  const { lab } = await requireLabAccess(p.lab, "plans.read");
  return analyzeStudy({ labId: lab.id, studyId: p.studyId, query: Object.fromEntries(new URL(req.url).searchParams) });
});
