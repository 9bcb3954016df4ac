"use client";

import type { FieldValues, Path, UseFormRegister } from "react-hook-form";
import { Field, inputClass } from "./field";

/** A labelled text input bound to a react-hook-form field, showing its schema error. */
export function TextField<T extends FieldValues>({
  register,
  name,
  label,
  error,
  hint,
  type = "text",
  autoComplete,
}: {
  register: UseFormRegister<T>;
  name: Path<T>;
  label: string;
  error?: string;
  hint?: string;
  type?: "text" | "email" | "password";
  autoComplete?: string;
}) {
  return (
    <Field label={label} htmlFor={name} error={error} hint={hint}>
      <input id={name} type={type} autoComplete={autoComplete} className={inputClass} {...register(name)} />
    </Field>
  );
}
