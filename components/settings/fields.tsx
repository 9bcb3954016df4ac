"use client";

import type { FieldValues, Path, UseFormRegister } from "react-hook-form";
import { Field, inputClass } from "@/components/ui/field";

/** A number input bound to a react-hook-form field, with its unit beside it and its schema error. */
export function NumberInput<T extends FieldValues>({
  register,
  name,
  label,
  unit,
  error,
  hint,
  step = "any",
}: {
  register: UseFormRegister<T>;
  name: Path<T>;
  label: string;
  unit?: string;
  error?: string;
  hint?: string;
  step?: string;
}) {
  return (
    <Field label={label} htmlFor={name} error={error} hint={hint}>
      <span className="flex items-center gap-1.5">
        <input id={name} type="number" step={step} inputMode="decimal" className={`${inputClass} num w-full min-w-0`} {...register(name, { valueAsNumber: true })} />
        {unit && <span className="whitespace-nowrap text-sm text-ink-soft">{unit}</span>}
      </span>
    </Field>
  );
}

/** A text input bound to a react-hook-form field. */
export function TextInput<T extends FieldValues>({ register, name, label, error, hint, mono }: { register: UseFormRegister<T>; name: Path<T>; label: string; error?: string; hint?: string; mono?: boolean }) {
  return (
    <Field label={label} htmlFor={name} error={error} hint={hint}>
      <input id={name} className={`${inputClass} ${mono ? "font-mono" : ""}`} {...register(name)} />
    </Field>
  );
}

/** A checkbox bound to a react-hook-form field. */
export function CheckboxInput<T extends FieldValues>({ register, name, label }: { register: UseFormRegister<T>; name: Path<T>; label: string }) {
  return (
    <label className="flex items-center gap-2 text-sm text-ink-soft" htmlFor={name}>
      <input id={name} type="checkbox" className="h-4 w-4 accent-ink" {...register(name)} />
      {label}
    </label>
  );
}
