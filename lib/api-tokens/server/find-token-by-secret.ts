import "server-only";
import { cache } from "react";
import { ApiToken, Lab } from "@/lib/server/models";
import { parseTokenSecret, sameHash } from "../secret";

/**
 * The stored token a presented secret belongs to (whatever its state), or null: found by
 * its selector, then its SHA-256 compared in constant time. Memoised per request, so the
 * access check and the audit log of one request read it once.
 */
export const findTokenBySecret = cache(async (presented: string): Promise<ApiToken | null> => {
  const parsed = parseTokenSecret(presented);
  if (!parsed) return null;
  const token = await ApiToken.findOne({ where: { selector: parsed.selector }, include: [{ model: Lab, as: "lab", required: true }] });
  return token && sameHash(parsed.hash, token.secretHash) ? token : null;
});
