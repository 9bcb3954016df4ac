import "server-only";
import { z } from "zod";
import { AppError, type FieldIssue } from "@/lib/errors/app-error";
import { textProblem } from "@/lib/schemas/text";

/** A lab's slug as the labs table holds it: lower-case letters, digits and hyphens, at most 64. */
const LAB_SLUG = /^[a-z0-9](?:[a-z0-9-]{0,62}[a-z0-9])?$/;
const uuid = z.uuid();

/**
 * Checks a route's path parameters before the handler runs, by the project's naming
 * convention: `lab` is a lab slug (otherwise 404 naming `lab`: no such lab can exist),
 * every `…Id` is a UUID (otherwise 422 naming it), and every parameter is storable text
 * of at most 200 characters. So a malformed id never reaches a query.
 * @throws AppError not_found / invalid_input naming the parameter.
 */
export function checkParams(params: Record<string, string | string[] | undefined>): void {
  const issues: FieldIssue[] = [];
  for (const [name, raw] of Object.entries(params)) {
    for (const value of Array.isArray(raw) ? raw : raw === undefined ? [] : [raw]) {
      const problem = value.length > 200 ? "at most 200 characters" : textProblem(value);
      if (problem) issues.push({ path: name, message: problem });
      else if (name === "lab" && !LAB_SLUG.test(value)) throw new AppError("not_found", `No lab "${value.slice(0, 64)}" among your labs.`, [{ path: "lab", message: "not a lab's name in a link (lower-case letters, digits and hyphens)" }]);
      else if (name.endsWith("Id") && !uuid.safeParse(value).success) issues.push({ path: name, message: "must be an id (a UUID)" });
    }
  }
  if (issues.length) throw new AppError("invalid_input", "The link is not valid.", issues);
}
