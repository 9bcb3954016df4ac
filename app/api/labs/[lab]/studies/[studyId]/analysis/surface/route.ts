import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
import { getStudySurface } from "@/lib/results/server/get-study-surface";

type Ctx = { params: Promise<{ lab: string; studyId: string }> };

/** `?plans=a,b&…` plus the surface's axes and sliders → `{ surface }` of the plans analysed together. */
export const GET = route(async (req, { params }: Ctx) => {
  const p = await params;
  const { lab } = await requireLabAccess(p.lab, "plans.read");
  return { surface: await getStudySurface({ labId: lab.id, studyId: p.studyId, query: Object.fromEntries(new URL(req.url).searchParams) }) };
});
