"use client";

import { useState } from "react";
import { useFieldArray, useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { SETTINGS_FORM_SCHEMAS, type LabSettings, type LabSettingsView } from "@/lib/lab-settings/schemas";
import { Button } from "@/components/ui/button";
import { Field, inputClass } from "@/components/ui/field";
import { CheckboxInput, NumberInput, TextInput } from "./fields";
import { READ_ONLY, SectionCard } from "./section-card";
import { saveSection } from "./save-section";

const schema = SETTINGS_FORM_SCHEMAS.vessels;
type Input = z.input<typeof schema>;
type Values = z.output<typeof schema>;

const NEW_VESSEL: Values["types"][number] = {
  id: "",
  name: "",
  totalVolumeMl: 4,
  workingMinMl: 0.5,
  workingMaxMl: 2,
  ratedBar: 3,
  maxFillFraction: 2 / 3,
  sealed: true,
  confirmWithSupplier: true,
  source: "",
};

/** The lab's vessel types (lib/hazards/vessels.ts `vesselTypeSchema`) and the one plans get by default. */
export function VesselTypesSection({ labSlug, value, version, editable, onSaved }: { labSlug: string; value: LabSettings["vessels"]; version: number; editable: boolean; onSaved: (view: LabSettingsView) => void }) {
  const [message, setMessage] = useState<{ tone: "ok" | "blocks"; text: string } | null>(null);
  const { register, control, handleSubmit, formState, setError, reset, watch } = useForm<Input, unknown, Values>({ resolver: zodResolver(schema), defaultValues: value });
  const types = useFieldArray({ control, name: "types" });
  const errors = formState.errors;
  const defaultId = watch("defaultId");

  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const res = await saveSection({ labSlug, section: "vessels", version, value: values, setError });
    if (!res.ok) return setMessage({ tone: "blocks", text: res.message });
    reset(res.view.settings.vessels);
    setMessage({ tone: "ok", text: "Vessel types saved. New plans use them; plans already made keep the vessel they were made with." });
    onSaved(res.view);
  });

  return (
    <SectionCard
      id="vessels"
      title="Vessel types"
      editable={editable}
      editors="lab admins"
      message={message}
      description={
        <>
          Volumes, working range, maximum fill and pressure rating of the vials and tubes the lab uses. The pressure check compares each sealed vial&apos;s estimated pressure with
          its rating × the safety factor of the hazard thresholds. Confirm every rating with the supplier and say where it comes from.
        </>
      }
    >
      <form onSubmit={onSubmit} noValidate>
        <fieldset disabled={!editable} className={`flex flex-col gap-3 ${READ_ONLY}`}>
          <Field label="Default vessel for new plans" htmlFor="vessels-defaultId" error={errors.defaultId?.message}>
            <select id="vessels-defaultId" className={`${inputClass} max-w-md`} {...register("defaultId")}>
              {watch("types").map((t, i) => (
                <option key={`${t.id}-${i}`} value={t.id}>
                  {t.name || t.id || `Vessel ${i + 1}`}
                </option>
              ))}
            </select>
          </Field>
          {errors.types?.message && <p className="text-xs text-blocks">{errors.types.message}</p>}
          <ul className="flex flex-col gap-2">
            {types.fields.map((field, i) => {
              const e = errors.types?.[i];
              const t = watch(`types.${i}`);
              const p = `types.${i}` as const;
              return (
                <li key={field.id} className="rounded-md border border-ink-line">
                  <details open={!!e || !t?.id}>
                    <summary className="flex cursor-pointer flex-wrap items-baseline gap-x-3 gap-y-1 px-3 py-2 text-sm" data-testid={`vessel-${t?.id}`}>
                      <span className="font-medium text-ink">{t?.name || "New vessel type"}</span>
                      <span className="num text-ink-soft">
                        {t?.totalVolumeMl} mL · working {t?.workingMinMl}–{t?.workingMaxMl} mL · {t?.ratedBar} bar · {t?.sealed ? "sealed" : "vented"}
                      </span>
                      {t?.id === defaultId && <span className="rounded bg-ok-bg px-1.5 py-0.5 text-xs text-ok">default</span>}
                      {t?.confirmWithSupplier && <span className="rounded bg-caution-bg px-1.5 py-0.5 text-xs text-caution">confirm with supplier</span>}
                      {e && <span className="text-xs text-blocks">has errors</span>}
                    </summary>
                    <div className="grid gap-3 border-t border-ink-line p-3 sm:grid-cols-2 lg:grid-cols-4">
                      <TextInput idPrefix="vessels" register={register} name={`${p}.id`} label="Id" mono error={e?.id?.message} />
                      <div className="lg:col-span-3">
                        <TextInput idPrefix="vessels" register={register} name={`${p}.name`} label="Name" error={e?.name?.message} />
                      </div>
                      <NumberInput idPrefix="vessels" register={register} name={`${p}.totalVolumeMl`} label="Total volume" unit="mL" error={e?.totalVolumeMl?.message} />
                      <NumberInput idPrefix="vessels" register={register} name={`${p}.workingMinMl`} label="Working volume from" unit="mL" error={e?.workingMinMl?.message} />
                      <NumberInput idPrefix="vessels" register={register} name={`${p}.workingMaxMl`} label="Working volume to" unit="mL" error={e?.workingMaxMl?.message} />
                      <NumberInput idPrefix="vessels" register={register} name={`${p}.maxFillFraction`} label="Maximum fill" unit="of total (0–1)" error={e?.maxFillFraction?.message} />
                      <NumberInput idPrefix="vessels" register={register} name={`${p}.ratedBar`} label="Pressure rating" unit="bar abs." error={e?.ratedBar?.message} />
                      <div className="flex flex-col justify-end gap-2 lg:col-span-3">
                        <CheckboxInput idPrefix="vessels" register={register} name={`${p}.sealed`} label="Sealed (pressure builds); unticked for vented vessels" />
                        <CheckboxInput idPrefix="vessels" register={register} name={`${p}.confirmWithSupplier`} label="Values not yet confirmed with the supplier" />
                      </div>
                      <div className="sm:col-span-2 lg:col-span-4">
                        <TextInput idPrefix="vessels" register={register} name={`${p}.source`} label="Where the rating comes from" hint="A data sheet, a certificate, the lab's own test…" error={e?.source?.message} />
                      </div>
                      {editable && (
                        <div className="sm:col-span-2 lg:col-span-4">
                          <Button type="button" variant="danger" disabled={types.fields.length <= 1} onClick={() => types.remove(i)}>
                            Remove this vessel type
                          </Button>
                        </div>
                      )}
                    </div>
                  </details>
                </li>
              );
            })}
          </ul>
          {editable && (
            <div className="flex flex-wrap gap-2">
              <Button type="button" variant="secondary" onClick={() => types.append({ ...NEW_VESSEL })}>
                Add a vessel type
              </Button>
              <Button type="submit" disabled={formState.isSubmitting} data-testid="save-vessels">
                {formState.isSubmitting ? "Saving…" : "Save vessel types"}
              </Button>
            </div>
          )}
        </fieldset>
      </form>
    </SectionCard>
  );
}
