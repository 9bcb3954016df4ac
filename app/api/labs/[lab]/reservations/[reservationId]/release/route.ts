import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { releaseReservation } from "@/inventory/server/close-reservation";

type Ctx = { params: Promise<{ lab: string; reservationId: string }> };

/** Releases a held reservation: { reason }. */
export const POST = route(async (req, { params }: Ctx) => {
  const p = await params;
  const access = await requireLabAccess(p.lab, "stock.manage");
  return { reservation: await releaseReservation({ labId: access.lab.id, actorUserId: access.userId, reservationId: p.reservationId, input: await readJson(req) }) };
});
