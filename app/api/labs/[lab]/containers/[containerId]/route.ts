import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { getContainer, updateContainer } from "@/inventory/server/containers";
import { containerLedger, listReservations } from "@/inventory/server/ledger";

type Ctx = { params: Promise<{ lab: string; containerId: string }> };

/** The container, its ledger and its reservations. */
export const GET = route(async (_req, { params }: Ctx) => {
  const p = await params;
  const { lab } = await requireLabAccess(p.lab, "stock.read");
  const container = await getContainer({ labId: lab.id, containerId: p.containerId });
  return { container, ledger: await containerLedger({ labId: lab.id, containerId: p.containerId }), reservations: await listReservations({ labId: lab.id, containerId: p.containerId, status: "all" }) };
});

export const PATCH = route(async (req, { params }: Ctx) => {
  const p = await params;
  const access = await requireLabAccess(p.lab, "stock.manage");
  return { container: await updateContainer({ labId: access.lab.id, actorUserId: access.userId, containerId: p.containerId, input: await readJson(req) }) };
});
