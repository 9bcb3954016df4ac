import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
import { listPlans } from "@/lib/plans/server/list-plans";

type Ctx = { params: Promise<{ lab: string }> };

/** One page of plans: ?state=draft,in_review&author=<user id>|me&study=<id>&q=&sort=&dir=&page=&pageSize= */
export const GET = route(async (req, { params }: Ctx) => {
  const access = await requireLabAccess((await params).lab, "plans.read");
  const { plans, total, page, pageSize } = await listPlans({ labId: access.lab.id, actorUserId: access.userId, query: Object.fromEntries(new URL(req.url).searchParams) });
  return { plans, total, page, pageSize };
});
