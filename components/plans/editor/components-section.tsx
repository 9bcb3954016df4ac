"use client";

/**
 * The recipe's components (a field array): each picked from the lab's catalogue — name,
 * formula (or molar mass), CAS number, state, density and hazards filled in from the
 * chemical record, assay or molarity from the container the inventory would use, and the
 * `chemicalId` kept so release can reserve it — or typed by hand; its role and amount
 * (equivalents, mol % of metal, ligand-to-metal ratio); and, behind "More", how it is
 * dispensed and the container dates the peroxide rules read.
 */
import { useState, type ReactNode } from "react";
import { useFieldArray, useFormContext, useWatch } from "react-hook-form";
import type { ChemicalRow } from "@/inventory/schemas";
import { getJson } from "@/lib/client/fetch-json";
import type { PreviewInventoryLine } from "@/lib/plans/preview";
import { Button } from "@/components/ui/button";
import { ChemicalPicker } from "./chemical-picker";
import { CardMessages, CheckField, DateField, Messages, NumberField, SelectField, TextField } from "./fields";
import { COMPONENT_ADVANCED, componentFields } from "./form-paths";
import { DISPENSE_MODES, ROLES, blankComponent, blankHazards, type ComponentValues, type EditorValues, type PhysicalState } from "./form-values";
import { idFromName, nextId, renameComponent } from "./ids";
import { useHasErrorUnder } from "./issue-store";

const ROLE_WORD: Record<string, string> = { reagent: "Reagent", catalyst: "Catalyst", ligand: "Ligand", additive: "Additive" };
const STATE_OPTIONS = [
  ["solid", "Solid"],
  ["liquid", "Neat liquid"],
  ["solution", "Solution as supplied"],
] as const;
const DISPENSE_WORD: Record<(typeof DISPENSE_MODES)[number], string> = { auto: "Chosen by the planner", stock: "In a stock solution", solid: "Weighed into each vial", neat: "As supplied (neat)" };
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

/** What the preview computed about a component. */
export interface ComputedComponent {
  molarMassGPerMol: number;
  dispensedAs: string;
  source: string;
}

function stateOf(c: ChemicalRow): PhysicalState {
  return c.physicalState === "liquid" ? "liquid" : c.physicalState === "solution" ? "solution" : "solid";
}

export function ComponentsSection({ labSlug, chemicals, chemicalsLoading, computed }: { labSlug: string; chemicals: readonly ChemicalRow[]; chemicalsLoading: boolean; computed: ReadonlyMap<string, ComputedComponent> }) {
  const { control, getValues, setValue } = useFormContext<EditorValues>();
  const list = useFieldArray({ control, name: "recipe.components" });
  const [fromInventory, setFromInventory] = useState<Record<string, string>>({});

  const ids = () => new Set(getValues("recipe.components").map((c) => c.id));

  /** Fills a component from a catalogue record, then its assay or molarity from the container the inventory would use. */
  const fill = async (i: number, key: string, chem: ChemicalRow) => {
    const current = getValues(`recipe.components.${i}`);
    const taken = ids();
    taken.delete(current.id);
    const isAuto = /^c\d+$/.test(current.id);
    const id = isAuto ? idFromName(chem.name, taken) : current.id;
    const state = stateOf(chem);
    const next: ComponentValues = {
      ...current,
      id,
      name: chem.name,
      chemicalId: chem.id,
      formula: chem.formula ?? "",
      molarMassGPerMol: chem.formula ? undefined : chem.molarMass ? Number(chem.molarMass) : undefined,
      casNumber: chem.cas ?? "",
      form: {
        ...current.form,
        state,
        densityGPerMl: chem.density && state !== "solid" ? Number(chem.density) : undefined,
        purityWtPercent: state === "solution" ? undefined : (current.form.purityWtPercent ?? 100),
      },
      hazards: {
        ...blankHazards(),
        ...current.hazards,
        ghs: chem.ghsStatements.join(", "),
        pyrophoric: chem.pyrophoric,
        waterReactive: chem.waterReactive,
        peroxideClass: chem.peroxideClass ?? "",
      },
    };
    if (isAuto && current.id !== id) for (const [path, value] of renameComponent(getValues(), current.id, id)) setValue(path as "recipe.limitingReagent", value, { shouldDirty: true });
    setValue(`recipe.components.${i}`, next, { shouldDirty: true, shouldTouch: true });
    try {
      const { inventory } = await getJson<{ inventory: Record<string, PreviewInventoryLine> }>(`/api/labs/${labSlug}/plans/preview?chemicals=${chem.id}`);
      const box = inventory[chem.id]?.container ?? null;
      if (getValues(`recipe.components.${i}.chemicalId`) !== chem.id) return;
      if (!box) {
        setFromInventory((m) => ({ ...m, [key]: `No usable container of ${chem.name} in the inventory: release will report a shortfall.` }));
        return;
      }
      if (state === "solution" && box.molarityM !== null) setValue(`recipe.components.${i}.form.molarityM`, box.molarityM, { shouldDirty: true });
      if (state !== "solution" && box.purityPercent !== null) setValue(`recipe.components.${i}.form.purityWtPercent`, box.purityPercent, { shouldDirty: true });
      const what = state === "solution" ? (box.molarityM !== null ? `molarity ${box.molarityM} M` : null) : box.purityPercent !== null ? `assay ${box.purityPercent} %` : null;
      setFromInventory((m) => ({ ...m, [key]: `From container ${box.barcode}${what ? `: ${what}` : ""} (the one the inventory would use).` }));
    } catch {
      setFromInventory((m) => ({ ...m, [key]: "The container could not be read; check the assay by hand." }));
    }
  };

  const add = () => list.append({ ...blankComponent(nextId(ids())) });

  return (
    <section className="flex flex-col gap-3" aria-labelledby="components-heading" data-testid="components-section">
      <div className="flex items-baseline justify-between gap-2">
        <h2 id="components-heading">Components</h2>
        <Button type="button" variant="secondary" onClick={add} data-testid="add-component">
          Add a component
        </Button>
      </div>
      <CardMessages field="recipe.components" />
      {list.fields.map((field, i) => (
        <ComponentCard
          key={field.id}
          index={i}
          chemicals={chemicals}
          chemicalsLoading={chemicalsLoading}
          computed={computed}
          inventoryNote={fromInventory[field.id]}
          onPick={(c) => void fill(i, field.id, c)}
          onUnlink={() => setValue(`recipe.components.${i}.chemicalId`, "", { shouldDirty: true })}
          onRemove={() => list.remove(i)}
          canRemove={list.fields.length > 1}
        />
      ))}
    </section>
  );
}

function ComponentCard({
  index: i,
  chemicals,
  chemicalsLoading,
  computed,
  inventoryNote,
  onPick,
  onUnlink,
  onRemove,
  canRemove,
}: {
  index: number;
  chemicals: readonly ChemicalRow[];
  chemicalsLoading: boolean;
  computed: ReadonlyMap<string, ComputedComponent>;
  inventoryNote?: string;
  onPick: (c: ChemicalRow) => void;
  onUnlink: () => void;
  onRemove: () => void;
  canRemove: boolean;
}) {
  const { control, register, getValues, setValue } = useFormContext<EditorValues>();
  const base = `recipe.components.${i}` as const;
  const c = useWatch({ control, name: base });
  const limiting = useWatch({ control, name: "recipe.limitingReagent" });
  const solvents = useWatch({ control, name: "recipe.solvents" });
  const components = useWatch({ control, name: "recipe.components" });
  const advancedPaths = [...COMPONENT_ADVANCED].map((f) => `${base}.${f}`);
  const advancedError = useHasErrorUnder(advancedPaths);
  const [more, setMore] = useState(false);
  const [idBefore, setIdBefore] = useState<string | null>(null);
  if (!c) return null;
  const fields = new Set(componentFields(c, limiting));
  const linked = c.chemicalId ? chemicals.find((x) => x.id === c.chemicalId) : undefined;
  const info = computed.get(c.id);
  const catalysts = components.filter((x) => x.role === "catalyst");
  const showMore = more || advancedError;
  const idReg = register(`${base}.id`);

  const onRole = (role: string) => {
    if (role === "catalyst" && getValues(`${base}.loadingMolPercent`) === undefined) setValue(`${base}.loadingMolPercent`, 1, { shouldDirty: true });
    if (role === "ligand" && getValues(`${base}.ligandToMetalRatio`) === undefined) setValue(`${base}.ligandToMetalRatio`, 2, { shouldDirty: true });
    if ((role === "reagent" || role === "additive") && getValues(`${base}.equivalents`) === undefined && getValues("recipe.limitingReagent") !== c.id) setValue(`${base}.equivalents`, 1, { shouldDirty: true });
  };

  return (
    <fieldset className="flex flex-col gap-3 rounded-lg border border-ink-line bg-paper-card p-3" data-testid={`component-${i}`}>
      <legend className="sr-only">Component {i + 1}</legend>
      <div className="flex flex-wrap items-center justify-between gap-2">
        <p className="text-sm font-semibold">
          <span className="text-ink-faint">{i + 1}.</span> {c.name || "New component"}
          {c.role === "reagent" && c.id === limiting && (
            <span className="ml-2 rounded bg-accent-light px-1.5 py-0.5 text-xs font-medium text-accent" data-testid={`component-${i}-limiting`}>
              limiting reagent
            </span>
          )}
        </p>
        <div className="flex items-center gap-3">
          {c.role === "reagent" && c.id !== limiting && (
            <button type="button" className="text-sm text-accent underline-offset-2 hover:underline" onClick={() => setValue("recipe.limitingReagent", c.id, { shouldDirty: true, shouldTouch: true })} data-testid={`component-${i}-make-limiting`}>
              Make it the limiting reagent
            </button>
          )}
          <Button type="button" variant="secondary" className="px-2 py-1 text-xs" onClick={onRemove} disabled={!canRemove} aria-label={`Remove component ${i + 1}`}>
            Remove
          </Button>
        </div>
      </div>
      <CardMessages field={base} />

      <div className="flex flex-col gap-1">
        {linked || c.chemicalId ? (
          <p className="text-sm" data-testid={`component-${i}-linked`}>
            From the catalogue: <strong>{linked?.name ?? c.chemicalId}</strong>{" "}
            <button type="button" className="text-xs text-accent underline-offset-2 hover:underline" onClick={onUnlink}>
              unlink
            </button>
          </p>
        ) : null}
        <ChemicalPicker chemicals={chemicals} loading={chemicalsLoading} onPick={onPick} label={linked ? "Pick another chemical from the catalogue" : "Pick from the lab's chemicals (or type the component below)"} testId={`component-${i}-pick`} />
        <Messages field={`${base}.chemicalId`} />
        {inventoryNote && <p className="text-xs text-ink-soft" data-testid={`component-${i}-inventory`}>{inventoryNote}</p>}
      </div>

      <div className="grid gap-3 sm:grid-cols-[minmax(0,2fr)_minmax(0,1.3fr)_minmax(0,1.3fr)]">
        <TextField name={`${base}.name`} label="Name" />
        <Labelled label="Id" name={`${base}.id`}>
          <input
            id={`${base}.id`}
            className="rounded-md border border-ink-edge bg-paper-card px-2.5 py-1.5 font-mono text-sm text-ink focus:border-accent focus:outline-none focus:ring-1 focus:ring-accent"
            {...idReg}
            onFocus={() => setIdBefore(getValues(`${base}.id`))}
            onBlur={(e) => {
              void idReg.onBlur(e);
              const now = e.target.value.trim();
              if (idBefore !== null && idBefore !== now) for (const [path, value] of renameComponent(getValues(), idBefore, now)) setValue(path as "recipe.limitingReagent", value, { shouldDirty: true });
              setIdBefore(null);
            }}
          />
        </Labelled>
        <SelectField name={`${base}.role`} label="Role" options={ROLES.map((r) => [r, ROLE_WORD[r]!] as const)} onChange={onRole} />
      </div>

      <div className="grid gap-3 sm:grid-cols-3">
        <TextField name={`${base}.formula`} label="Formula" mono hint={info ? `M = ${info.molarMassGPerMol.toFixed(2)} g/mol` : undefined} />
        <NumberField name={`${base}.molarMassGPerMol`} label="or molar mass" unit="g/mol" hint="wins over the formula" />
        <SelectField name={`${base}.form.state`} label="Supplied as" options={STATE_OPTIONS} />
        {fields.has("form.densityGPerMl") && <NumberField name={`${base}.form.densityGPerMl`} label="Density" unit="g/mL" />}
        {fields.has("form.purityWtPercent") && <NumberField name={`${base}.form.purityWtPercent`} label="Assay" unit="wt %" />}
        {fields.has("form.molarityM") && <NumberField name={`${base}.form.molarityM`} label="Molarity" unit="M" />}
        {fields.has("form.wtPercent") && <NumberField name={`${base}.form.wtPercent`} label="or strength" unit="wt %" />}
        {fields.has("form.solvent") && <TextField name={`${base}.form.solvent`} label="In (carrier solvent)" />}
      </div>

      <div className="grid gap-3 sm:grid-cols-3">
        {fields.has("equivalents") && <NumberField name={`${base}.equivalents`} label="Amount" unit="equiv" testId={`component-${i}-equivalents`} />}
        {fields.has("loadingMolPercent") && <NumberField name={`${base}.loadingMolPercent`} label="Loading" unit="mol % of metal" />}
        {fields.has("metalAtomsPerFormula") && <NumberField name={`${base}.metalAtomsPerFormula`} label="Metal atoms per formula" step="1" hint="2 for a dimeric precatalyst" />}
        {fields.has("ligandToMetalRatio") && <NumberField name={`${base}.ligandToMetalRatio`} label="Ligand : metal" unit="mol/mol" />}
        {fields.has("catalyst") && (
          <SelectField name={`${base}.catalyst`} label="Binds to" options={[["", catalysts.length === 1 ? "the catalyst" : "choose the catalyst"] as const, ...catalysts.map((k) => [k.id, k.name || k.id] as const)]} />
        )}
        {c.role === "reagent" && c.id === limiting && <p className="self-end pb-2 text-sm text-ink-soft">1 equiv by definition: the scale sets its amount.</p>}
      </div>

      <div className="grid gap-3 sm:grid-cols-[minmax(0,2fr)_minmax(0,1fr)]">
        <TextField name={`${base}.hazards.ghs`} label="GHS statements" mono hint="comma-separated; from the catalogue when picked" />
        <SelectField name={`${base}.hazards.peroxideClass`} label="Peroxide former" options={PEROXIDE_OPTIONS} />
        <div className="flex flex-wrap gap-4 sm:col-span-2">
          <CheckField name={`${base}.hazards.pyrophoric`} label="Pyrophoric" />
          <CheckField name={`${base}.hazards.waterReactive`} label="Water-reactive" />
        </div>
      </div>

      <div>
        <button type="button" className="text-sm text-accent underline-offset-2 hover:underline" aria-expanded={showMore} onClick={() => setMore((m) => !m)}>
          {showMore ? "Fewer details" : "More: dispensing, solubility, container dates"}
        </button>
        {info && (
          <span className="ml-3 text-xs text-ink-faint">
            Dispensed {info.dispensedAs === "master-mix" ? `in master mix ${info.source}` : info.dispensedAs === "stock" ? `in stock ${info.source}` : info.dispensedAs === "solid" ? "as a solid into each vial" : "neat, as supplied"}
          </span>
        )}
      </div>
      {showMore && (
        <div className="grid gap-3 border-t border-ink-line pt-3 sm:grid-cols-3">
          <SelectField name={`${base}.dispense`} label="Dispense" options={DISPENSE_MODES.map((d) => [d, DISPENSE_WORD[d]] as const)} />
          <NumberField name={`${base}.solubilityMgPerMl`} label="Solubility in its stock solvent" unit="mg/mL" />
          <SelectField name={`${base}.stockSolvent`} label="Stock made up in" options={[["", "the major solvent"] as const, ...solvents.filter((s) => s.name).map((s) => [s.name, s.name] as const)]} />
          <NumberField name={`${base}.addOrder`} label="Place in the order of addition" step="1" hint="lower first; empty: by kind" />
          <NumberField name={`${base}.gasReleasedMolPerMol`} label="Gas released" unit="mol/mol" />
          <CheckField name={`${base}.addSeparately`} label="Never in a master mix" className="self-end pb-2" />
          <TextField name={`${base}.smiles`} label="SMILES (when no formula)" mono />
          <TextField name={`${base}.casNumber`} label="CAS number" mono />
          <div />
          <SelectField name={`${base}.hazards.protic`} label="Protic" options={TRI_OPTIONS} />
          <SelectField name={`${base}.hazards.aqueous`} label="Aqueous" options={TRI_OPTIONS} />
          <div />
          <DateField name={`${base}.hazards.openedOn`} label="Container opened" />
          <DateField name={`${base}.hazards.peroxideTestedOn`} label="Last peroxide test" />
          <DateField name={`${base}.hazards.receivedOn`} label="Received" />
          <DateField name={`${base}.hazards.expiresOn`} label="Expires" />
          {c.chemicalId && <p className="text-xs text-ink-faint sm:col-span-3">Linked to the catalogue: its hazards and container dates come from the inventory when the plan is computed.</p>}
        </div>
      )}
    </fieldset>
  );
}

function Labelled({ label, name, children }: { label: string; name: string; children: ReactNode }) {
  return (
    <div className="flex min-w-0 flex-col gap-1">
      <label htmlFor={name} className="text-xs font-medium text-ink-soft">
        {label}
      </label>
      {children}
      <Messages field={name} />
    </div>
  );
}
