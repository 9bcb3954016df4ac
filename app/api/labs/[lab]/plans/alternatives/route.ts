import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { suggestSafeDesign } from "@/lib/plans/server/suggest-safe-design";

type Ctx = { params: Promise<{ lab: string }> };

/**
 * `{ document, model?, kinds? }` → `{ blockingRuns, alternatives, model, runCount, notComputed, note }`:
 * the runs of the document's design that block and the safe-design alternatives, each with
 * the document it gives when applied. Stores nothing; a bad document is a 422 at `document.<path>`.
 */
export const POST = route(async (req, { params }: Ctx) => {
  const { lab } = await requireLabAccess((await params).lab, "plans.read");
  return suggestSafeDesign({ labId: lab.id, input: await readJson(req) });
});
