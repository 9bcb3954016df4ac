/**
 * The secret of a lab API token: `trl_` followed by 43 base64url characters (32 random
 * bytes, 256 bits). The prefix makes a leaked token easy to recognise in logs, chat or a
 * repository. Only its SHA-256 is stored; its first characters (the selector) find the
 * stored row, and the hashes are then compared in constant time.
 */
import { createHash, randomBytes, timingSafeEqual } from "node:crypto";

export const TOKEN_PREFIX = "trl_";
const SECRET_PATTERN = /^trl_[A-Za-z0-9_-]{43}$/;
/** Characters of the secret (prefix included) that identify it: shown in lists, indexed. */
export const SELECTOR_LENGTH = 12;

export interface TokenSecret {
  /** The whole secret, shown to its creator once. */
  secret: string;
  selector: string;
  /** SHA-256 of the whole secret, hex. */
  hash: string;
}

export function hashTokenSecret(secret: string): string {
  return createHash("sha256").update(secret, "utf8").digest("hex");
}

/** A new random secret with its selector and hash. */
export function newTokenSecret(): TokenSecret {
  const secret = TOKEN_PREFIX + randomBytes(32).toString("base64url");
  return { secret, selector: secret.slice(0, SELECTOR_LENGTH), hash: hashTokenSecret(secret) };
}

/** The selector and hash of a secret as presented, or null when it is not shaped like one. */
export function parseTokenSecret(presented: string): { selector: string; hash: string } | null {
  if (!SECRET_PATTERN.test(presented)) return null;
  return { selector: presented.slice(0, SELECTOR_LENGTH), hash: hashTokenSecret(presented) };
}

/** Whether two hex SHA-256 digests are equal, compared in constant time. */
export function sameHash(a: string, b: string): boolean {
  const x = Buffer.from(a, "hex");
  const y = Buffer.from(b, "hex");
  return x.length === 32 && y.length === 32 && timingSafeEqual(x, y);
}

/**
 * The credentials of an `Authorization` header value when it uses the Bearer scheme
 * (RFC 6750 §2.1; the scheme name is case-insensitive), else null.
 */
export function bearerCredentials(authorization: string | null | undefined): string | null {
  const m = /^\s*bearer\s+(\S*)\s*$/i.exec(authorization ?? "");
  return m ? (m[1] ?? "") : null;
}
