import "server-only";
import { AppError } from "@/lib/errors/app-error";
import { serverEnv } from "@/lib/server/env";

const SAFE_METHODS = new Set(["GET", "HEAD", "OPTIONS"]);

/** The origins the app is served from (APP_URL, and NEXTAUTH_URL when set). */
function appOrigins(): Set<string> {
  const env = serverEnv();
  const out = new Set<string>([new URL(env.APP_URL).origin]);
  if (env.NEXTAUTH_URL) out.add(new URL(env.NEXTAUTH_URL).origin);
  return out;
}

/**
 * Cross-site request forgery guard for state-changing requests (anything but GET, HEAD,
 * OPTIONS). Allowed: a lab API token (`Authorization: Bearer …`: no cookie, so no
 * forgery); a browser's `Sec-Fetch-Site: same-origin` (or `none`, typed by the user); an
 * `Origin` that is the app's own URL; and a request with neither header (scripts and
 * command-line clients, which carry no victim's cookie). Anything else — a page of another
 * site posting here — is refused with 403 naming the `Origin` header.
 * @throws AppError forbidden.
 */
export function checkOrigin(request: Request): void {
  if (SAFE_METHODS.has(request.method.toUpperCase())) return;
  if (/^Bearer\s/i.test(request.headers.get("authorization") ?? "")) return;
  const site = request.headers.get("sec-fetch-site");
  const origin = request.headers.get("origin");
  if (site === "same-origin" || site === "none") return;
  if (origin === null && site === null) return;
  if (origin !== null && appOrigins().has(origin)) return;
  throw new AppError("forbidden", `Refused: this request comes from another site (${origin ?? `Sec-Fetch-Site: ${site}`}). Tareline accepts changes only from its own pages or from scripts.`, [
    { path: "headers.origin", message: `not this app's origin (${[...appOrigins()].join(", ")})` },
  ]);
}
