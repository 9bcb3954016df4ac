import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { parseOrThrow } from "@/lib/errors/app-error";
import { reserveStock } from "@/inventory/server/reserve-stock";
import { listReservations } from "@/inventory/server/ledger";
import { reservationQuerySchema } from "@/inventory/schemas";

type Ctx = { params: Promise<{ lab: string }> };

/** The lab's reservations: ?status=held|consumed|released|all&planRef= */
export const GET = route(async (req, { params }: Ctx) => {
  const { lab } = await requireLabAccess((await params).lab, "stock.read");
  const q = parseOrThrow(reservationQuerySchema, Object.fromEntries(new URL(req.url).searchParams));
  return { reservations: await listReservations({ labId: lab.id, status: q.status, planRef: q.planRef }) };
});

/** Reserves amounts of containers for a plan: { planRef, lines: [{ containerId, amount, unit }] }, all or nothing. */
export const POST = route(async (req, { params }: Ctx) => {
  const access = await requireLabAccess((await params).lab, "stock.manage");
  return Response.json({ reservations: await reserveStock({ labId: access.lab.id, actorUserId: access.userId, input: await readJson(req) }) }, { status: 201 });
});
