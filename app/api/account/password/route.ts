import { requireUser } from "@/lib/auth/session";
import { readJson, route } from "@/lib/api/route";
import { changePassword } from "@/lib/members/server/change-password";

export const POST = route(async (req) => {
  const user = await requireUser();
  return changePassword({ userId: user.id, input: await readJson(req) });
});
