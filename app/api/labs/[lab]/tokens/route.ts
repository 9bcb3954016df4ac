import { requireLabAccess } from "@/lib/auth/access";
import { readJson, route } from "@/lib/api/route";
import { listApiTokens } from "@/lib/api-tokens/server/list-api-tokens";
import { createApiToken } from "@/lib/api-tokens/server/create-api-token";

type Ctx = { params: Promise<{ lab: string }> };

export const GET = route(async (_req, { params }: Ctx) => {
  const access = await requireLabAccess((await params).lab, "tokens.manage");
  return { tokens: await listApiTokens({ labId: access.lab.id }) };
});

/** 201 `{ token, secret }`: the secret is in this response only. */
export const POST = route(async (req, { params }: Ctx) => {
  const access = await requireLabAccess((await params).lab, "tokens.manage");
  const created = await createApiToken({ labId: access.lab.id, actorUserId: access.userId, actorRole: access.role, input: await readJson(req) });
  return Response.json(created, { status: 201, headers: { "cache-control": "no-store" } });
});
