import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { updateChemical } from "@/inventory/server/chemicals";

type Ctx = { params: Promise<{ lab: string; chemicalId: string }> };

export const PATCH = route(async (req, { params }: Ctx) => {
  const p = await params;
  const access = await requireLabAccess(p.lab, "chemicals.manage");
  return { chemical: await updateChemical({ labId: access.lab.id, actorUserId: access.userId, chemicalId: p.chemicalId, input: await readJson(req) }) };
});
