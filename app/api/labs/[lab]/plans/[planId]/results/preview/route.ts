import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { RESULTS_BODY_LIMIT } from "@/lib/results/schemas";
import { previewResultsCsv } from "@/lib/results/server/preview-results-csv";

type Ctx = { params: Promise<{ lab: string; planId: string }> };

/** Checks a results CSV (`{ csv, mapping? }`) and shows what it would store. Stores nothing. */
export const POST = route(async (req, { params }: Ctx) => {
  const p = await params;
  const { lab } = await requireLabAccess(p.lab, "plans.execute");
  return { preview: await previewResultsCsv({ labId: lab.id, planId: p.planId, input: await readJson(req) }) };
}, { maxBytes: RESULTS_BODY_LIMIT });
