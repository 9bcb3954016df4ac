/**
 * Where an issue shows in the plan editor. The server names bad fields at
 * `document.<path>` (the schema's paths, and the engines' mapped to document paths, e.g.
 * `document.factors.0.high` or `document.design.alpha`); the browser's check with the same
 * schema names them at `<path>`. Every issue lands on the field that holds the value, or,
 * when no field shows it (a value the form carries, an array as a whole), on the nearest
 * card or section that does — never nowhere.
 *
 * Which fields the editor shows for a component, solvent, factor or design is decided
 * here too (`componentFields`, …): the form renders exactly these, so the mapping and the
 * form cannot disagree.
 */
import type { FieldIssue } from "@/lib/errors/app-error";
import { designFieldsOf, ghsList } from "./form-document";
import type { ComponentValues, EditorValues, FactorValues } from "./form-values";

/** The read-only panel of the values the plan is computed with (dispensing limits, thresholds). */
export const SETTINGS_FIELD = "settings";
/** Issues no field or card holds: shown above the form. */
export const FORM_LEVEL = "";

const COMPONENT_ALWAYS = [
  "id",
  "name",
  "role",
  "chemicalId",
  "formula",
  "molarMassGPerMol",
  "smiles",
  "casNumber",
  "form.state",
  "solubilityMgPerMl",
  "stockSolvent",
  "dispense",
  "addSeparately",
  "addOrder",
  "gasReleasedMolPerMol",
  "hazards.ghs",
  "hazards.pyrophoric",
  "hazards.waterReactive",
  "hazards.peroxideClass",
  "hazards.protic",
  "hazards.aqueous",
  "hazards.openedOn",
  "hazards.peroxideTestedOn",
  "hazards.receivedOn",
  "hazards.expiresOn",
] as const;

/** The fields (relative to the component) the editor shows for this component. */
export function componentFields(c: Pick<ComponentValues, "role" | "form" | "id">, limitingReagent: string): string[] {
  const byState =
    c.form.state === "solid" ? ["form.purityWtPercent"] : c.form.state === "liquid" ? ["form.densityGPerMl", "form.purityWtPercent"] : ["form.molarityM", "form.wtPercent", "form.densityGPerMl", "form.solvent"];
  const byRole =
    c.role === "catalyst"
      ? ["loadingMolPercent", "metalAtomsPerFormula"]
      : c.role === "ligand"
        ? ["ligandToMetalRatio", "catalyst"]
        : c.role === "reagent" && c.id === limitingReagent
          ? []
          : ["equivalents"];
  return [...COMPONENT_ALWAYS, ...byState, ...byRole];
}

/** The advanced fields of a component (behind "More"): a card opens them when one has an issue. */
export const COMPONENT_ADVANCED = new Set(["smiles", "casNumber", "solubilityMgPerMl", "stockSolvent", "dispense", "addSeparately", "addOrder", "gasReleasedMolPerMol", "hazards.protic", "hazards.aqueous", "hazards.openedOn", "hazards.peroxideTestedOn", "hazards.receivedOn", "hazards.expiresOn"]);

export const SOLVENT_FIELDS = ["name", "volumeFraction", "chemicalId", "ghs", "peroxideClass", "protic", "aqueous", "openedOn", "peroxideTestedOn", "receivedOn", "expiresOn"] as const;
export const SOLVENT_ADVANCED = new Set(["protic", "aqueous", "openedOn", "peroxideTestedOn", "receivedOn", "expiresOn"]);

/** The fields (relative to the factor) the editor shows for this factor. */
export function factorFields(f: Pick<FactorValues, "binding">): string[] {
  return ["name", "low", "high", "unit", "scale", "binding", ...(f.binding.kind === "concentration" ? ["binding.hold"] : [])];
}

/** The recipe's fields: the amount of solvent by concentration or by final volume, as chosen. */
export function recipeFields(r: EditorValues["recipe"]): string[] {
  return ["limitingReagent", "scaleMmol", "basis", r.basis === "volume" ? "finalVolumeUl" : "concentrationM", "temperatureC", "timeH", "stirringRpm", "concentratesOrHeatsToDryness"];
}

/** Where an issue shows and what it says there. */
export interface PlacedIssue {
  /** A field path of the form, a card (`recipe.components.1`), a section (`factors`, `design`), SETTINGS_FIELD or FORM_LEVEL. */
  field: string;
  message: string;
}

const index = (part: string | undefined): number | null => (part !== undefined && /^\d+$/.test(part) ? Number(part) : null);

/** The longest of `fields` that `rest` starts with (as dotted parts), or null. */
function longestField(rest: string[], fields: readonly string[]): string | null {
  for (let k = rest.length; k > 0; k--) {
    const candidate = rest.slice(0, k).join(".");
    if (fields.includes(candidate)) return candidate;
  }
  return null;
}

/** The message, prefixed with the part of the path no field stood for (so the person can find it). */
const withRest = (rest: string[], message: string) => (rest.length ? `${rest.join(".")}: ${message}` : message);

function placeComponent(parts: string[], values: EditorValues, message: string): PlacedIssue {
  const i = index(parts[2]);
  const list = values.recipe.components;
  if (i === null || i >= list.length) return { field: "recipe.components", message: withRest(parts.slice(2), message) };
  const c = list[i]!;
  const base = `recipe.components.${i}`;
  const rest = parts.slice(3);
  const fields = componentFields(c, values.recipe.limitingReagent);
  if (rest[0] === "hazards" && rest[1] === "ghs") return { field: `${base}.hazards.ghs`, message: ghsMessage(c.hazards.ghs, rest[2], message) };
  const hit = longestField(rest, fields);
  if (hit) return { field: `${base}.${hit}`, message: withRest(rest.slice(hit.split(".").length), message) };
  if (rest[0] === "form") return { field: `${base}.form.state`, message: withRest(rest.slice(1), message) };
  if (["equivalents", "loadingMolPercent", "metalAtomsPerFormula", "ligandToMetalRatio", "catalyst"].includes(rest[0] ?? "")) return { field: `${base}.role`, message: withRest(rest, message) };
  return { field: base, message: withRest(rest, message) };
}

function placeSolvent(parts: string[], values: EditorValues, message: string): PlacedIssue {
  const i = index(parts[2]);
  const list = values.recipe.solvents;
  if (i === null || i >= list.length) return { field: "recipe.solvents", message: withRest(parts.slice(2), message) };
  const base = `recipe.solvents.${i}`;
  const rest = parts.slice(3);
  if (rest[0] === "ghs") return { field: `${base}.ghs`, message: ghsMessage(list[i]!.ghs, rest[1], message) };
  const hit = longestField(rest, SOLVENT_FIELDS);
  if (hit) return { field: `${base}.${hit}`, message: withRest(rest.slice(1), message) };
  return { field: base, message: withRest(rest, message) };
}

/** A GHS list issue names the entry it is about. */
function ghsMessage(text: string, part: string | undefined, message: string): string {
  const i = index(part);
  const entry = i === null ? undefined : ghsList(text)[i];
  return entry === undefined ? message : `“${entry}”: ${message}`;
}

function placeFactor(parts: string[], values: EditorValues, message: string): PlacedIssue {
  const i = index(parts[1]);
  if (i === null || i >= values.factors.length) return { field: "factors", message: withRest(parts.slice(1), message) };
  const base = `factors.${i}`;
  const rest = parts.slice(2);
  const fields = factorFields(values.factors[i]!);
  const hit = longestField(rest, fields);
  if (hit) return { field: `${base}.${hit}`, message: withRest(rest.slice(hit.split(".").length), message) };
  return { field: base, message: withRest(rest, message) };
}

function placeDesign(parts: string[], values: EditorValues, message: string): PlacedIssue {
  const d = values.design;
  const rest = parts.slice(1);
  if (d.design === "given") return { field: "design.design", message: withRest(rest, message) };
  const fields = designFieldsOf(d) as string[];
  const key = rest[0];
  if (key === "alpha" && d.alpha === "custom" && fields.includes("alphaValue")) return { field: "design.alphaValue", message: withRest(rest.slice(1), message) };
  if (key === "model" && d.model === "custom") return { field: "design.model", message: withRest(rest.slice(1), message) };
  if (key !== undefined && fields.includes(key)) return { field: `design.${key}`, message: withRest(rest.slice(1), message) };
  return { field: "design", message: withRest(rest, message) };
}

/**
 * Where an issue shows in the editor (module comment). `path` is the server's
 * (`document.recipe.components.0.form.densityGPerMl`) or the browser's (without `document.`).
 */
export function placeIssue(issue: FieldIssue, values: EditorValues): PlacedIssue {
  const path = issue.path === "document" ? "" : issue.path.startsWith("document.") ? issue.path.slice("document.".length) : issue.path;
  const parts = path.split(".").filter((p) => p !== "");
  const message = issue.message;
  const [head, second] = parts;
  switch (head) {
    case undefined:
      return { field: FORM_LEVEL, message };
    case "name":
      return { field: "name", message: withRest(parts.slice(1), message) };
    case "vessel":
      return { field: "vessel", message: withRest(parts.slice(1), message) };
    case "block":
    case "equipment":
      return { field: "block", message: withRest(head === "equipment" ? parts : parts.slice(1), message) };
    case "dispensing":
    case "thresholds":
      return { field: SETTINGS_FIELD, message: withRest(parts, message) };
    case "recipe": {
      if (second === "components") return placeComponent(parts, values, message);
      if (second === "solvents") return placeSolvent(parts, values, message);
      if (second === "concentrationM" || second === "finalVolumeUl") {
        return { field: values.recipe.basis === "volume" ? "recipe.finalVolumeUl" : "recipe.concentrationM", message: withRest(parts.slice(2), message) };
      }
      const hit = longestField(parts.slice(1), recipeFields(values.recipe));
      if (hit) return { field: `recipe.${hit}`, message: withRest(parts.slice(1 + hit.split(".").length), message) };
      return { field: "recipe", message: withRest(parts.slice(1), message) };
    }
    case "factors":
      return placeFactor(parts, values, message);
    case "design":
      return placeDesign(parts, values, message);
    default:
      return { field: FORM_LEVEL, message: withRest(parts, message) };
  }
}

/** Issues grouped by where they show, each message once. */
export function placeIssues(issues: readonly FieldIssue[], values: EditorValues): Map<string, string[]> {
  const out = new Map<string, string[]>();
  for (const issue of issues) {
    const p = placeIssue(issue, values);
    const list = out.get(p.field) ?? [];
    if (!list.includes(p.message)) list.push(p.message);
    out.set(p.field, list);
  }
  return out;
}
