import "server-only";
import type { Transaction } from "sequelize";
import { headers } from "next/headers";
import { unstable_rethrow } from "next/navigation";
import { ApiToken } from "@/lib/server/models";
import { bearerCredentials, parseTokenSecret, sameHash } from "../secret";

/**
 * The Bearer credentials of the current request's Authorization header, or null when it
 * has none. Outside a request (the command line, a script, a unit of work started by a
 * test) there is no header: null. Next's own control-flow errors are passed on.
 */
export async function readRequestBearer(): Promise<string | null> {
  let authorization: string | null;
  try {
    authorization = (await headers()).get("authorization");
  } catch (e) {
    unstable_rethrow(e);
    return null;
  }
  return bearerCredentials(authorization);
}

/**
 * The API token the current request is made with, for the audit log: the stored token its
 * Bearer secret belongs to, or null (no Bearer header, or not a token's secret). Read in
 * the caller's transaction `t`, so an audit entry written inside a transaction never waits
 * for a second connection of the pool.
 */
export async function readRequestToken(t?: Transaction): Promise<{ id: string; labId: string } | null> {
  const presented = await readRequestBearer();
  const parsed = presented === null ? null : parseTokenSecret(presented);
  if (!parsed) return null;
  const token = await ApiToken.findOne({ where: { selector: parsed.selector }, attributes: ["id", "labId", "secretHash"], transaction: t });
  return token && sameHash(parsed.hash, token.secretHash) ? { id: token.id, labId: token.labId } : null;
}
