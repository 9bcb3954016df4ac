import { requireLabAccess } from "@/lib/auth/access";
import { route } from "@/lib/api/route";
import { revokeApiToken } from "@/lib/api-tokens/server/revoke-api-token";

type Ctx = { params: Promise<{ lab: string; tokenId: string }> };

/** Revokes the token (it stops working at once); the row stays for the audit log. */
export const DELETE = route(
  async (_req, { params }: Ctx) => {
    const p = await params;
    const access = await requireLabAccess(p.lab, "tokens.manage");
    return { token: await revokeApiToken({ labId: access.lab.id, actorUserId: access.userId, tokenId: p.tokenId }) };
  },
  { body: "none" },
);
