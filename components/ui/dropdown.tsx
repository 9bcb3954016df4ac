"use client";

import { useEffect, useId, useRef, useState, type ReactNode } from "react";

/**
 * A button that opens a panel below it (a disclosure, WAI-ARIA APG "Disclosure" pattern):
 * aria-expanded on the button, closed by Escape (focus back on the button), by a click
 * outside, or by the panel calling `close` (e.g. when a link in it is followed).
 */
export function Dropdown({
  button,
  buttonClassName,
  panelClassName = "",
  align = "left",
  testId,
  children,
}: {
  button: ReactNode;
  buttonClassName: string;
  panelClassName?: string;
  align?: "left" | "right";
  testId?: string;
  children: (close: () => void) => ReactNode;
}) {
  const [open, setOpen] = useState(false);
  const root = useRef<HTMLDivElement>(null);
  const trigger = useRef<HTMLButtonElement>(null);
  const id = useId();
  useEffect(() => {
    if (!open) return;
    const onPointer = (e: PointerEvent) => {
      if (root.current && !root.current.contains(e.target as Node)) setOpen(false);
    };
    const onKey = (e: KeyboardEvent) => {
      if (e.key === "Escape") {
        setOpen(false);
        trigger.current?.focus();
      }
    };
    document.addEventListener("pointerdown", onPointer);
    document.addEventListener("keydown", onKey);
    return () => {
      document.removeEventListener("pointerdown", onPointer);
      document.removeEventListener("keydown", onKey);
    };
  }, [open]);
  return (
    <div ref={root} className="relative">
      <button ref={trigger} type="button" className={buttonClassName} aria-expanded={open} aria-controls={id} onClick={() => setOpen((o) => !o)} data-testid={testId}>
        {button}
        <svg aria-hidden="true" width="10" height="10" viewBox="0 0 10 10" className={`ml-1 inline-block ${open ? "rotate-180" : ""}`}>
          <path d="M2 3.5 L5 6.5 L8 3.5" fill="none" stroke="currentColor" strokeWidth="1.5" strokeLinecap="round" strokeLinejoin="round" />
        </svg>
      </button>
      <div id={id} hidden={!open} className={`absolute top-full z-20 mt-1 min-w-48 rounded-md border border-ink-line bg-paper-card p-1 shadow-lg ${align === "right" ? "right-0" : "left-0"} ${panelClassName}`}>
        {open && children(() => setOpen(false))}
      </div>
    </div>
  );
}
