"use client";

import type { FieldErrors, UseFormRegister, UseFormSetError } from "react-hook-form";
import { PEROXIDE_CLASSES, PHYSICAL_STATES, type ChemicalFormInput, type ChemicalRow } from "@/inventory/schemas";
import type { FieldIssue } from "@/lib/errors/app-error";
import { STOCK_UNITS } from "@/inventory/units";
import { Field, inputClass } from "@/components/ui/field";

/** The API's field paths → the form's fields (GHS statements are one text field, the low-stock mark two). */
const PATH_TO_FIELD: Record<string, keyof ChemicalFormInput> = {
  name: "name",
  cas: "cas",
  formula: "formula",
  molarMass: "molarMass",
  density: "density",
  physicalState: "physicalState",
  peroxideClass: "peroxideClass",
  storageNotes: "storageNotes",
  pyrophoric: "pyrophoric",
  waterReactive: "waterReactive",
  lowStock: "lowAmount",
  "lowStock.amount": "lowAmount",
  "lowStock.unit": "lowUnit",
};

/** Puts the server's field issues on the form's fields; returns the issues no field shows. */
export function showChemicalIssues(issues: FieldIssue[], setError: UseFormSetError<ChemicalFormInput>): FieldIssue[] {
  const rest: FieldIssue[] = [];
  for (const i of issues) {
    const f = PATH_TO_FIELD[i.path] ?? (i.path.startsWith("ghsStatements") ? "ghs" : undefined);
    if (f) setError(f, { message: i.message });
    else rest.push(i);
  }
  return rest;
}

export const EMPTY_CHEMICAL_FORM: ChemicalFormInput = { name: "", cas: "", formula: "", molarMass: "", density: "", physicalState: "solid", ghs: "", peroxideClass: "", pyrophoric: false, waterReactive: false, storageNotes: "", lowAmount: "", lowUnit: "g" };

/** "199.091000" → "199.091" (database decimals carry their scale). */
const trimDecimal = (s: string | null) => (s === null ? "" : s.includes(".") ? s.replace(/0+$/, "").replace(/\.$/, "") : s);

/** The form's values for an existing chemical. */
export function chemicalFormValues(c: ChemicalRow): ChemicalFormInput {
  const [lowAmount = "", lowUnit = "g"] = c.lowStock ? c.lowStock.display.split(" ") : [];
  return {
    name: c.name,
    cas: c.cas ?? "",
    formula: c.formula ?? "",
    molarMass: trimDecimal(c.molarMass),
    density: trimDecimal(c.density),
    physicalState: c.physicalState,
    ghs: c.ghsStatements.join(" "),
    peroxideClass: c.peroxideClass ?? "",
    pyrophoric: c.pyrophoric,
    waterReactive: c.waterReactive,
    storageNotes: c.storageNotes ?? "",
    lowAmount,
    lowUnit,
  };
}

/** The chemical's fields, for the add and the edit form alike; `idPrefix` keeps ids unique when both are on the page. */
export function ChemicalFields({ register, errors, idPrefix }: { register: UseFormRegister<ChemicalFormInput>; errors: FieldErrors<ChemicalFormInput>; idPrefix: string }) {
  const err = (k: keyof ChemicalFormInput) => errors[k]?.message;
  const id = (k: string) => `${idPrefix}-${k}`;
  return (
    <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
      <Field label="Name" htmlFor={id("name")} error={err("name")}>
        <input id={id("name")} className={inputClass} {...register("name")} />
      </Field>
      <Field label="CAS number" htmlFor={id("cas")} error={err("cas")} hint="checked by its check digit">
        <input id={id("cas")} className={`${inputClass} num`} placeholder="7732-18-5" {...register("cas")} />
      </Field>
      <Field label="Formula" htmlFor={id("formula")} error={err("formula")}>
        <input id={id("formula")} className={inputClass} {...register("formula")} />
      </Field>
      <Field label="Physical state" htmlFor={id("state")} error={err("physicalState")}>
        <select id={id("state")} className={inputClass} {...register("physicalState")}>
          {PHYSICAL_STATES.map((s) => (
            <option key={s}>{s}</option>
          ))}
        </select>
      </Field>
      <Field label="Molar mass (g/mol)" htmlFor={id("mm")} error={err("molarMass")}>
        <input id={id("mm")} inputMode="decimal" className={`${inputClass} num`} {...register("molarMass")} />
      </Field>
      <Field label="Density (g/mL)" htmlFor={id("density")} error={err("density")}>
        <input id={id("density")} inputMode="decimal" className={`${inputClass} num`} {...register("density")} />
      </Field>
      <Field label="GHS statements" htmlFor={id("ghs")} error={err("ghs")} hint="e.g. H225 H319 EUH019">
        <input id={id("ghs")} className={inputClass} {...register("ghs")} />
      </Field>
      <Field label="Peroxide-former class" htmlFor={id("perox")} error={err("peroxideClass")}>
        <select id={id("perox")} className={inputClass} {...register("peroxideClass")}>
          <option value="">not a peroxide former</option>
          {PEROXIDE_CLASSES.map((c) => (
            <option key={c} value={c}>
              class {c}
            </option>
          ))}
        </select>
      </Field>
      <Field label="Low-stock mark" htmlFor={id("low")} error={err("lowAmount") ?? err("lowUnit")}>
        <div className="flex gap-2">
          <input id={id("low")} inputMode="decimal" className={`${inputClass} num w-full`} {...register("lowAmount")} />
          <select aria-label="Low-stock unit" className={inputClass} {...register("lowUnit")}>
            {STOCK_UNITS.map((u) => (
              <option key={u}>{u}</option>
            ))}
          </select>
        </div>
      </Field>
      <div className="flex flex-col justify-center gap-2 pt-1 sm:pt-6">
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" {...register("pyrophoric")} /> pyrophoric (H250)
        </label>
        <label className="flex items-center gap-2 text-sm">
          <input type="checkbox" {...register("waterReactive")} /> water-reactive (H260/H261/EUH014)
        </label>
      </div>
      <div className="sm:col-span-2">
        <Field label="Storage notes" htmlFor={id("notes")} error={err("storageNotes")}>
          <textarea id={id("notes")} rows={2} className={`${inputClass} resize-y`} {...register("storageNotes")} />
        </Field>
      </div>
    </div>
  );
}
