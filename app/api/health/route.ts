import { db } from "@/lib/server/db";
import { route } from "@/lib/api/route";

export const dynamic = "force-dynamic";

/** Liveness and database reachability, for `npm start` and load balancers. */
export const GET = route(async () => {
  await db().query("SELECT 1");
  return { ok: true };
});
