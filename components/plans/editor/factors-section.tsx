"use client";

/**
 * The factors (a field array): each with a name, its low and high natural value and unit,
 * linear or log coding, and what it drives — a process variable (temperature, time,
 * stirring, concentration) or a recipe quantity (equivalents of a reagent, mol % of a
 * catalyst, a ligand's ratio, a co-solvent's fraction).
 */
import { useFieldArray, useFormContext, useWatch } from "react-hook-form";
import { inputClass } from "@/components/ui/field";
import { Button } from "@/components/ui/button";
import { CardMessages, Messages, NumberField, SelectField, TextField } from "./fields";
import { factorFields } from "./form-paths";
import { DEFAULT_UNITS, UNITS_BY_KIND, blankFactor, type BindingKind, type EditorValues, type FactorValues } from "./form-values";
import { useFieldMessages } from "./issue-store";
import { displayUnit } from "../format";

const KIND_WORD: Record<BindingKind, string> = {
  temperature: "Temperature",
  time: "Reaction time",
  stirring: "Stirring rate",
  concentration: "Concentration of the limiting reagent",
  equivalents: "Equivalents of",
  loading: "Loading (mol % of metal) of",
  "ligand-ratio": "Ligand : metal ratio of",
  "solvent-fraction": "Volume fraction of",
};
const NAME_HINT: Record<BindingKind, string> = {
  temperature: "temperature",
  time: "time",
  stirring: "stirring",
  concentration: "concentration",
  equivalents: "Equiv",
  loading: "Loading",
  "ligand-ratio": "Ratio",
  "solvent-fraction": "Fraction",
};

/** The "drives" select's value: the kind, and the component or solvent it names. */
function drivesValue(b: FactorValues["binding"]): string {
  if (b.kind === "equivalents" || b.kind === "loading" || b.kind === "ligand-ratio") return `${b.kind}:${b.component}`;
  if (b.kind === "solvent-fraction") return `${b.kind}:${b.solvent}`;
  return b.kind;
}

function camel(id: string): string {
  return id.replace(/[^A-Za-z0-9_]/g, "");
}

export function FactorsSection() {
  const { control, getValues } = useFormContext<EditorValues>();
  const list = useFieldArray({ control, name: "factors" });
  const add = () => {
    const used = new Set(getValues("factors").map((f) => f.binding.kind));
    const kind: BindingKind = (["temperature", "time", "concentration"] as const).find((k) => !used.has(k)) ?? "time";
    const names = new Set(getValues("factors").map((f) => f.name));
    let name: string = kind;
    for (let i = 2; names.has(name); i++) name = `${kind}${i}`;
    list.append(blankFactor(name, kind));
  };
  return (
    <section className="flex flex-col gap-3" aria-labelledby="factors-heading" data-testid="factors-section">
      <div className="flex items-baseline justify-between gap-2">
        <h2 id="factors-heading">Factors</h2>
        <Button type="button" variant="secondary" onClick={add} data-testid="add-factor">
          Add a factor
        </Button>
      </div>
      <p className="text-sm text-ink-soft">Each factor varies between a low and a high value and drives one quantity of the recipe or the process. Temperature is treated as hard to change: runs are grouped by it, one block per temperature.</p>
      <CardMessages field="factors" />
      {list.fields.length === 0 && <p className="rounded-lg border border-dashed border-ink-line bg-paper-card px-4 py-6 text-center text-sm text-ink-soft">No factors yet: add the first one.</p>}
      {list.fields.map((field, i) => (
        <FactorRow key={field.id} index={i} onRemove={() => list.remove(i)} />
      ))}
    </section>
  );
}

function FactorRow({ index: i, onRemove }: { index: number; onRemove: () => void }) {
  const { control, setValue, getValues } = useFormContext<EditorValues>();
  const base = `factors.${i}` as const;
  const f = useWatch({ control, name: base });
  const components = useWatch({ control, name: "recipe.components" });
  const solvents = useWatch({ control, name: "recipe.solvents" });
  const limiting = useWatch({ control, name: "recipe.limitingReagent" });
  const drivesMessages = useFieldMessages(`${base}.binding`);
  if (!f) return null;
  const fields = new Set(factorFields(f));
  const options: Array<[string, string]> = [
    ["temperature", KIND_WORD.temperature],
    ["time", KIND_WORD.time],
    ["stirring", KIND_WORD.stirring],
    ["concentration", KIND_WORD.concentration],
    ...components.filter((c) => (c.role === "reagent" && c.id !== limiting) || c.role === "additive").map((c): [string, string] => [`equivalents:${c.id}`, `${KIND_WORD.equivalents} ${c.name || c.id}`]),
    ...components.filter((c) => c.role === "catalyst").map((c): [string, string] => [`loading:${c.id}`, `${KIND_WORD.loading} ${c.name || c.id}`]),
    ...components.filter((c) => c.role === "ligand").map((c): [string, string] => [`ligand-ratio:${c.id}`, `${KIND_WORD["ligand-ratio"]} ${c.name || c.id}`]),
    ...(solvents.length > 1 ? solvents.filter((s) => s.name).map((s): [string, string] => [`solvent-fraction:${s.name}`, `${KIND_WORD["solvent-fraction"]} ${s.name}`]) : []),
  ];
  const current = drivesValue(f.binding);
  if (!options.some(([v]) => v === current)) options.push([current, `${KIND_WORD[f.binding.kind]} ${f.binding.component || f.binding.solvent || "(choose)"} — not in the recipe`]);

  const onDrives = (value: string) => {
    const [kindRaw, target = ""] = value.split(/:(.*)/s);
    const kind = kindRaw as BindingKind;
    const prevKind = getValues(`${base}.binding.kind`);
    setValue(`${base}.binding`, { ...getValues(`${base}.binding`), kind, component: kind === "solvent-fraction" ? "" : target, solvent: kind === "solvent-fraction" ? target : "" }, { shouldDirty: true, shouldTouch: true });
    if (!UNITS_BY_KIND[kind].includes(getValues(`${base}.unit`))) setValue(`${base}.unit`, DEFAULT_UNITS[kind], { shouldDirty: true });
    // A factor still named after its old kind follows the new one.
    const name = getValues(`${base}.name`);
    if (prevKind !== kind && (name === "" || name.startsWith(prevKind) || name.endsWith(NAME_HINT[prevKind]))) {
      const next = kind === "equivalents" || kind === "loading" || kind === "ligand-ratio" || kind === "solvent-fraction" ? `${camel(target)}${NAME_HINT[kind]}` : kind;
      const taken = new Set(getValues("factors").filter((_, j) => j !== i).map((x) => x.name));
      let candidate = next;
      for (let k = 2; taken.has(candidate); k++) candidate = `${next}${k}`;
      setValue(`${base}.name`, candidate, { shouldDirty: true });
    }
  };

  return (
    <fieldset className="flex flex-col gap-3 rounded-lg border border-ink-line bg-paper-card p-3" data-testid={`factor-${i}`}>
      <legend className="sr-only">Factor {i + 1}</legend>
      <CardMessages field={base} />
      <div className="grid gap-3 sm:grid-cols-[minmax(0,1.1fr)_minmax(0,2fr)_auto]">
        <TextField name={`${base}.name`} label="Name" mono testId={`factor-${i}-name`} />
        <div className="flex min-w-0 flex-col gap-1">
          <label htmlFor={`${base}.binding`} className="text-xs font-medium text-ink-soft">
            Drives
          </label>
          <select
            id={`${base}.binding`}
            className={`${inputClass} w-full min-w-0 ${drivesMessages.errors.length ? "border-blocks" : ""}`}
            value={current}
            aria-invalid={drivesMessages.errors.length > 0 || undefined}
            onChange={(e) => onDrives(e.target.value)}
            data-testid={`factor-${i}-drives`}
          >
            {options.map(([v, t]) => (
              <option key={v} value={v}>
                {t}
              </option>
            ))}
          </select>
          <Messages field={`${base}.binding`} />
        </div>
        <div className="flex items-end">
          <Button type="button" variant="secondary" className="px-2 py-1 text-xs" onClick={onRemove} aria-label={`Remove factor ${i + 1}`}>
            Remove
          </Button>
        </div>
      </div>
      <div className="grid gap-3 sm:grid-cols-4">
        <NumberField name={`${base}.low`} label="Low" unit={displayUnit(f.unit)} testId={`factor-${i}-low`} />
        <NumberField name={`${base}.high`} label="High" unit={displayUnit(f.unit)} testId={`factor-${i}-high`} />
        <SelectField name={`${base}.unit`} label="Unit" options={UNITS_BY_KIND[f.binding.kind].map((u) => [u, displayUnit(u)] as const)} />
        <SelectField
          name={`${base}.scale`}
          label="Coding"
          options={[
            ["linear", "Linear"],
            ["log", "Log scale"],
          ]}
        />
        {fields.has("binding.hold") && (
          <SelectField
            name={`${base}.binding.hold`}
            label="Keep fixed"
            className="sm:col-span-2"
            options={[
              ["scale", "the scale (the volume follows)"],
              ["volume", "the final volume (the scale follows)"],
            ]}
          />
        )}
      </div>
    </fieldset>
  );
}
