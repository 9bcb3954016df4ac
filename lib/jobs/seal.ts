import "server-only";
import { createCipheriv, createDecipheriv, hkdfSync, randomBytes } from "node:crypto";
import { z } from "zod";
import { serverEnv } from "@/lib/server/env";

/**
 * Job data that carries secrets (an invitation link is as good as a password until it is
 * used) is stored encrypted in pg-boss's tables, so that reading the database does not
 * reveal it: AES-256-GCM with a key derived by HKDF-SHA-256 from NEXTAUTH_SECRET. The app
 * and every worker must therefore share NEXTAUTH_SECRET; a job sealed under an earlier
 * secret fails (and is reported in the worker's log) instead of being sent.
 */
export const sealedSchema = z.object({ sealed: z.string().regex(/^v1\.[\w-]+\.[\w-]+\.[\w-]*$/) });
export type Sealed = z.infer<typeof sealedSchema>;

function key(): Buffer {
  return Buffer.from(hkdfSync("sha256", serverEnv().NEXTAUTH_SECRET, "tareline", "job payload v1", 32));
}

export function seal(value: unknown): Sealed {
  const iv = randomBytes(12);
  const cipher = createCipheriv("aes-256-gcm", key(), iv);
  const body = Buffer.concat([cipher.update(JSON.stringify(value), "utf8"), cipher.final()]);
  return { sealed: ["v1", iv.toString("base64url"), cipher.getAuthTag().toString("base64url"), body.toString("base64url")].join(".") };
}

export function unseal(value: Sealed): unknown {
  const [, iv, tag, body] = value.sealed.split(".");
  const decipher = createDecipheriv("aes-256-gcm", key(), Buffer.from(iv ?? "", "base64url"));
  decipher.setAuthTag(Buffer.from(tag ?? "", "base64url"));
  try {
    return JSON.parse(Buffer.concat([decipher.update(Buffer.from(body ?? "", "base64url")), decipher.final()]).toString("utf8"));
  } catch {
    throw new Error("The job's data cannot be decrypted: it was sealed with another NEXTAUTH_SECRET than this process has.");
  }
}
