import "server-only";
import { NextRequest } from "next/server";
import { AppError } from "@/lib/errors/app-error";
import { readBodyBytes } from "./body";
import { checkOrigin } from "./origin";
import { errorResponse } from "./route";

/** The largest sign-in request accepted (a CSRF token, an e-mail and a password). */
export const AUTH_BODY_LIMIT = 16_000;

type AuthContext = { params: Promise<{ nextauth: string[] }> };
type AuthHandler = (request: NextRequest, ctx: AuthContext) => Promise<Response>;

const FORM_OR_JSON = /^\s*(?:application\/x-www-form-urlencoded|application\/json)\s*(?:;|$)/i;

/**
 * next-auth's route handler behind the same guards as every other route: a GET on a
 * credentials callback is a 405 (it only takes POST) instead of next-auth's 500; a POST
 * passes the Origin check, must be a form or JSON, and is capped at AUTH_BODY_LIMIT while
 * it streams before next-auth reads it.
 */
export function authRoute(handler: AuthHandler): { GET: AuthHandler; POST: AuthHandler } {
  return {
    async GET(request, ctx) {
      const [action, provider] = (await ctx.params).nextauth;
      if (action === "callback" && provider === "credentials") {
        return errorResponse(new AppError("method_not_allowed", "Sign in by POSTing the sign-in form; this address does not take GET.", [{ path: "method", message: "use POST" }]));
      }
      return handler(request, ctx);
    },
    async POST(request, ctx) {
      try {
        checkOrigin(request);
        if (request.headers.has("content-type") && !FORM_OR_JSON.test(request.headers.get("content-type") ?? "")) {
          throw new AppError("unsupported_media_type", "Send the sign-in as a form or as JSON.", [{ path: "headers.content-type", message: "must be application/x-www-form-urlencoded or application/json" }]);
        }
        const body = await readBodyBytes(request, AUTH_BODY_LIMIT);
        return await handler(new NextRequest(request.url, { method: "POST", headers: request.headers, body }), ctx);
      } catch (error) {
        return errorResponse(error);
      }
    },
  };
}
