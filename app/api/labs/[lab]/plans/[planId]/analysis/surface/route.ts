import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
import { getPlanSurface } from "@/lib/results/server/get-plan-surface";

type Ctx = { params: Promise<{ lab: string; planId: string }> };

/** The analysis query plus `x=&y=&xRange=&yRange=&hold=name:value,…&steps=` → `{ surface }`: the fitted surface and the safe envelope on a grid. */
export const GET = route(async (req, { params }: Ctx) => {
  const p = await params;
  const { lab } = await requireLabAccess(p.lab, "plans.read");
  return { surface: await getPlanSurface({ labId: lab.id, planId: p.planId, query: Object.fromEntries(new URL(req.url).searchParams) }) };
});
