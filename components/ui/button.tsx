import type { ButtonHTMLAttributes } from "react";

type Variant = "primary" | "secondary" | "danger";
const styles: Record<Variant, string> = {
  primary: "bg-accent text-paper-card hover:bg-accent-dark",
  secondary: "border border-ink-edge bg-paper-card text-ink hover:bg-paper-deep",
  danger: "border border-blocks/40 bg-paper-card text-blocks hover:bg-blocks-bg",
};

/** The classes of a button, for links that look like one (e.g. "New study"). */
export function buttonClass(variant: Variant = "primary", className = ""): string {
  return `inline-flex items-center justify-center rounded-md px-3 py-1.5 text-sm font-medium no-underline transition-colors hover:no-underline disabled:cursor-not-allowed disabled:opacity-50 ${styles[variant]} ${className}`;
}

export function Button({ variant = "primary", className = "", ...props }: ButtonHTMLAttributes<HTMLButtonElement> & { variant?: Variant }) {
  return <button {...props} className={buttonClass(variant, className)} />;
}
