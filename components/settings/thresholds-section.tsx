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

const schema = SETTINGS_FORM_SCHEMAS.thresholds;
type Input = z.input<typeof schema>;
type Values = z.output<typeof schema>;

/** The hazard thresholds the cautions use (lib/hazards/thresholds.ts `labThresholdsSchema`), edited by safety officers. */
export function ThresholdsSection({ labSlug, value, version, editable, onSaved }: { labSlug: string; value: LabSettings["thresholds"]; version: number; editable: boolean; onSaved: (view: LabSettingsView) => void }) {
  const [message, setMessage] = useState<{ tone: "ok" | "blocks"; text: string } | null>(null);
  const { register, handleSubmit, formState, setError, reset } = useForm<Input, unknown, Values>({ resolver: zodResolver(schema), defaultValues: value });
  const e = formState.errors;
  const pe = e.peroxideTestIntervalMonths;

  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const res = await saveSection({ labSlug, section: "thresholds", version, value: values, setError });
    if (!res.ok) return setMessage({ tone: "blocks", text: res.message });
    reset(res.view.settings.thresholds);
    setMessage({ tone: "ok", text: "Hazard thresholds saved. New plans use them; the inventory's peroxide test dates follow them now." });
    onSaved(res.view);
  });

  return (
    <SectionCard
      id="thresholds"
      title="Hazard thresholds"
      editable={editable}
      editors="safety officers"
      message={message}
      description={
        <>
          The limits behind the cautions and the sign-off rule. They are planning aids, not a risk assessment: local regulations, the institution&apos;s chemical hygiene plan
          and the judgement of qualified staff decide. Every change is recorded in the audit log.
        </>
      }
    >
      <form onSubmit={onSubmit} noValidate>
        <fieldset disabled={!editable} className={`flex flex-col gap-4 ${READ_ONLY}`}>
          <div className="grid gap-3 sm:grid-cols-2 lg:grid-cols-4">
            <NumberInput register={register} name="safetyFactor" label="Safety factor on the vessel rating" unit="× rating" hint="0.5: the estimate may reach half the rating." error={e.safetyFactor?.message} />
            <NumberInput register={register} name="signOffTemperatureC" label="Sign-off needed from" unit="°C" error={e.signOffTemperatureC?.message} />
            <NumberInput register={register} name="pyrophoricSecondPersonVolumeMl" label="Second person above (pyrophoric or water-reactive)" unit="mL per plan" error={e.pyrophoricSecondPersonVolumeMl?.message} />
            <NumberInput register={register} name="autoignitionMarginC" label="Blocks within this of autoignition" unit="K" error={e.autoignitionMarginC?.message} />
          </div>
          <div>
            <h3 className="mb-2 text-sm font-medium text-ink">Peroxide test interval after opening (months)</h3>
            <div className="grid gap-3 sm:grid-cols-3 lg:grid-cols-5">
              <NumberInput register={register} name="peroxideTestIntervalMonths.A" label="Class A" unit="months" error={pe?.A?.message} />
              <NumberInput register={register} name="peroxideTestIntervalMonths.B" label="Class B" unit="months" error={pe?.B?.message} />
              <NumberInput register={register} name="peroxideTestIntervalMonths.C" label="Class C" unit="months" error={pe?.C?.message} />
              <NumberInput register={register} name="peroxideTestIntervalMonths.D" label="Class D" unit="months" error={pe?.D?.message} />
              <NumberInput register={register} name="peroxideTestIntervalMonths.unopened" label="Unopened, any class" unit="months" error={pe?.unopened?.message} />
            </div>
          </div>
          {editable && (
            <div>
              <Button type="submit" disabled={formState.isSubmitting} data-testid="save-thresholds">
                {formState.isSubmitting ? "Saving…" : "Save hazard thresholds"}
              </Button>
            </div>
          )}
        </fieldset>
      </form>
    </SectionCard>
  );
}
