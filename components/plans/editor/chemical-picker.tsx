"use client";

/**
 * Picks a chemical from the lab's catalogue (GET /api/labs/{lab}/chemicals): a search box
 * (name, synonym, CAS number or formula) with the matches listed under it (WAI-ARIA APG
 * combobox with a listbox popup: arrow keys move, Enter picks, Escape closes).
 */
import { useId, useMemo, useRef, useState } from "react";
import type { ChemicalRow } from "@/inventory/schemas";
import { inputClass } from "@/components/ui/field";

const STATE_WORD: Record<string, string> = { solid: "solid", liquid: "liquid", solution: "solution", gas: "gas" };

function matches(c: ChemicalRow, q: string): boolean {
  if (!q) return true;
  const key = q.toLowerCase();
  return [c.name, ...c.synonyms, c.cas ?? "", c.formula ?? ""].some((s) => s.toLowerCase().includes(key));
}

export function ChemicalPicker({ chemicals, onPick, label, testId, loading }: { chemicals: readonly ChemicalRow[]; onPick: (c: ChemicalRow) => void; label: string; testId?: string; loading?: boolean }) {
  const [q, setQ] = useState("");
  const [open, setOpen] = useState(false);
  const [active, setActive] = useState(0);
  const id = useId();
  const input = useRef<HTMLInputElement>(null);
  const found = useMemo(() => chemicals.filter((c) => matches(c, q.trim())).slice(0, 12), [chemicals, q]);
  const pick = (c: ChemicalRow) => {
    onPick(c);
    setQ("");
    setOpen(false);
  };
  return (
    <div className="relative">
      <label htmlFor={`${id}-q`} className="sr-only">
        {label}
      </label>
      <input
        ref={input}
        id={`${id}-q`}
        role="combobox"
        aria-expanded={open}
        aria-controls={`${id}-list`}
        aria-autocomplete="list"
        aria-activedescendant={open && found[active] ? `${id}-o-${active}` : undefined}
        placeholder={loading ? "Loading the catalogue…" : label}
        autoComplete="off"
        className={`${inputClass} w-full`}
        value={q}
        data-testid={testId}
        onChange={(e) => {
          setQ(e.target.value);
          setOpen(true);
          setActive(0);
        }}
        onFocus={() => setOpen(true)}
        onBlur={() => setTimeout(() => setOpen(false), 150)}
        onKeyDown={(e) => {
          if (e.key === "ArrowDown") {
            e.preventDefault();
            setOpen(true);
            setActive((a) => Math.min(a + 1, found.length - 1));
          } else if (e.key === "ArrowUp") {
            e.preventDefault();
            setActive((a) => Math.max(a - 1, 0));
          } else if (e.key === "Enter" && open && found[active]) {
            e.preventDefault();
            pick(found[active]);
          } else if (e.key === "Escape") setOpen(false);
        }}
      />
      {open && (
        <ul id={`${id}-list`} role="listbox" aria-label={label} className="absolute left-0 right-0 top-full z-30 mt-1 max-h-72 overflow-y-auto rounded-md border border-ink-line bg-paper-card py-1 shadow-lg">
          {found.length === 0 && <li className="px-3 py-2 text-sm text-ink-soft">{chemicals.length === 0 ? "The catalogue is empty." : "No chemical of the catalogue matches."}</li>}
          {found.map((c, i) => (
            <li
              key={c.id}
              id={`${id}-o-${i}`}
              role="option"
              aria-selected={i === active}
              className={`cursor-pointer px-3 py-1.5 text-sm ${i === active ? "bg-accent-light" : ""}`}
              onMouseDown={(e) => {
                e.preventDefault();
                pick(c);
              }}
              onMouseEnter={() => setActive(i)}
            >
              <span className="font-medium">{c.name}</span>{" "}
              <span className="text-xs text-ink-soft">
                {[c.formula, c.cas, STATE_WORD[c.physicalState], c.ghsStatements.length ? c.ghsStatements.slice(0, 4).join(" ") + (c.ghsStatements.length > 4 ? " …" : "") : null].filter(Boolean).join(" · ")}
              </span>
            </li>
          ))}
        </ul>
      )}
    </div>
  );
}
