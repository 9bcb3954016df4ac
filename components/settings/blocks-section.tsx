"use client";

import { useState } from "react";
import { useFieldArray, useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { BLOCK_POSITIONS, SETTINGS_FORM_SCHEMAS, type LabSettings, type LabSettingsView } from "@/lib/lab-settings/schemas";
import { Button } from "@/components/ui/button";
import { Field, inputClass } from "@/components/ui/field";
import { NumberInput, TextInput } from "./fields";
import { READ_ONLY, SectionCard } from "./section-card";
import { saveSection } from "./save-section";

const schema = SETTINGS_FORM_SCHEMAS.blocks;
type Input = z.input<typeof schema>;
type Values = z.output<typeof schema>;

const NEW_BLOCK: Values["types"][number] = { id: "", name: "", positions: 24, mode: "heating", minC: 20, maxC: 150, source: "" };

/** The lab's heating and cooling blocks (positions and temperature range) and the one plans get by default. */
export function BlocksSection({ labSlug, value, version, editable, onSaved }: { labSlug: string; value: LabSettings["blocks"]; version: number; editable: boolean; onSaved: (view: LabSettingsView) => void }) {
  const [message, setMessage] = useState<{ tone: "ok" | "blocks"; text: string } | null>(null);
  const { register, control, handleSubmit, formState, setError, reset, watch } = useForm<Input, unknown, Values>({ resolver: zodResolver(schema), defaultValues: value });
  const types = useFieldArray({ control, name: "types" });
  const errors = formState.errors;
  const defaultId = watch("defaultId");

  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const res = await saveSection({ labSlug, section: "blocks", version, value: values, setError });
    if (!res.ok) return setMessage({ tone: "blocks", text: res.message });
    reset(res.view.settings.blocks);
    setMessage({ tone: "ok", text: "Blocks saved. A plan's block sets its temperature limits; plans already made keep theirs." });
    onSaved(res.view);
  });

  return (
    <SectionCard
      id="blocks"
      title="Heating and cooling blocks"
      editable={editable}
      editors="lab admins"
      message={message}
      description={<>Each block holds 24, 48 or 96 vials over a temperature range. A run outside the range of the plan&apos;s block gets a caution; one block is used per temperature.</>}
    >
      <form onSubmit={onSubmit} noValidate>
        <fieldset disabled={!editable} className={`flex flex-col gap-3 ${READ_ONLY}`}>
          <Field label="Default block for new plans" htmlFor="blocks-defaultId" error={errors.defaultId?.message}>
            <select id="blocks-defaultId" className={`${inputClass} max-w-md`} {...register("defaultId")}>
              {watch("types").map((t, i) => (
                <option key={`${t.id}-${i}`} value={t.id}>
                  {t.name || t.id || `Block ${i + 1}`}
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
                    <summary className="flex cursor-pointer flex-wrap items-baseline gap-x-3 gap-y-1 px-3 py-2 text-sm" data-testid={`block-${t?.id}`}>
                      <span className="font-medium text-ink">{t?.name || "New block"}</span>
                      <span className="num text-ink-soft">
                        {t?.positions} positions · {t?.mode} · {t?.minC} to {t?.maxC} °C
                      </span>
                      {t?.id === defaultId && <span className="rounded bg-ok-bg px-1.5 py-0.5 text-xs text-ok">default</span>}
                      {e && <span className="text-xs text-blocks">has errors</span>}
                    </summary>
                    <div className="grid gap-3 border-t border-ink-line p-3 sm:grid-cols-2 lg:grid-cols-4">
                      <TextInput idPrefix="blocks" register={register} name={`${p}.id`} label="Id" mono error={e?.id?.message} />
                      <div className="lg:col-span-3">
                        <TextInput idPrefix="blocks" register={register} name={`${p}.name`} label="Name" error={e?.name?.message} />
                      </div>
                      <Field label="Positions" htmlFor={`blocks-${p}.positions`} error={e?.positions?.message}>
                        <select id={`blocks-${p}.positions`} className={inputClass} {...register(`${p}.positions`, { setValueAs: (v: unknown) => Number(v) })}>
                          {BLOCK_POSITIONS.map((n) => (
                            <option key={n} value={n}>
                              {n}
                            </option>
                          ))}
                        </select>
                      </Field>
                      <Field label="Heats or cools" htmlFor={`blocks-${p}.mode`} error={e?.mode?.message}>
                        <select id={`blocks-${p}.mode`} className={inputClass} {...register(`${p}.mode`)}>
                          <option value="heating">Heating</option>
                          <option value="cooling">Cooling</option>
                        </select>
                      </Field>
                      <NumberInput idPrefix="blocks" register={register} name={`${p}.minC`} label="Lowest temperature" unit="°C" error={e?.minC?.message} />
                      <NumberInput idPrefix="blocks" register={register} name={`${p}.maxC`} label="Highest temperature" unit="°C" error={e?.maxC?.message} />
                      <div className="sm:col-span-2 lg:col-span-4">
                        <TextInput idPrefix="blocks" register={register} name={`${p}.source`} label="Where the range comes from" error={e?.source?.message} />
                      </div>
                      {editable && (
                        <div className="sm:col-span-2 lg:col-span-4">
                          <Button type="button" variant="danger" disabled={types.fields.length <= 1} onClick={() => types.remove(i)}>
                            Remove this block
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
              <Button type="button" variant="secondary" onClick={() => types.append({ ...NEW_BLOCK })}>
                Add a block
              </Button>
              <Button type="submit" disabled={formState.isSubmitting} data-testid="save-blocks">
                {formState.isSubmitting ? "Saving…" : "Save blocks"}
              </Button>
            </div>
          )}
        </fieldset>
      </form>
    </SectionCard>
  );
}
