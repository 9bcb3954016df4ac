import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { createLocation, listLocations } from "@/inventory/server/locations";

type Ctx = { params: Promise<{ lab: string }> };

export const GET = route(async (_req, { params }: Ctx) => {
  const { lab } = await requireLabAccess((await params).lab, "stock.read");
  return { locations: await listLocations({ labId: lab.id }) };
});

export const POST = route(async (req, { params }: Ctx) => {
  const access = await requireLabAccess((await params).lab, "stock.manage");
  return Response.json({ location: await createLocation({ labId: access.lab.id, actorUserId: access.userId, input: await readJson(req) }) }, { status: 201 });
});
