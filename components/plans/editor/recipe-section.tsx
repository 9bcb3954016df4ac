"use client";

/**
 * The plan's name, the recipe's scale and amount of solvent (by the limiting reagent's
 * concentration or by the final volume), the process values used when no factor drives
 * them, and the vessel and block chosen from the lab's settings.
 */
import { useFormContext, useWatch } from "react-hook-form";
import type { LabSettings } from "@/lib/lab-settings/schemas";
import { CheckField, NumberField, SelectField, TextField } from "./fields";
import { CUSTOM, type EditorValues } from "./form-values";
import { significant } from "../format";

export function NameField() {
  return <TextField name="name" label="Plan name" placeholder="e.g. Study A — Box–Behnken on temperature, base and Pd" testId="plan-name" />;
}

export function RecipeSection() {
  const { control } = useFormContext<EditorValues>();
  const basis = useWatch({ control, name: "recipe.basis" });
  const factors = useWatch({ control, name: "factors" });
  const driven = new Set(factors.map((f) => f.binding.kind));
  return (
    <section className="flex flex-col gap-3" aria-labelledby="recipe-heading" data-testid="recipe-section">
      <h2 id="recipe-heading">Scale and conditions</h2>
      <div className="grid gap-3 rounded-lg border border-ink-line bg-paper-card p-3 sm:grid-cols-3">
        <NumberField name="recipe.scaleMmol" label="Limiting reagent per vial" unit="mmol" testId="recipe-scale" />
        <SelectField
          name="recipe.basis"
          label="Solvent given by"
          options={[
            ["concentration", "Concentration"],
            ["volume", "Final volume"],
          ]}
        />
        {basis === "volume" ? (
          <NumberField name="recipe.finalVolumeUl" label="Final volume" unit="µL" hint="per vial" />
        ) : (
          <NumberField name="recipe.concentrationM" label="Concentration" unit="M" hint={driven.has("concentration") ? "of the limiting reagent; a factor varies it" : "of the limiting reagent"} />
        )}
        <NumberField name="recipe.temperatureC" label="Temperature" unit="°C" hint={driven.has("temperature") ? "a factor drives it" : "when no factor drives it"} />
        <NumberField name="recipe.timeH" label="Time" unit="h" hint={driven.has("time") ? "a factor drives it" : undefined} />
        <NumberField name="recipe.stirringRpm" label="Stirring" unit="rpm" hint={driven.has("stirring") ? "a factor drives it" : undefined} />
        <CheckField name="recipe.concentratesOrHeatsToDryness" label="The work-up concentrates or heats to dryness (peroxide rule)" className="sm:col-span-3" />
      </div>
    </section>
  );
}

/** The vessel type and block, chosen from the lab's settings (or the document's own, when it names one the lab does not have). */
export function EquipmentSection({ settings, settingsHref }: { settings: LabSettings; settingsHref: string }) {
  const { control } = useFormContext<EditorValues>();
  const vesselId = useWatch({ control, name: "vessel" });
  const blockId = useWatch({ control, name: "block" });
  const carry = useWatch({ control, name: "carry" });
  const customVessel = carry.vessel;
  const customVesselName = typeof customVessel === "string" ? customVessel : customVessel && typeof customVessel === "object" ? String((customVessel as { name?: unknown }).name ?? "the document's vessel") : null;
  const vessel = settings.vessels.types.find((v) => v.id === vesselId);
  const block = settings.blocks.types.find((b) => b.id === blockId);
  const vesselOptions: Array<readonly [string, string]> = [
    ...settings.vessels.types.map((v) => [v.id, v.name] as const),
    ...(customVesselName !== null ? [[CUSTOM, `The document's own: ${customVesselName}`] as const] : []),
  ];
  const blockOptions: Array<readonly [string, string]> = [
    ...settings.blocks.types.map((b) => [b.id, `${b.name} (${b.positions})`] as const),
    ...(carry.block ? [[CUSTOM, `The document's own: ${carry.block.name}`] as const] : []),
  ];
  return (
    <section className="flex flex-col gap-3" aria-labelledby="equipment-heading" data-testid="equipment-section">
      <h2 id="equipment-heading">Vessel and block</h2>
      <div className="grid gap-3 rounded-lg border border-ink-line bg-paper-card p-3 sm:grid-cols-2">
        <SelectField
          name="vessel"
          label="Vessel type"
          options={vesselOptions}
          testId="vessel"
          hint={
            vessel ? (
              <span className="num">
                {significant(vessel.totalVolumeMl, 3)} mL, working {significant(vessel.workingMinMl, 3)}–{significant(vessel.workingMaxMl, 3)} mL, rated {significant(vessel.ratedBar, 3)} bar, {vessel.sealed ? "sealed" : "vented"}
                {vessel.confirmWithSupplier ? "; rating to confirm with the supplier" : ""}
              </span>
            ) : undefined
          }
        />
        <SelectField
          name="block"
          label="Block"
          options={blockOptions}
          testId="block"
          hint={
            block ? (
              <span className="num">
                {block.positions} positions, {block.mode}, {significant(block.minC, 4)} to {significant(block.maxC, 4)} °C
              </span>
            ) : undefined
          }
        />
        <p className="text-xs text-ink-faint sm:col-span-2">
          Vessel types and blocks are the lab&apos;s (<a href={settingsHref}>Lab settings</a>); the plan stores the values it is computed with.
        </p>
      </div>
    </section>
  );
}
