import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
import { listAudit } from "@/lib/members/server/list-audit";

type Ctx = { params: Promise<{ lab: string }> };

/** `?entity=chemical&actor=user:<id>&page=2&pageSize=25` → `{ entries, total, page, pageSize }`. */
export const GET = route(async (req, { params }: Ctx) => {
  const { lab } = await requireLabAccess((await params).lab, "audit.read");
  return listAudit({ labId: lab.id, query: Object.fromEntries(new URL(req.url).searchParams) });
});
