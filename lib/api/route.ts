import "server-only";
import { randomUUID } from "node:crypto";
import { AppError, errorBody } from "@/lib/errors/app-error";
import { HTTP_STATUS } from "@/lib/errors/http";
import { DEFAULT_BODY_LIMIT, parseJsonBody, readBodyBytes } from "./body";
import { checkOrigin } from "./origin";
import { checkParams } from "./params";

/**
 * The JSON error response for anything thrown: AppError codes map to status in
 * lib/errors/http.ts. The last resort: a 5xx never carries the error's own text (it may
 * be database text); it says what happened in general and gives an error id, and the
 * error itself is logged under that id.
 */
export function errorResponse(error: unknown): Response {
  const body = errorBody(error);
  const status = HTTP_STATUS[body.error.code];
  if (status >= 500) {
    const errorId = randomUUID();
    console.error(`[tareline] error ${errorId}:`, error);
    return Response.json(
      { error: { code: "internal", message: `The server could not complete this request (error id ${errorId}). Try again; if it persists, give the error id to your administrator.`, issues: [], errorId } },
      { status },
    );
  }
  return Response.json(body, { status });
}

export interface RouteOptions {
  /** What a state-changing request's body is: "json" (the default), "multipart" (an upload) or "none" (a body sent anyway is refused). */
  body?: "json" | "multipart" | "none";
  /** The largest body accepted, in bytes (default DEFAULT_BODY_LIMIT, 1 MB). */
  maxBytes?: number;
}

/** What Next passes a route handler as its second argument. */
export interface RouteContext {
  params?: Promise<Record<string, string | string[] | undefined>>;
}

const bodies = new WeakMap<Request, { json: unknown } | { form: FormData }>();
const BODY_METHODS = new Set(["POST", "PUT", "PATCH", "DELETE"]);

function contentTypeIs(request: Request, pattern: RegExp): boolean {
  return pattern.test(request.headers.get("content-type") ?? "");
}
const JSON_TYPE = /^\s*application\/(?:[\w.+-]+\+)?json\s*(?:;|$)/i;
const MULTIPART_TYPE = /^\s*multipart\/form-data\s*;/i;

function wrongType(expected: string): AppError {
  return new AppError("unsupported_media_type", `Send the request body as ${expected}.`, [{ path: "headers.content-type", message: `must be ${expected}` }]);
}

/**
 * Everything a request must pass before its handler runs, in one place so no handler
 * forgets it: the Origin check (state-changing requests), the path parameters (lab slug,
 * UUID ids), and for a body the content type (application/json, or multipart/form-data
 * where an upload is meant), its size (read as it streams, refused past the route's cap)
 * and, for JSON, its shape (lib/api/body.ts). The parsed body is kept for `readJson` /
 * `readForm`.
 */
export async function guardRequest(request: Request, ctx: RouteContext | undefined, options: RouteOptions = {}): Promise<void> {
  checkOrigin(request);
  const params = ctx?.params ? await ctx.params : undefined;
  if (params) checkParams(params);
  if (!BODY_METHODS.has(request.method.toUpperCase())) return;
  if (options.body === "none") {
    const declared = Number(request.headers.get("content-length") ?? "0");
    if (declared > 0 || request.headers.has("transfer-encoding")) throw new AppError("invalid_input", "This request takes no body.", [{ path: "", message: "send no body" }]);
    return;
  }
  const limit = options.maxBytes ?? DEFAULT_BODY_LIMIT;
  if (options.body === "multipart") {
    if (!contentTypeIs(request, MULTIPART_TYPE)) throw wrongType("multipart/form-data");
    const bytes = await readBodyBytes(request, limit);
    let form: FormData;
    try {
      form = await new Response(bytes, { headers: { "content-type": request.headers.get("content-type")! } }).formData();
    } catch {
      throw new AppError("invalid_input", "The upload is not valid multipart/form-data.", [{ path: "", message: "not valid multipart/form-data" }]);
    }
    bodies.set(request, { form });
    return;
  }
  bodies.set(request, { json: await readJsonBody(request, limit) });
}

/** A JSON body: a declared content type other than JSON is refused before reading; an undeclared one only if a body comes. */
async function readJsonBody(request: Request, limit: number): Promise<unknown> {
  if (request.headers.has("content-type") && !contentTypeIs(request, JSON_TYPE)) throw wrongType("application/json");
  const bytes = await readBodyBytes(request, limit);
  if (bytes.byteLength > 0 && !contentTypeIs(request, JSON_TYPE)) throw wrongType("application/json");
  return parseJsonBody(bytes);
}

/**
 * Wraps a route handler: runs `guardRequest` first, returns what the handler returns as
 * JSON (or the Response it built), and turns any thrown error into the one error shape.
 */
export function route<Ctx extends RouteContext = RouteContext>(fn: (request: Request, ctx: Ctx) => Promise<unknown>, options?: RouteOptions) {
  return async (request: Request, ctx: Ctx): Promise<Response> => {
    try {
      await guardRequest(request, ctx, options);
      const result = await fn(request, ctx);
      return result instanceof Response ? result : Response.json(result);
    } catch (error) {
      return errorResponse(error);
    }
  };
}

/**
 * The request's JSON body as `route()` read and checked it (undefined when empty). Outside
 * `route()` it reads and checks the body itself, with the default cap.
 */
export async function readJson(request: Request): Promise<unknown> {
  const kept = bodies.get(request);
  if (kept && "json" in kept) return kept.json;
  return readJsonBody(request, DEFAULT_BODY_LIMIT);
}

/** The request's multipart form as `route(…, { body: "multipart" })` read it. */
export function readForm(request: Request): FormData {
  const kept = bodies.get(request);
  if (kept && "form" in kept) return kept.form;
  throw new AppError("internal", "readForm needs route(…, { body: \"multipart\" }).");
}
