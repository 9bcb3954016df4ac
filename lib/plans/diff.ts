/**
 * What changed between two versions of a plan document, for people (pure): the review
 * page's "changed since the last review" and the timeline's edits. The documents are
 * walked field by field; lists of components are matched by their `id`, lists of
 * solvents and factors by their `name` (so a reordered list is no change, and a change
 * reads "component Boronic acid: equivalents 1.3 → 1.5" rather than "components.1"),
 * other lists of records by position, and lists of plain values (GHS statements,
 * generators) compared as one value. Values are formatted as the audit log formats them
 * (lib/audit/changes.ts `formatValue`, `fieldLabel`).
 */
import { fieldLabel, formatValue, type FieldChange } from "../audit/changes";

type Json = null | boolean | number | string | Json[] | { [key: string]: Json };
type JsonRecord = { [key: string]: Json };

export interface DocumentChange extends FieldChange {
  /** Where in the document, with list items named by their key: `recipe.components[base].equivalents`. */
  path: string;
}

const isRecord = (v: unknown): v is JsonRecord => typeof v === "object" && v !== null && !Array.isArray(v);

/** The key that names the items of the list at `path`, if its items are records with one. */
function listKey(path: string): "id" | "name" | null {
  if (path === "recipe.components") return "id";
  if (path === "recipe.solvents" || path === "factors") return "name";
  return null;
}

/** A person's name for a list item: `component "KB-PyB-3 …"`, `solvent water`, `factor temperature`. */
function itemLabel(path: string, item: JsonRecord, key: string): string {
  if (path === "recipe.components") return `component ${typeof item.name === "string" ? item.name : key}`;
  if (path === "recipe.solvents") return `solvent ${key}`;
  if (path === "factors") return `factor ${key}`;
  return `${fieldLabel(path.split(".").pop() ?? path)} ${key}`;
}

const SKIP = new Set(["schemaVersion"]);

function short(value: Json): string | null {
  const text = formatValue(value);
  return text === null ? null : text.length > 240 ? `${text.slice(0, 237)}…` : text;
}

function same(a: Json | undefined, b: Json | undefined): boolean {
  return JSON.stringify(a ?? null) === JSON.stringify(b ?? null);
}

function walk(before: Json | undefined, after: Json | undefined, path: string, label: string[], out: DocumentChange[]): void {
  if (same(before, after)) return;
  const field = path.split(".").pop() ?? path;
  const leaf = () => out.push({ path, field, label: label.join(": ") || fieldLabel(field), before: before === undefined ? null : short(before), after: after === undefined ? null : short(after) });

  if (isRecord(before) && isRecord(after)) {
    for (const k of [...new Set([...Object.keys(before), ...Object.keys(after)])]) {
      if (SKIP.has(k)) continue;
      // The recipe's parts read well alone ("component …", "scale mmol"): no "recipe:" before them.
      walk(before[k], after[k], path ? `${path}.${k}` : k, path === "" && k === "recipe" ? label : [...label, fieldLabel(k)], out);
    }
    return;
  }
  const key = listKey(path);
  if (key && Array.isArray(before) && Array.isArray(after) && [...before, ...after].every((x) => isRecord(x) && typeof x[key] === "string")) {
    const b = new Map(before.map((x) => [(x as JsonRecord)[key] as string, x as JsonRecord]));
    const a = new Map(after.map((x) => [(x as JsonRecord)[key] as string, x as JsonRecord]));
    const parent = label.slice(0, -1);
    for (const k of [...new Set([...b.keys(), ...a.keys()])]) {
      const item = a.get(k) ?? b.get(k)!;
      const name = itemLabel(path, item, k);
      const itemPath = `${path}[${k}]`;
      const was = b.get(k);
      const now = a.get(k);
      if (!was || !now) {
        out.push({ path: itemPath, field: key, label: [...parent, name].join(": "), before: was ? "present" : null, after: now ? "added" : null });
        continue;
      }
      walk(was, now, itemPath, [...parent, name], out);
    }
    const order = (xs: Json[]) => xs.map((x) => (x as JsonRecord)[key]).join("\u0000");
    if (b.size === a.size && [...b.keys()].every((k) => a.has(k)) && order(before) !== order(after)) {
      out.push({ path, field: path.split(".").pop() ?? path, label: `${label.join(": ")} order`, before: before.map((x) => String((x as JsonRecord)[key])).join(", "), after: after.map((x) => String((x as JsonRecord)[key])).join(", ") });
    }
    return;
  }
  if (Array.isArray(before) && Array.isArray(after) && [...before, ...after].some(isRecord)) {
    for (let i = 0; i < Math.max(before.length, after.length); i++) walk(before[i], after[i], `${path}.${i}`, [...label, `#${i + 1}`], out);
    return;
  }
  leaf();
}

/**
 * The changes from `before` to `after` (plan documents as stored), in document order.
 * Either may be null (no earlier version: every field is new).
 */
export function diffDocuments(before: unknown, after: unknown): DocumentChange[] {
  const out: DocumentChange[] = [];
  walk((before ?? {}) as Json, (after ?? {}) as Json, "", [], out);
  return out;
}
