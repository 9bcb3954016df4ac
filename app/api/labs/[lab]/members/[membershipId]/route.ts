import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { changeMemberRole } from "@/lib/members/server/change-member-role";
import { removeMember } from "@/lib/members/server/remove-member";

type Ctx = { params: Promise<{ lab: string; membershipId: string }> };

export const PATCH = route(async (req, { params }: Ctx) => {
  const p = await params;
  const access = await requireLabAccess(p.lab, "members.manage");
  return { membership: await changeMemberRole({ labId: access.lab.id, actorUserId: access.userId, membershipId: p.membershipId, input: await readJson(req) }) };
});

export const DELETE = route(
  async (_req, { params }: Ctx) => {
    const p = await params;
    const access = await requireLabAccess(p.lab, "members.manage");
    return { removed: await removeMember({ labId: access.lab.id, actorUserId: access.userId, membershipId: p.membershipId }) };
  },
  { body: "none" },
);
