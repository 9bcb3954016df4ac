import { readJson, route } from "@/lib/api/route";
import { acceptInvitation, describeInvitation } from "@/lib/members/server/accept-invitation";

type Ctx = { params: Promise<{ token: string }> };

export const GET = route(async (_req, { params }: Ctx) => ({ invitation: await describeInvitation((await params).token) }));

export const POST = route(async (req, { params }: Ctx) => ({ accepted: await acceptInvitation({ token: (await params).token, input: await readJson(req) }) }));
