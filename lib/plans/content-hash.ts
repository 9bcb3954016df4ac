/**
 * The content hash of a plan: SHA-256 (FIPS 180-4), hex, of the plan document's canonical
 * JSON as RFC 8785 (JSON Canonicalization Scheme) defines it — keys sorted by UTF-16 code
 * units, numbers in ECMAScript's shortest form, no insignificant whitespace — through the
 * `canonicalize` package. Two documents that mean the same JSON have the same hash,
 * whatever their key order or formatting; a signature binds to this hash.
 */
import { createHash } from "node:crypto";
import canonicalize from "canonicalize";
import { AppError } from "../errors/app-error";

/**
 * The RFC 8785 canonical JSON of `value`.
 * @throws AppError("invalid_input") naming the path of a value JSON cannot carry
 *   (a non-finite number, a string with a lone surrogate).
 */
export function canonicalJson(value: unknown, pathPrefix = ""): string {
  const bad = findUnencodable(value, pathPrefix);
  if (bad) throw AppError.field(bad.path, bad.message);
  const text = canonicalize(value);
  if (text === undefined) throw AppError.field(pathPrefix, "is not a JSON value");
  return text;
}

/** SHA-256 (hex) of the canonical JSON of `value`. */
export function contentHash(value: unknown, pathPrefix = ""): string {
  return createHash("sha256").update(canonicalJson(value, pathPrefix), "utf8").digest("hex");
}

function findUnencodable(value: unknown, path: string): { path: string; message: string } | null {
  if (typeof value === "number") return Number.isFinite(value) ? null : { path, message: "must be a finite number" };
  if (typeof value === "string") return /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/.test(value) ? { path, message: "contains an unpaired surrogate" } : null;
  if (Array.isArray(value)) {
    for (let i = 0; i < value.length; i++) {
      const bad = findUnencodable(value[i], path ? `${path}.${i}` : String(i));
      if (bad) return bad;
    }
    return null;
  }
  if (value && typeof value === "object") {
    for (const [k, v] of Object.entries(value)) {
      const bad = findUnencodable(v, path ? `${path}.${k}` : k);
      if (bad) return bad;
    }
  }
  return null;
}
