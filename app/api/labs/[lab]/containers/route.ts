import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { createContainer, listContainers } from "@/inventory/server/containers";

type Ctx = { params: Promise<{ lab: string }> };

/** One page of containers: ?q=&chemicalId=&locationId=&status=&sort=&dir=&page=&pageSize= */
export const GET = route(async (req, { params }: Ctx) => {
  const { lab } = await requireLabAccess((await params).lab, "stock.read");
  return listContainers({ labId: lab.id, query: Object.fromEntries(new URL(req.url).searchParams) });
});

export const POST = route(async (req, { params }: Ctx) => {
  const access = await requireLabAccess((await params).lab, "stock.manage");
  return Response.json({ container: await createContainer({ labId: access.lab.id, actorUserId: access.userId, input: await readJson(req) }) }, { status: 201 });
});
