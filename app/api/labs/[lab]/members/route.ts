import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { listMembers } from "@/lib/members/server/list-members";
import { inviteMember } from "@/lib/members/server/invite-member";
import { serverEnv } from "@/lib/server/env";

type Ctx = { params: Promise<{ lab: string }> };

export const GET = route(async (_req, { params }: Ctx) => {
  const { lab } = await requireLabAccess((await params).lab, "members.read");
  return { members: await listMembers({ labId: lab.id }) };
});

export const POST = route(async (req, { params }: Ctx) => {
  const access = await requireLabAccess((await params).lab, "members.manage");
  const invitation = await inviteMember({ labId: access.lab.id, actorUserId: access.userId, appUrl: serverEnv().APP_URL, input: await readJson(req) });
  return Response.json({ invitation }, { status: 201 });
});
