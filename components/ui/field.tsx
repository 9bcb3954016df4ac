import type { ReactNode } from "react";

/** A labelled form field with its error message (from the shared zod schema). */
export function Field({ label, htmlFor, error, hint, children }: { label: string; htmlFor: string; error?: string; hint?: string; children: ReactNode }) {
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={htmlFor} className="text-sm font-medium text-ink-soft">
        {label}
      </label>
      {children}
      {hint && !error && <p className="text-xs text-ink-faint">{hint}</p>}
      {error && (
        <p className="text-xs text-blocks" data-testid={`error-${htmlFor}`}>
          {error}
        </p>
      )}
    </div>
  );
}

export const inputClass =
  "rounded-md border border-ink-edge bg-paper-card px-2.5 py-1.5 text-sm text-ink placeholder:text-ink-faint focus:border-accent focus:outline-none focus:ring-1 focus:ring-accent";
