"use client";

/**
 * The design: its type and the options that type takes (form-document.ts
 * `designFieldsOf`): generators of a fractional factorial, α and placement of a central
 * composite design, runs and model of a D-optimal design; centre points, replicates,
 * blocks, and a seeded random run order. Options of an imported document the form has no
 * field for are listed, each removable.
 */
import { useFormContext, useWatch } from "react-hook-form";
import { Button } from "@/components/ui/button";
import { CardMessages, CheckField, Messages, NumberField, SelectField, TextField } from "./fields";
import { designFieldsOf } from "./form-document";
import type { EditorValues } from "./form-values";

const TYPE_OPTIONS = [
  ["full-factorial", "Two-level full factorial (2^k)"],
  ["fractional-factorial", "Two-level fractional factorial (2^(k−p))"],
  ["central-composite", "Central composite"],
  ["box-behnken", "Box–Behnken"],
  ["d-optimal", "D-optimal (candidate exchange)"],
] as const;

/** A new seed for the run order (a non-negative 31-bit integer, as the server draws one). */
export function newSeed(): number {
  const a = new Uint32Array(1);
  crypto.getRandomValues(a);
  return a[0]! >>> 1;
}

export function DesignSection() {
  const { control, setValue } = useFormContext<EditorValues>();
  const d = useWatch({ control, name: "design" });
  const extra = useWatch({ control, name: "carry.designExtra" });
  const given = useWatch({ control, name: "carry.givenRuns" });
  const fields = new Set(designFieldsOf(d));
  const options: ReadonlyArray<readonly [string, string]> = d.design === "given" ? [["given", `Runs given by the document (${given?.length ?? 0})`], ...TYPE_OPTIONS] : TYPE_OPTIONS;
  const extraKeys = Object.keys(extra ?? {});
  return (
    <section className="flex flex-col gap-3" aria-labelledby="design-heading" data-testid="design-section">
      <h2 id="design-heading">Design</h2>
      <CardMessages field="design" />
      <div className="grid gap-3 rounded-lg border border-ink-line bg-paper-card p-3 sm:grid-cols-3">
        <SelectField name="design.design" label="Design type" options={options} className="sm:col-span-2" testId="design-type" />
        {fields.has("generators") && <TextField name="design.generators" label="Generators" mono hint="empty: the minimum-aberration default" />}
        {fields.has("alpha") && (
          <SelectField
            name="design.alpha"
            label="Axial distance α"
            options={[
              ["rotatable", "Rotatable (F^¼)"],
              ["spherical", "Spherical (√k)"],
              ["face-centered", "Face-centred (1)"],
              ["custom", "A number"],
            ]}
          />
        )}
        {fields.has("alphaValue") && <NumberField name="design.alphaValue" label="α" />}
        {fields.has("placement") && (
          <SelectField
            name="design.placement"
            label="Axial points"
            options={[
              ["circumscribed", "Outside the box (circumscribed)"],
              ["inscribed", "At the limits (inscribed)"],
            ]}
          />
        )}
        {fields.has("runs") && <NumberField name="design.runs" label="Runs" step="1" />}
        {fields.has("model") && (
          <SelectField
            name="design.model"
            label="Model"
            options={[
              ["linear", "Linear"],
              ["interaction", "Two-factor interactions"],
              ["quadratic", "Quadratic"],
              ...(d.model === "custom" ? ([["custom", "Terms given by the document"]] as const) : []),
            ]}
          />
        )}
        {fields.has("centerPoints") && <NumberField name="design.centerPoints" label="Centre points" step="1" hint="empty: 3 for CCD and Box–Behnken, else 0" testId="design-center-points" />}
        {fields.has("replicates") && <NumberField name="design.replicates" label="Replicates" step="1" />}
        {fields.has("blocks") && <NumberField name="design.blocks" label="Blocks" step="1" hint="empty: 1" />}
        {fields.has("randomize") && <CheckField name="design.randomize" label="Randomise the run order" className="self-end pb-2" />}
        {fields.has("seed") && (
          <div className="flex items-end gap-2">
            <NumberField name="design.seed" label="Seed" step="1" className="flex-1" />
            <Button type="button" variant="secondary" className="mb-0.5 px-2 py-1 text-xs" onClick={() => setValue("design.seed", newSeed(), { shouldDirty: true })}>
              New order
            </Button>
          </div>
        )}
        {d.design === "given" && <p className="text-sm text-ink-soft sm:col-span-3">The document gives its runs already generated; choose a design type to generate them here instead.</p>}
      </div>
      {extraKeys.length > 0 && (
        <div className="rounded-lg border border-ink-line bg-paper-card p-3 text-sm" data-testid="design-extra">
          <p className="text-ink-soft">Also from the document (no field here):</p>
          <ul className="mt-1 flex flex-col gap-1">
            {extraKeys.map((k) => (
              <li key={k} className="flex flex-wrap items-center gap-2">
                <span className="font-mono text-xs">{k}</span>
                <span className="max-w-md truncate font-mono text-xs text-ink-faint">{JSON.stringify(extra[k])}</span>
                <button
                  type="button"
                  className="text-xs text-accent underline-offset-2 hover:underline"
                  onClick={() => {
                    const { [k]: _gone, ...rest } = extra;
                    setValue("carry.designExtra", rest, { shouldDirty: true });
                  }}
                >
                  remove
                </button>
                <Messages field={`design.${k}`} />
              </li>
            ))}
          </ul>
        </div>
      )}
    </section>
  );
}
