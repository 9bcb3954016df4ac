/**
 * Component ids of the plan editor: short, readable, unique, and valid for the plan
 * document (`COMPONENT_ID_PATTERN`: a letter, then letters, digits, _ or -). Bindings,
 * the limiting reagent and a ligand's catalyst refer to components by id, so renaming one
 * renames every reference (`renameComponent`). Pure.
 */
import type { EditorValues } from "./form-values";

/** A new id from a chemical's name ("4-Bromoanisole" → "bromoanisole", "XPhos Pd G3" → "xphos"), unique among `taken`. */
export function idFromName(name: string, taken: ReadonlySet<string>): string {
  const words = name.split(/[^A-Za-z0-9]+/).filter((w) => /[A-Za-z]/.test(w));
  let base = (words[0] ?? "c").toLowerCase();
  if (base.length < 3 && words[1]) base += words[1].charAt(0).toUpperCase() + words[1].slice(1).toLowerCase();
  base = base.replace(/^[^A-Za-z]+/, "").slice(0, 20) || "c";
  if (!taken.has(base)) return base;
  for (let i = 2; ; i++) if (!taken.has(`${base}${i}`)) return `${base}${i}`;
}

/** The next free "c<n>" id. */
export function nextId(taken: ReadonlySet<string>): string {
  for (let i = 1; ; i++) if (!taken.has(`c${i}`)) return `c${i}`;
}

/** The paths and values to set so that every reference to component `from` names `to`. */
export function renameComponent(values: EditorValues, from: string, to: string): Array<[string, string]> {
  if (!from || from === to) return [];
  const out: Array<[string, string]> = [];
  if (values.recipe.limitingReagent === from) out.push(["recipe.limitingReagent", to]);
  values.recipe.components.forEach((c, i) => {
    if (c.catalyst === from) out.push([`recipe.components.${i}.catalyst`, to]);
  });
  values.factors.forEach((f, i) => {
    if (f.binding.component === from) out.push([`factors.${i}.binding.component`, to]);
  });
  return out;
}
