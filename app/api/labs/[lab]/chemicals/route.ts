import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { createChemical, listChemicals } from "@/inventory/server/chemicals";

type Ctx = { params: Promise<{ lab: string }> };

export const GET = route(async (req, { params }: Ctx) => {
  const { lab } = await requireLabAccess((await params).lab, "chemicals.read");
  return { chemicals: await listChemicals({ labId: lab.id, q: new URL(req.url).searchParams.get("q") ?? undefined }) };
});

export const POST = route(async (req, { params }: Ctx) => {
  const access = await requireLabAccess((await params).lab, "chemicals.manage");
  return Response.json({ chemical: await createChemical({ labId: access.lab.id, actorUserId: access.userId, input: await readJson(req) }) }, { status: 201 });
});
