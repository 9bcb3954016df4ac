"use client";

import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { SETTINGS_FORM_SCHEMAS, type LabSettings, type LabSettingsView } from "@/lib/lab-settings/schemas";
import { Button } from "@/components/ui/button";
import { NumberInput } from "./fields";
import { READ_ONLY, SectionCard } from "./section-card";
import { saveSection } from "./save-section";

const schema = SETTINGS_FORM_SCHEMAS.dispensing;
type Input = z.input<typeof schema>;
type Values = z.output<typeof schema>;

/** Liquid-handling and weighing limits (lib/chemistry `dispensingSchema`). */
export function DispensingSection({ labSlug, value, version, editable, onSaved }: { labSlug: string; value: LabSettings["dispensing"]; version: number; editable: boolean; onSaved: (view: LabSettingsView) => void }) {
  const [message, setMessage] = useState<{ tone: "ok" | "blocks"; text: string } | null>(null);
  const { register, handleSubmit, formState, setError, reset } = useForm<Input, unknown, Values>({ resolver: zodResolver(schema), defaultValues: value });
  const e = formState.errors;

  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const res = await saveSection({ labSlug, section: "dispensing", version, value: values, setError });
    if (!res.ok) return setMessage({ tone: "blocks", text: res.message });
    reset(res.view.settings.dispensing);
    setMessage({ tone: "ok", text: "Dispensing limits saved for new plans." });
    onSaved(res.view);
  });

  return (
    <SectionCard
      id="dispensing"
      title="Dispensing limits"
      editable={editable}
      editors="lab admins"
      message={message}
      description={<>What the lab can pipette and weigh. The run sheet makes stock solutions when a per-vial amount falls below these limits, and prepares extra for overage and the dead volume.</>}
    >
      <form onSubmit={onSubmit} noValidate>
        <fieldset disabled={!editable} className={`flex flex-col gap-3 ${READ_ONLY}`}>
          <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-3">
            <NumberInput register={register} name="minPipetteVolumeUl" label="Smallest volume pipetted" unit="µL" error={e.minPipetteVolumeUl?.message} />
            <NumberInput register={register} name="minWeighMassMg" label="Smallest mass weighed" unit="mg" error={e.minWeighMassMg?.message} />
            <NumberInput register={register} name="overagePercent" label="Overage prepared" unit="%" error={e.overagePercent?.message} />
            <NumberInput register={register} name="deadVolumeUl" label="Dead volume per stock" unit="µL" error={e.deadVolumeUl?.message} />
            <NumberInput register={register} name="maxStockVolumeMl" label="Largest stock made up" unit="mL" error={e.maxStockVolumeMl?.message} />
            <NumberInput register={register} name="stockFillFraction" label="Share of a vial's solvent stocks may use" unit="(0–1)" error={e.stockFillFraction?.message} />
          </div>
          {editable && (
            <div>
              <Button type="submit" disabled={formState.isSubmitting} data-testid="save-dispensing">
                {formState.isSubmitting ? "Saving…" : "Save dispensing limits"}
              </Button>
            </div>
          )}
        </fieldset>
      </form>
    </SectionCard>
  );
}
