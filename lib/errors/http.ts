/** The one place that maps application error codes to HTTP status codes. */
import type { ErrorCode } from "./app-error";

export const HTTP_STATUS: Record<ErrorCode, number> = {
  invalid_input: 422,
  unauthenticated: 401,
  forbidden: 403,
  not_found: 404,
  conflict: 409,
  rate_limited: 429,
  too_large: 413,
  unsupported_media_type: 415,
  method_not_allowed: 405,
  infeasible: 422,
  internal: 500,
};
