import { reissueSession, requireUser } from "@/lib/auth/session";
import { readJson, route } from "@/lib/api/route";
import { changePassword } from "@/lib/members/server/change-password";

export const POST = route(async (req) => {
  const user = await requireUser();
  const result = await changePassword({ userId: user.id, input: await readJson(req) });
  // Every other session of this user has ended; this one continues with the new session version.
  await reissueSession(result.sessionVersion);
  return { ok: true };
});
