"use client";

import type { FieldValues, Path, UseFormRegister } from "react-hook-form";
import { Field, inputClass } from "@/components/ui/field";

/** The element id of a field: its form path, after the section's prefix when it has one. */
export function fieldId(name: string, idPrefix?: string): string {
  return idPrefix ? `${idPrefix}-${name}` : name;
}

/** A number input bound to a react-hook-form field, with its unit beside it and its schema error. */
export function NumberInput<T extends FieldValues>({
  register,
  name,
  label,
  unit,
  error,
  hint,
  step = "any",
  idPrefix,
}: {
  register: UseFormRegister<T>;
  name: Path<T>;
  label: string;
  unit?: string;
  error?: string;
  hint?: string;
  step?: string;
  /** Sets the section's fields apart on the page (two sections both have `types.0.name`). */
  idPrefix?: string;
}) {
  const id = fieldId(name, idPrefix);
  return (
    <Field label={label} htmlFor={id} error={error} hint={hint}>
      <span className="flex items-center gap-1.5">
        <input id={id} type="number" step={step} inputMode="decimal" className={`${inputClass} num w-full min-w-0`} {...register(name, { valueAsNumber: true })} />
        {unit && <span className="whitespace-nowrap text-sm text-ink-soft">{unit}</span>}
      </span>
    </Field>
  );
}

/** A text input bound to a react-hook-form field. */
export function TextInput<T extends FieldValues>({ register, name, label, error, hint, mono, idPrefix }: { register: UseFormRegister<T>; name: Path<T>; label: string; error?: string; hint?: string; mono?: boolean; idPrefix?: string }) {
  const id = fieldId(name, idPrefix);
  return (
    <Field label={label} htmlFor={id} error={error} hint={hint}>
      <input id={id} className={`${inputClass} ${mono ? "font-mono" : ""}`} {...register(name)} />
    </Field>
  );
}

/** A checkbox bound to a react-hook-form field. */
export function CheckboxInput<T extends FieldValues>({ register, name, label, idPrefix }: { register: UseFormRegister<T>; name: Path<T>; label: string; idPrefix?: string }) {
  const id = fieldId(name, idPrefix);
  return (
    <label className="flex items-center gap-2 text-sm text-ink-soft" htmlFor={id}>
      <input id={id} type="checkbox" className="h-4 w-4 accent-ink" {...register(name)} />
      {label}
    </label>
  );
}
