/**
 * The one application error type. Engines, domain code and route handlers throw it;
 * `lib/errors/http.ts` maps its code to an HTTP status and the command line maps it to
 * an exit code. Nothing else decides how an error is shown.
 */
import { z } from "zod";

export type ErrorCode =
  | "invalid_input" // the caller sent something that does not validate (HTTP 422, CLI exit 2)
  | "unauthenticated" // no session (HTTP 401)
  | "forbidden" // the role may not do this (HTTP 403)
  | "not_found" // missing, or belongs to another lab (HTTP 404)
  | "conflict" // state does not allow it: stale version, shortfall, already approved (HTTP 409)
  | "rate_limited" // too many attempts (HTTP 429)
  | "too_large" // the request body is larger than the route accepts (HTTP 413)
  | "unsupported_media_type" // the body is not of the type the route takes, e.g. not application/json (HTTP 415)
  | "method_not_allowed" // the route does not take this HTTP method (HTTP 405)
  | "infeasible" // valid input, but no plan satisfies it (HTTP 422, CLI exit 2)
  | "internal"; // a bug (HTTP 500, CLI exit 1)

/** One problem with one field of the input; `path` is dotted, e.g. `factors.0.low`. */
export interface FieldIssue {
  path: string;
  message: string;
}

export class AppError extends Error {
  readonly code: ErrorCode;
  readonly issues: FieldIssue[];
  /**
   * Fields the error body carries beside `error` (CONTRACT.md: a release refused for
   * short stock also has `shortfalls`). Plain JSON values; never database text.
   */
  readonly details: Readonly<Record<string, unknown>> | undefined;

  constructor(code: ErrorCode, message: string, issues: FieldIssue[] = [], details?: Record<string, unknown>) {
    super(message);
    this.name = "AppError";
    this.code = code;
    this.issues = issues;
    this.details = details;
  }

  /** An invalid-input error about one field. */
  static field(path: string, message: string): AppError {
    return new AppError("invalid_input", `${path}: ${message}`, [{ path, message }]);
  }

  /** An invalid-input error built from a zod failure, one issue per failing field. */
  static fromZod(error: z.ZodError, message = "The input is not valid."): AppError {
    return new AppError("invalid_input", message, zodIssues(error));
  }
}

/** Turns zod's issues into dotted field paths (`factors.0.low`). */
export function zodIssues(error: z.ZodError): FieldIssue[] {
  return error.issues.map((issue) => ({
    path: issue.path.map(String).join("."),
    message: issue.message,
  }));
}

/**
 * Parses `input` with `schema`; on failure throws an invalid-input AppError naming
 * every failing field. Returns the parsed (defaulted) value.
 */
export function parseOrThrow<S extends z.ZodType>(schema: S, input: unknown, message?: string): z.output<S> {
  const result = schema.safeParse(input);
  if (!result.success) throw AppError.fromZod(result.error, message);
  return result.data;
}

/** The JSON shape every API route and the command line use for errors (plus an AppError's `details`). */
export interface ErrorBody {
  error: { code: ErrorCode; message: string; issues: FieldIssue[] };
  [detail: string]: unknown;
}

export function errorBody(error: unknown): ErrorBody {
  if (error instanceof AppError) {
    return { ...error.details, error: { code: error.code, message: error.message, issues: error.issues } };
  }
  if (error instanceof z.ZodError) {
    return errorBody(AppError.fromZod(error));
  }
  const message = error instanceof Error ? error.message : String(error);
  return { error: { code: "internal", message: `Internal error: ${message}`, issues: [] } };
}
