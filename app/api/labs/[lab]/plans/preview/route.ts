import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { previewPlan } from "@/lib/plans/server/preview-plan";

type Ctx = { params: Promise<{ lab: string }> };

/** `{ document }` → `{ preview }`: the run sheet and cautions of an unsaved plan document. Writes nothing. */
export const POST = route(async (req, { params }: Ctx) => {
  const { lab } = await requireLabAccess((await params).lab, "plans.read");
  return { preview: await previewPlan({ labId: lab.id, input: await readJson(req) }) };
});
