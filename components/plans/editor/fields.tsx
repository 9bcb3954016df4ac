"use client";

/**
 * The editor's inputs, bound to the form (react-hook-form's context) by their field path,
 * each showing the messages form-paths.ts puts on that path: errors in brick red, warnings
 * (the inventory disagrees) in amber. The input's id is its path, so a message list can
 * link to it and the editor can focus it.
 */
import type { ReactNode } from "react";
import { useFormContext, type Path, type RegisterOptions } from "react-hook-form";
import { inputClass } from "@/components/ui/field";
import type { EditorValues } from "./form-values";
import { useFieldMessages } from "./issue-store";

type Name = Path<EditorValues>;

/** An empty number field is "not given" (undefined), not zero. */
export const numberValue: RegisterOptions<EditorValues> = { setValueAs: (v: unknown) => (v === "" || v === null || v === undefined ? undefined : typeof v === "number" ? v : Number(v)) };

/** The id of a field's input (its path; dots are fine in ids). */
export const fieldId = (name: string) => name;

export function Messages({ field, className = "" }: { field: string; className?: string }) {
  const { errors, warnings } = useFieldMessages(field);
  if (errors.length === 0 && warnings.length === 0) return null;
  return (
    <div className={`flex flex-col gap-0.5 ${className}`}>
      {errors.map((m) => (
        <p key={`e-${m}`} className="text-xs text-blocks" data-testid={`error-${field}`}>
          {m}
        </p>
      ))}
      {warnings.map((m) => (
        <p key={`w-${m}`} className="text-xs text-caution" data-testid={`warning-${field}`}>
          {m}
        </p>
      ))}
    </div>
  );
}

function Labelled({ name, label, hint, children, className = "" }: { name: string; label: ReactNode; hint?: ReactNode; children: ReactNode; className?: string }) {
  const { errors } = useFieldMessages(name);
  return (
    <div className={`flex min-w-0 flex-col gap-1 ${className}`}>
      <label htmlFor={fieldId(name)} className="text-xs font-medium text-ink-soft">
        {label}
      </label>
      {children}
      {hint && errors.length === 0 && <p className="text-xs text-ink-faint">{hint}</p>}
      <Messages field={name} />
    </div>
  );
}

const invalidClass = (bad: boolean) => (bad ? "border-blocks focus:border-blocks focus:ring-blocks" : "");

export function NumberField({ name, label, unit, hint, step = "any", className, testId }: { name: Name; label: ReactNode; unit?: string; hint?: ReactNode; step?: string; className?: string; testId?: string }) {
  const { register } = useFormContext<EditorValues>();
  const { errors } = useFieldMessages(name);
  return (
    <Labelled name={name} label={label} hint={hint} className={className}>
      <span className="flex items-center gap-1.5">
        <input
          id={fieldId(name)}
          type="number"
          step={step}
          inputMode="decimal"
          aria-invalid={errors.length > 0 || undefined}
          data-testid={testId}
          className={`${inputClass} num w-full min-w-0 text-right ${invalidClass(errors.length > 0)}`}
          {...register(name, numberValue)}
        />
        {unit && <span className="whitespace-nowrap text-sm text-ink-soft">{unit}</span>}
      </span>
    </Labelled>
  );
}

export function TextField({ name, label, hint, mono, placeholder, className, list, testId }: { name: Name; label: ReactNode; hint?: ReactNode; mono?: boolean; placeholder?: string; className?: string; list?: string; testId?: string }) {
  const { register } = useFormContext<EditorValues>();
  const { errors } = useFieldMessages(name);
  return (
    <Labelled name={name} label={label} hint={hint} className={className}>
      <input
        id={fieldId(name)}
        list={list}
        placeholder={placeholder}
        autoComplete="off"
        aria-invalid={errors.length > 0 || undefined}
        data-testid={testId}
        className={`${inputClass} w-full min-w-0 ${mono ? "font-mono" : ""} ${invalidClass(errors.length > 0)}`}
        {...register(name)}
      />
    </Labelled>
  );
}

export function DateField({ name, label, className }: { name: Name; label: ReactNode; className?: string }) {
  const { register } = useFormContext<EditorValues>();
  const { errors } = useFieldMessages(name);
  return (
    <Labelled name={name} label={label} className={className}>
      <input id={fieldId(name)} type="date" aria-invalid={errors.length > 0 || undefined} className={`${inputClass} num w-full min-w-0 ${invalidClass(errors.length > 0)}`} {...register(name)} />
    </Labelled>
  );
}

export function SelectField({
  name,
  label,
  options,
  hint,
  className,
  onChange,
  testId,
}: {
  name: Name;
  label: ReactNode;
  options: ReadonlyArray<readonly [string, string]>;
  hint?: ReactNode;
  className?: string;
  onChange?: (value: string) => void;
  testId?: string;
}) {
  const { register } = useFormContext<EditorValues>();
  const { errors } = useFieldMessages(name);
  const reg = register(name);
  return (
    <Labelled name={name} label={label} hint={hint} className={className}>
      <select
        id={fieldId(name)}
        aria-invalid={errors.length > 0 || undefined}
        data-testid={testId}
        className={`${inputClass} w-full min-w-0 ${invalidClass(errors.length > 0)}`}
        {...reg}
        onChange={(e) => {
          void reg.onChange(e);
          onChange?.(e.target.value);
        }}
      >
        {options.map(([value, text]) => (
          <option key={value} value={value}>
            {text}
          </option>
        ))}
      </select>
    </Labelled>
  );
}

export function CheckField({ name, label, className = "" }: { name: Name; label: ReactNode; className?: string }) {
  const { register } = useFormContext<EditorValues>();
  return (
    <div className={`flex flex-col gap-0.5 ${className}`}>
      <label className="flex items-center gap-2 text-sm text-ink-soft" htmlFor={fieldId(name)}>
        <input id={fieldId(name)} type="checkbox" className="h-4 w-4 accent-accent" {...register(name)} />
        {label}
      </label>
      <Messages field={name} />
    </div>
  );
}

/** A card-level or section-level message (an issue no single field holds). */
export function CardMessages({ field }: { field: string }) {
  return <Messages field={field} className="rounded-md border border-blocks/20 bg-blocks-bg/50 px-2 py-1" />;
}
