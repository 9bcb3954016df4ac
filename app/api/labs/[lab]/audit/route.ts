import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
import { listAudit } from "@/lib/members/server/list-audit";

type Ctx = { params: Promise<{ lab: string }> };

export const GET = route(async (_req, { params }: Ctx) => {
  const { lab } = await requireLabAccess((await params).lab, "audit.read");
  return { entries: await listAudit({ labId: lab.id }) };
});
