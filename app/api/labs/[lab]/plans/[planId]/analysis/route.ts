import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
import { analyzePlan } from "@/lib/results/server/analyze-plan";

type Ctx = { params: Promise<{ lab: string; planId: string }> };

/** `?response=&model=&alpha=&hierarchy=&transform=` → the `fit` verb's output plus `optimum` and `analysis`. */
export const GET = route(async (req, { params }: Ctx) => {
  const p = await params;
  const { lab } = await requireLabAccess(p.lab, "plans.read");
  return analyzePlan({ labId: lab.id, planId: p.planId, query: Object.fromEntries(new URL(req.url).searchParams) });
});
