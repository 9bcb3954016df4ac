/**
 * Schema building blocks every domain's schemas use for text. PostgreSQL refuses a NUL
 * character in `text` and `jsonb`, and a lone UTF-16 surrogate (half of a pair) in
 * `jsonb`; the UTF-8 driver silently replaces one in `text`. So such strings are refused
 * here, naming the field, before they reach an operation — the one rule, used by every
 * schema (through `text()` / `safeString()`) and by the API's body check (lib/api/body.ts).
 */
import { z } from "zod";

// Zod's optional JIT compiles object parsers with `new Function`, and probes for it when a
// schema is built; the Content-Security-Policy (next.config.mjs) forbids eval, so in the
// browser the probe is a policy violation. Every schema module imports this one first, so
// the interpreter is chosen before any object schema exists.
z.config({ jitless: true });

const LONE_SURROGATE = /[\uD800-\uDBFF](?![\uDC00-\uDFFF])|(?<![\uD800-\uDBFF])[\uDC00-\uDFFF]/;
const NOT_STORABLE = new RegExp(`\u0000|${LONE_SURROGATE.source}`, "g");

/** Why `s` cannot be stored as text, or null when it can. */
export function textProblem(s: string): string | null {
  if (s.includes("\u0000")) return "must not contain the NUL character";
  if (LONE_SURROGATE.test(s)) return "contains a broken character (a lone UTF-16 surrogate)";
  return null;
}

/** `s` with every NUL and lone surrogate replaced (for names taken from files, not typed into fields). */
export function toStorable(s: string, replacement = "_"): string {
  return s.replace(NOT_STORABLE, replacement);
}

/** A string that PostgreSQL can store (no NUL, no lone surrogate), untrimmed, at most `max` characters. */
export function safeString(max: number) {
  return z.string({ message: "must be text" }).max(max, `at most ${max} characters`).superRefine(storable);
}

/** Trimmed, storable text of at most `max` characters (the usual field). */
export function text(max: number) {
  return z.string({ message: "must be text" }).trim().max(max, `at most ${max} characters`).superRefine(storable);
}

function storable(s: string, ctx: z.RefinementCtx) {
  const p = textProblem(s);
  if (p) ctx.addIssue({ code: "custom", message: p });
}

/** Optional trimmed text: "" , null and a missing field all become null. */
export function optionalText(max: number) {
  return text(max)
    .optional()
    .nullable()
    .transform((v) => (v ? v : null));
}

/** A record id in a path or a body: a UUID. */
export function uuid(message = "must be an id (a UUID)") {
  return z.uuid({ message });
}
