import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { createStudy } from "@/lib/studies/server/create-study";
import { listStudies } from "@/lib/studies/server/list-studies";

type Ctx = { params: Promise<{ lab: string }> };

/** One page of studies: ?q=&sort=name|updatedAt|createdAt&dir=&page=&pageSize=&archived=exclude|include|only */
export const GET = route(async (req, { params }: Ctx) => {
  const { lab } = await requireLabAccess((await params).lab, "studies.read");
  const { studies, total, page, pageSize } = await listStudies({ labId: lab.id, query: Object.fromEntries(new URL(req.url).searchParams) });
  return { studies, total, page, pageSize };
});

export const POST = route(async (req, { params }: Ctx) => {
  const access = await requireLabAccess((await params).lab, "studies.manage");
  return Response.json({ study: await createStudy({ labId: access.lab.id, actorUserId: access.userId, input: await readJson(req) }) }, { status: 201 });
});
