/**
 * The browser's check of the plan editor's document: the plan document's own zod schema
 * (lib/chemistry plan-document) through react-hook-form's zodResolver, on the document the
 * editor would send (form-document.ts), with every issue placed on its field
 * (form-paths.ts). The same check is the form's resolver, so Save refuses what the
 * preview waits on. Zod runs jitless (lib/schemas/text.ts, imported first), as the
 * Content-Security-Policy forbids eval.
 */
// First: chooses zod's interpreter before the plan-document schema is built.
import "@/lib/schemas/text";
import { zodResolver } from "@hookform/resolvers/zod";
import type { FieldErrors, Resolver, ResolverOptions } from "react-hook-form";
import { planDocumentSchema } from "@/lib/chemistry/plan-document";
import type { FieldIssue } from "@/lib/errors/app-error";
import type { LabSettings } from "@/lib/lab-settings/schemas";
import { toDocument, validationDocument } from "./form-document";
import { placeIssues } from "./form-paths";
import type { EditorValues } from "./form-values";

// The resolver checks a plain object (the document the form would send), typed as such here.
const documentResolver = zodResolver(planDocumentSchema) as unknown as Resolver<Record<string, unknown>>;
const OPTIONS: ResolverOptions<Record<string, unknown>> = { fields: {}, shouldUseNativeValidation: false, criteriaMode: "all" };

/** The issues of react-hook-form's nested errors, as dotted paths. */
export function flattenErrors(errors: unknown, prefix: string[] = [], out: FieldIssue[] = []): FieldIssue[] {
  if (!errors || typeof errors !== "object") return out;
  const node = errors as Record<string, unknown>;
  if (typeof node.message === "string" && typeof node.type === "string") {
    const types = node.types && typeof node.types === "object" ? Object.values(node.types as Record<string, unknown>).flat() : [];
    const messages = types.filter((m): m is string => typeof m === "string");
    for (const message of messages.length ? messages : [node.message]) out.push({ path: prefix.join("."), message });
  }
  for (const [k, v] of Object.entries(node)) {
    if (k === "message" || k === "type" || k === "ref" || k === "types") continue;
    flattenErrors(v, k === "root" ? prefix : [...prefix, k], out);
  }
  return out;
}

export interface Checked {
  /** The document the editor would send. */
  document: Record<string, unknown>;
  /** The schema's issues at document paths (without `document.`). */
  issues: FieldIssue[];
}

/** Checks the form's document with the plan document's schema. */
export async function checkValues(values: EditorValues, settings: LabSettings): Promise<Checked> {
  const document = toDocument(values);
  const result = await documentResolver(validationDocument(document, settings), undefined, OPTIONS);
  return { document, issues: flattenErrors(result.errors) };
}

/** The form's resolver: the same check, its issues placed on the fields that hold them. */
export function editorResolver(settings: LabSettings): Resolver<EditorValues> {
  return async (values) => {
    const { issues } = await checkValues(values, settings);
    if (issues.length === 0) return { values, errors: {} };
    const errors: Record<string, { type: string; message: string }> = {};
    for (const [field, messages] of placeIssues(issues, values)) errors[field || "root"] = { type: "schema", message: messages.join(" ") };
    return { values: {}, errors: errors as FieldErrors<EditorValues> };
  };
}

/**
 * The problems of an imported file as the schema finds them in the file itself, before
 * the form drops what it has no field for (an unknown key, a value of the wrong type).
 * The sections the lab's settings replace (dispensing limits, thresholds, temperature
 * limits) are not checked: the editor says it uses the lab's.
 */
export function checkRawDocument(raw: Record<string, unknown>, settings: LabSettings): FieldIssue[] {
  const doc: Record<string, unknown> = { ...raw };
  delete doc.dispensing;
  delete doc.thresholds;
  delete doc.equipment;
  if (doc.block === undefined) doc.block = settings.blocks.defaultId;
  if (doc.vessel === undefined) doc.vessel = settings.vessels.defaultId;
  const r = planDocumentSchema.safeParse(validationDocument(doc, settings));
  return r.success ? [] : r.error.issues.map((i) => ({ path: i.path.map(String).join("."), message: i.message }));
}
