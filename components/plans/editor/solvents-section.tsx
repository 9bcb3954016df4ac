"use client";

/**
 * The solvent system (a field array): one solvent or a mixture by volume fraction, each
 * a name or CAS number the hazard engine's solvent records know (suggested as you type),
 * optionally linked to the lab's catalogue (its hazards and container dates then come from
 * the inventory), with its GHS statements and peroxide class.
 */
import { useState } from "react";
import { useFieldArray, useFormContext, useWatch } from "react-hook-form";
import type { ChemicalRow } from "@/inventory/schemas";
import { Button } from "@/components/ui/button";
import { ChemicalPicker } from "./chemical-picker";
import { CardMessages, DateField, NumberField, SelectField, TextField } from "./fields";
import { SOLVENT_ADVANCED } from "./form-paths";
import { blankSolvent, type EditorValues } from "./form-values";
import { useHasErrorUnder } from "./issue-store";
import { significant } from "../format";

/** A solvent record of the hazard engine: its name and CAS number (what a solvent may be called). */
export interface KnownSolvent {
  name: string;
  cas: string | null;
}

const PEROXIDE_OPTIONS = [
  ["", "Not stated"],
  ["none", "Not a peroxide former"],
  ["A", "Class A"],
  ["B", "Class B"],
  ["C", "Class C"],
  ["D", "Class D"],
] as const;
const TRI_OPTIONS = [
  ["", "By name (default)"],
  ["yes", "Yes"],
  ["no", "No"],
] as const;

export function SolventsSection({ chemicals, knownSolvents }: { chemicals: readonly ChemicalRow[]; knownSolvents: readonly KnownSolvent[] }) {
  const { control, setValue, getValues } = useFormContext<EditorValues>();
  const list = useFieldArray({ control, name: "recipe.solvents" });
  const solvents = useWatch({ control, name: "recipe.solvents" });
  const sum = solvents.reduce((a, s) => a + (typeof s.volumeFraction === "number" && Number.isFinite(s.volumeFraction) ? s.volumeFraction : 0), 0);

  const pick = (i: number, chem: ChemicalRow) => {
    const record = knownSolvents.find((k) => (chem.cas && k.cas === chem.cas) || k.name.toLowerCase() === chem.name.toLowerCase());
    const current = getValues(`recipe.solvents.${i}`);
    setValue(
      `recipe.solvents.${i}`,
      { ...current, name: record?.name ?? chem.name, chemicalId: chem.id, ghs: chem.ghsStatements.join(", "), peroxideClass: chem.peroxideClass ?? "" },
      { shouldDirty: true, shouldTouch: true },
    );
  };

  return (
    <section className="flex flex-col gap-3" aria-labelledby="solvents-heading" data-testid="solvents-section">
      <div className="flex items-baseline justify-between gap-2">
        <h2 id="solvents-heading">Solvent system</h2>
        <Button type="button" variant="secondary" onClick={() => list.append(blankSolvent("", 0))} data-testid="add-solvent">
          Add a co-solvent
        </Button>
      </div>
      <p className="num text-sm text-ink-soft" data-testid="solvent-sum">
        Volume fractions sum to {significant(sum, 4)}
        {Math.abs(sum - 1) > 1e-6 ? " — they must sum to 1" : ""}.
      </p>
      <CardMessages field="recipe.solvents" />
      <datalist id="known-solvents">
        {knownSolvents.map((k) => (
          <option key={k.name} value={k.name} />
        ))}
      </datalist>
      {list.fields.map((field, i) => (
        <SolventRow key={field.id} index={i} chemicals={chemicals} onPick={(c) => pick(i, c)} onRemove={() => list.remove(i)} canRemove={list.fields.length > 1} />
      ))}
    </section>
  );
}

function SolventRow({ index: i, chemicals, onPick, onRemove, canRemove }: { index: number; chemicals: readonly ChemicalRow[]; onPick: (c: ChemicalRow) => void; onRemove: () => void; canRemove: boolean }) {
  const { control, setValue } = useFormContext<EditorValues>();
  const base = `recipe.solvents.${i}` as const;
  const s = useWatch({ control, name: base });
  const [more, setMore] = useState(false);
  const advancedError = useHasErrorUnder([...SOLVENT_ADVANCED].map((f) => `${base}.${f}`));
  const linked = s?.chemicalId ? chemicals.find((c) => c.id === s.chemicalId) : undefined;
  if (!s) return null;
  return (
    <fieldset className="flex flex-col gap-3 rounded-lg border border-ink-line bg-paper-card p-3" data-testid={`solvent-${i}`}>
      <legend className="sr-only">Solvent {i + 1}</legend>
      <CardMessages field={base} />
      <div className="grid gap-3 sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)_auto]">
        <TextField name={`${base}.name`} label="Solvent (name or CAS number)" list="known-solvents" testId={`solvent-${i}-name`} />
        <NumberField name={`${base}.volumeFraction`} label="Volume fraction" unit="v/v" testId={`solvent-${i}-fraction`} />
        <div className="flex items-end">
          <Button type="button" variant="secondary" className="px-2 py-1 text-xs" onClick={onRemove} disabled={!canRemove} aria-label={`Remove solvent ${i + 1}`}>
            Remove
          </Button>
        </div>
      </div>
      <div className="flex flex-col gap-1">
        {s.chemicalId && (
          <p className="text-sm">
            From the catalogue: <strong>{linked?.name ?? s.chemicalId}</strong>{" "}
            <button type="button" className="text-xs text-accent underline-offset-2 hover:underline" onClick={() => setValue(`${base}.chemicalId`, "", { shouldDirty: true })}>
              unlink
            </button>
          </p>
        )}
        <ChemicalPicker chemicals={chemicals} onPick={onPick} label="Link to a solvent of the lab's catalogue (optional)" testId={`solvent-${i}-pick`} />
      </div>
      <div className="grid gap-3 sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
        <TextField name={`${base}.ghs`} label="GHS statements" mono />
        <SelectField name={`${base}.peroxideClass`} label="Peroxide former" options={PEROXIDE_OPTIONS} />
      </div>
      <div>
        <button type="button" className="text-sm text-accent underline-offset-2 hover:underline" aria-expanded={more || advancedError} onClick={() => setMore((m) => !m)}>
          {more || advancedError ? "Fewer details" : "More: protic, aqueous, container dates"}
        </button>
      </div>
      {(more || advancedError) && (
        <div className="grid gap-3 border-t border-ink-line pt-3 sm:grid-cols-3">
          <SelectField name={`${base}.protic`} label="Protic" options={TRI_OPTIONS} />
          <SelectField name={`${base}.aqueous`} label="Aqueous" options={TRI_OPTIONS} />
          <div />
          <DateField name={`${base}.openedOn`} label="Container opened" />
          <DateField name={`${base}.peroxideTestedOn`} label="Last peroxide test" />
          <DateField name={`${base}.receivedOn`} label="Received" />
          <DateField name={`${base}.expiresOn`} label="Expires" />
        </div>
      )}
    </fieldset>
  );
}
