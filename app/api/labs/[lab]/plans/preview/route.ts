import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { previewInventoryOf, previewPlan } from "@/lib/plans/server/preview-plan";

type Ctx = { params: Promise<{ lab: string }> };

/** `{ document }` → `{ preview }`: the run sheet and cautions of an unsaved plan document. Writes nothing. */
export const POST = route(async (req, { params }: Ctx) => {
  const { lab } = await requireLabAccess((await params).lab, "plans.read");
  return { preview: await previewPlan({ labId: lab.id, input: await readJson(req) }) };
});

/** `?chemicals=<id>,<id>` → `{ inventory }`: the container the preview would take each chemical from (the editor fills assay and molarity from it). */
export const GET = route(async (req, { params }: Ctx) => {
  const { lab } = await requireLabAccess((await params).lab, "plans.read");
  return { inventory: await previewInventoryOf({ labId: lab.id, query: Object.fromEntries(new URL(req.url).searchParams) }) };
});
