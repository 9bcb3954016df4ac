import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { archiveStudy } from "@/lib/studies/server/archive-study";
import { getStudy } from "@/lib/studies/server/get-study";
import { updateStudy } from "@/lib/studies/server/update-study";

type Ctx = { params: Promise<{ lab: string; studyId: string }> };

/** The study and its plans. */
export const GET = route(async (_req, { params }: Ctx) => {
  const p = await params;
  const { lab } = await requireLabAccess(p.lab, "studies.read");
  return getStudy({ labId: lab.id, studyId: p.studyId });
});

/** `{ version, name?, goal?, targetProduct?, responses? }` → `{ study }` */
export const PATCH = route(async (req, { params }: Ctx) => {
  const p = await params;
  const access = await requireLabAccess(p.lab, "studies.manage");
  return { study: await updateStudy({ labId: access.lab.id, actorUserId: access.userId, studyId: p.studyId, input: await readJson(req) }) };
});

/** Archives the study (it keeps its plans); `DELETE …?restore=1` brings it back. */
export const DELETE = route(async (req, { params }: Ctx) => {
  const p = await params;
  const access = await requireLabAccess(p.lab, "studies.manage");
  const restore = new URL(req.url).searchParams.get("restore") === "1";
  return { study: await archiveStudy({ labId: access.lab.id, actorUserId: access.userId, studyId: p.studyId, archived: !restore }) };
}, { body: "none" });
