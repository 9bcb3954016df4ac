import "server-only";
import { AppError, type FieldIssue } from "@/lib/errors/app-error";
import { textProblem } from "@/lib/schemas/text";

/** The default cap on a request body: 1 MB. Routes that take more say so (route options). */
export const DEFAULT_BODY_LIMIT = 1_000_000;
/** The deepest nesting of arrays and objects a JSON body may have. */
export const MAX_JSON_DEPTH = 64;

const bodyIssue = (message: string): FieldIssue[] => [{ path: "", message }];

function tooLarge(limit: number): AppError {
  return new AppError("too_large", `The request body is larger than this route accepts (${formatBytes(limit)}).`, bodyIssue(`at most ${formatBytes(limit)}`));
}

function formatBytes(n: number): string {
  return n >= 1_000_000 ? `${Math.round(n / 100_000) / 10} MB` : `${Math.round(n / 1000)} kB`;
}

/**
 * Reads a request body up to `limit` bytes. A declared Content-Length above the limit is
 * refused before reading; a chunked body is counted while it streams and refused (the
 * stream cancelled) as soon as it passes the limit, so nothing larger is buffered or
 * parsed.
 * @throws AppError too_large.
 */
export async function readBodyBytes(request: Request, limit: number): Promise<Uint8Array<ArrayBuffer>> {
  const declared = request.headers.get("content-length");
  if (declared !== null && Number(declared) > limit) throw tooLarge(limit);
  if (!request.body) return new Uint8Array(0);
  const reader = request.body.getReader();
  const chunks: Uint8Array[] = [];
  let total = 0;
  for (;;) {
    const { done, value } = await reader.read();
    if (done) break;
    total += value.byteLength;
    if (total > limit) {
      await reader.cancel().catch(() => undefined);
      throw tooLarge(limit);
    }
    chunks.push(value);
  }
  const out = new Uint8Array(total);
  let at = 0;
  for (const c of chunks) {
    out.set(c, at);
    at += c.byteLength;
  }
  return out;
}

/** The deepest nesting of `[` / `{` in JSON text (outside strings); stops counting past `cap`. */
function nestingDepth(text: string, cap: number): number {
  let depth = 0;
  let deepest = 0;
  let inString = false;
  for (let i = 0; i < text.length; i++) {
    const c = text.charCodeAt(i);
    if (inString) {
      if (c === 0x5c) i++; // backslash: skip the escaped character
      else if (c === 0x22) inString = false;
    } else if (c === 0x22) inString = true;
    else if (c === 0x5b || c === 0x7b) {
      depth++;
      if (depth > deepest) deepest = depth;
      if (deepest > cap) return deepest;
    } else if (c === 0x5d || c === 0x7d) depth--;
  }
  return deepest;
}

/** Every string (keys and values) of a parsed JSON value that cannot be stored, by dotted path; at most `max`. */
function unstorableStrings(value: unknown, path: string[], out: FieldIssue[], max: number): void {
  if (out.length >= max) return;
  if (typeof value === "string") {
    const p = textProblem(value);
    if (p) out.push({ path: path.join("."), message: p });
  } else if (Array.isArray(value)) {
    value.forEach((v, i) => unstorableStrings(v, [...path, String(i)], out, max));
  } else if (value !== null && typeof value === "object") {
    for (const [k, v] of Object.entries(value)) {
      const p = textProblem(k);
      if (p && out.length < max) out.push({ path: [...path, k].join("."), message: `field name ${p}` });
      unstorableStrings(v, [...path, k], out, max);
    }
  }
}

/**
 * A JSON request body, checked before any handler sees it: UTF-8, nested at most
 * MAX_JSON_DEPTH levels, valid JSON, and no string (key or value) that PostgreSQL cannot
 * store (NUL, lone surrogates — lib/schemas/text.ts). An empty body is `undefined`.
 * @throws AppError invalid_input naming the body or the field.
 */
export function parseJsonBody(bytes: Uint8Array): unknown {
  if (bytes.byteLength === 0) return undefined;
  let text: string;
  try {
    text = new TextDecoder("utf-8", { fatal: true }).decode(bytes);
  } catch {
    throw new AppError("invalid_input", "The request body is not UTF-8 text.", bodyIssue("not UTF-8"));
  }
  if (text.trim() === "") return undefined;
  if (nestingDepth(text, MAX_JSON_DEPTH) > MAX_JSON_DEPTH) {
    throw new AppError("invalid_input", `The request body is nested more than ${MAX_JSON_DEPTH} levels deep.`, bodyIssue(`nested more than ${MAX_JSON_DEPTH} levels`));
  }
  let value: unknown;
  try {
    value = JSON.parse(text);
  } catch {
    throw new AppError("invalid_input", "The request body must be JSON.", bodyIssue("not valid JSON"));
  }
  const issues: FieldIssue[] = [];
  unstorableStrings(value, [], issues, 20);
  if (issues.length) throw new AppError("invalid_input", "Some text in the request cannot be stored.", issues);
  return value;
}
