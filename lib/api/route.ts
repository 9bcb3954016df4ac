import "server-only";
import { AppError, errorBody } from "@/lib/errors/app-error";
import { HTTP_STATUS } from "@/lib/errors/http";

/** The JSON error response for anything thrown: AppError codes map to status in lib/errors/http.ts. */
export function errorResponse(error: unknown): Response {
  const body = errorBody(error);
  if (body.error.code === "internal") console.error(error);
  return Response.json(body, { status: HTTP_STATUS[body.error.code] });
}

/**
 * Wraps a route handler: returns what it returns as JSON (or the Response it built),
 * and turns any thrown error into the one error shape.
 */
export function route<Ctx>(fn: (request: Request, ctx: Ctx) => Promise<unknown>) {
  return async (request: Request, ctx: Ctx): Promise<Response> => {
    try {
      const result = await fn(request, ctx);
      return result instanceof Response ? result : Response.json(result);
    } catch (error) {
      return errorResponse(error);
    }
  };
}

/** The request body as JSON, or invalid_input naming the body. */
export async function readJson(request: Request): Promise<unknown> {
  try {
    return await request.json();
  } catch {
    throw new AppError("invalid_input", "The request body must be JSON.", [{ path: "", message: "not valid JSON" }]);
  }
}
