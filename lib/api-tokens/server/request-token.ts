import "server-only";
import { headers } from "next/headers";
import { unstable_rethrow } from "next/navigation";
import { bearerCredentials } from "../secret";
import { findTokenBySecret } from "./find-token";

/**
 * The Bearer credentials of the current request's Authorization header, or null when it
 * has none. Outside a request (the command line, a script, a unit of work started by a
 * test) there is no header: null. Next's own control-flow errors are passed on.
 */
export async function requestBearer(): Promise<string | null> {
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
 * Bearer secret belongs to, or null (no Bearer header, or not a token's secret).
 */
export async function requestApiToken(): Promise<{ id: string; labId: string } | null> {
  const presented = await requestBearer();
  if (presented === null) return null;
  const token = await findTokenBySecret(presented);
  return token ? { id: token.id, labId: token.labId } : null;
}
