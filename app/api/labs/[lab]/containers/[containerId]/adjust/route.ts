import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { adjustContainerAmount } from "@/inventory/server/containers";

type Ctx = { params: Promise<{ lab: string; containerId: string }> };

/** A counted correction of the amount (stock-take), with a reason for the ledger. */
export const POST = route(async (req, { params }: Ctx) => {
  const p = await params;
  const access = await requireLabAccess(p.lab, "stock.manage");
  return { container: await adjustContainerAmount({ labId: access.lab.id, actorUserId: access.userId, containerId: p.containerId, input: await readJson(req) }) };
});
