import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { checkAvailability } from "@/inventory/server/availability";

type Ctx = { params: Promise<{ lab: string }> };

/** Proposes containers for { requirements: [{ chemicalId, amount, unit, label? }] }, with shortfalls and warnings. Reads only. */
export const POST = route(async (req, { params }: Ctx) => {
  const { lab } = await requireLabAccess((await params).lab, "stock.read");
  return { availability: await checkAvailability({ labId: lab.id, input: await readJson(req) }) };
});
