import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { consumeReservation } from "@/inventory/server/close-reservation";

type Ctx = { params: Promise<{ lab: string; reservationId: string }> };

/** Consumes a held reservation with the amount actually used: { amount, unit, note? }. */
export const POST = route(async (req, { params }: Ctx) => {
  const p = await params;
  const access = await requireLabAccess(p.lab, "stock.manage");
  return { reservation: await consumeReservation({ labId: access.lab.id, actorUserId: access.userId, reservationId: p.reservationId, input: await readJson(req) }) };
});
