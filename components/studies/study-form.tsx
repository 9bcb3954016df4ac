"use client";

import { useRouter } from "next/navigation";
import { useState } from "react";
import { useFieldArray, useForm, type FieldPath } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import { RESPONSE_GOALS, RESPONSE_GOAL_LABELS, studyCreateSchema, type StudyCreateInput, type StudyCreateValues, type StudyRow } from "@/lib/studies/schemas";
import { postJson } from "@/lib/client/fetch-json";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { Field, inputClass } from "@/components/ui/field";

/** An empty number field is "not given", not zero. */
const optionalNumber = { setValueAs: (v: unknown) => (v === "" || v === null || v === undefined ? undefined : Number(v)) };
const blankResponse = { name: "", unit: "", goal: "maximize" as const };

/** Starts a study: its name, goal, target product and the responses it measures (POST /api/labs/{lab}/studies). */
export function StudyForm({ labSlug }: { labSlug: string }) {
  const router = useRouter();
  const [message, setMessage] = useState<string | null>(null);
  const { register, control, handleSubmit, formState, setError, watch } = useForm<StudyCreateInput, unknown, StudyCreateValues>({
    resolver: zodResolver(studyCreateSchema),
    defaultValues: { name: "", goal: "", targetProduct: "", responses: [{ name: "yield", unit: "%", goal: "maximize" }] },
  });
  const responses = useFieldArray({ control, name: "responses" });
  const errors = formState.errors;

  const onSubmit = handleSubmit(async (values) => {
    setMessage(null);
    const res = await postJson<{ study: StudyRow }>(`/api/labs/${labSlug}/studies`, values);
    if (!res.ok) {
      for (const issue of res.error.issues) if (issue.path) setError(issue.path as FieldPath<StudyCreateInput>, { message: issue.message });
      setMessage(res.error.message);
      return;
    }
    router.push(`/labs/${labSlug}/studies/${res.data.study.id}`);
  });

  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-5" data-testid="study-form">
      {message && <Banner tone="blocks">{message}</Banner>}
      <section className="grid gap-4 rounded-lg border border-ink-line bg-paper-card p-4 md:grid-cols-2">
        <Field label="Study name" htmlFor="name" error={errors.name?.message} hint="How the lab will find it, e.g. “Suzuki coupling of KB-ArBr-7”.">
          <input id="name" className={inputClass} {...register("name")} />
        </Field>
        <Field label="Target product (optional)" htmlFor="targetProduct" error={errors.targetProduct?.message}>
          <input id="targetProduct" className={inputClass} {...register("targetProduct")} />
        </Field>
        <div className="md:col-span-2">
          <Field label="Goal (optional)" htmlFor="goal" error={errors.goal?.message} hint="In words: what better means, and what must not happen.">
            <textarea id="goal" rows={3} className={inputClass} {...register("goal")} />
          </Field>
        </div>
      </section>

      <section className="flex flex-col gap-3 rounded-lg border border-ink-line bg-paper-card p-4">
        <div>
          <h2>Responses</h2>
          <p className="text-sm text-ink-soft">What you will measure in every vial. The name is used as a column in results files, so keep it short (letters, digits, _).</p>
        </div>
        {errors.responses?.message && <p className="text-xs text-blocks">{errors.responses.message}</p>}
        {errors.responses?.root?.message && <p className="text-xs text-blocks">{errors.responses.root.message}</p>}
        {responses.fields.map((field, i) => {
          const goal = watch(`responses.${i}.goal`);
          const e = errors.responses?.[i];
          return (
            <fieldset key={field.id} className="grid gap-3 border-t border-ink-line pt-3 first-of-type:border-0 first-of-type:pt-0 sm:grid-cols-[1fr_8rem_10rem] lg:grid-cols-[1fr_7rem_10rem_6rem_6rem_6rem_auto]" data-testid={`response-${i}`}>
              <legend className="sr-only">Response {i + 1}</legend>
              <Field label="Name" htmlFor={`responses.${i}.name`} error={e?.name?.message}>
                <input id={`responses.${i}.name`} className={`${inputClass} font-mono`} {...register(`responses.${i}.name`)} />
              </Field>
              <Field label="Unit" htmlFor={`responses.${i}.unit`} error={e?.unit?.message}>
                <input id={`responses.${i}.unit`} className={inputClass} placeholder="%" {...register(`responses.${i}.unit`)} />
              </Field>
              <Field label="Goal" htmlFor={`responses.${i}.goal`} error={e?.goal?.message}>
                <select id={`responses.${i}.goal`} className={inputClass} {...register(`responses.${i}.goal`)}>
                  {RESPONSE_GOALS.map((g) => (
                    <option key={g} value={g}>
                      {RESPONSE_GOAL_LABELS[g]}
                    </option>
                  ))}
                </select>
              </Field>
              <Field label="Target" htmlFor={`responses.${i}.target`} error={e?.target?.message}>
                <input id={`responses.${i}.target`} type="number" step="any" inputMode="decimal" disabled={goal !== "target"} className={`${inputClass} num`} {...register(`responses.${i}.target`, optionalNumber)} />
              </Field>
              <Field label={goal === "target" ? "Lowest" : "Lowest (opt.)"} htmlFor={`responses.${i}.low`} error={e?.low?.message}>
                <input id={`responses.${i}.low`} type="number" step="any" inputMode="decimal" className={`${inputClass} num`} {...register(`responses.${i}.low`, optionalNumber)} />
              </Field>
              <Field label={goal === "target" ? "Highest" : "Highest (opt.)"} htmlFor={`responses.${i}.high`} error={e?.high?.message}>
                <input id={`responses.${i}.high`} type="number" step="any" inputMode="decimal" className={`${inputClass} num`} {...register(`responses.${i}.high`, optionalNumber)} />
              </Field>
              <div className="flex items-end">
                <Button type="button" variant="secondary" disabled={responses.fields.length <= 1} onClick={() => responses.remove(i)} aria-label={`Remove response ${i + 1}`}>
                  Remove
                </Button>
              </div>
            </fieldset>
          );
        })}
        <div>
          <Button type="button" variant="secondary" onClick={() => responses.append({ ...blankResponse })}>
            Add a response
          </Button>
        </div>
      </section>

      <div className="flex gap-2">
        <Button type="submit" disabled={formState.isSubmitting} data-testid="create-study">
          {formState.isSubmitting ? "Creating…" : "Create study"}
        </Button>
      </div>
    </form>
  );
}
