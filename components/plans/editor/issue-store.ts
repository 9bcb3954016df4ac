"use client";

/**
 * The issues the editor shows, by field (form-paths.ts decides the field): errors from the
 * browser's check with the plan document's schema, from the server (a refused preview or
 * save, an infeasible plan, an imported file), and warnings (where the document disagrees
 * with the inventory's record). Each field subscribes to its own path, so typing in one
 * field re-renders only the fields whose messages change.
 */
import { createContext, useContext, useSyncExternalStore } from "react";

export interface FieldMessages {
  errors: readonly string[];
  warnings: readonly string[];
}

const NONE: FieldMessages = { errors: [], warnings: [] };

const same = (a: readonly string[], b: readonly string[]) => a.length === b.length && a.every((x, i) => x === b[i]);

export class IssueStore {
  private byField = new Map<string, FieldMessages>();
  private listeners = new Set<() => void>();

  subscribe = (listener: () => void): (() => void) => {
    this.listeners.add(listener);
    return () => this.listeners.delete(listener);
  };

  get(field: string): FieldMessages {
    return this.byField.get(field) ?? NONE;
  }

  /** Every field with a message, in insertion order. */
  entries(): Array<[string, FieldMessages]> {
    return [...this.byField.entries()];
  }

  /** Replaces every message; keeps the old object of each field whose messages did not change (so its subscribers do not re-render). */
  replace(errors: ReadonlyMap<string, readonly string[]>, warnings: ReadonlyMap<string, readonly string[]>): void {
    const next = new Map<string, FieldMessages>();
    for (const field of new Set([...errors.keys(), ...warnings.keys()])) {
      const e = errors.get(field) ?? [];
      const w = warnings.get(field) ?? [];
      const old = this.byField.get(field);
      next.set(field, old && same(old.errors, e) && same(old.warnings, w) ? old : { errors: e, warnings: w });
    }
    const changed = next.size !== this.byField.size || [...next].some(([k, v]) => this.byField.get(k) !== v);
    this.byField = next;
    if (changed) for (const l of this.listeners) l();
  }
}

export const IssueContext = createContext<IssueStore | null>(null);

/** The messages of one field (or card, or section). */
export function useFieldMessages(field: string): FieldMessages {
  const store = useContext(IssueContext);
  return useSyncExternalStore(
    store ? store.subscribe : noopSubscribe,
    () => (store ? store.get(field) : NONE),
    () => NONE,
  );
}

/** Whether any field under `prefix` (e.g. a component's advanced fields) has an error. */
export function useHasErrorUnder(prefixes: readonly string[]): boolean {
  const store = useContext(IssueContext);
  return useSyncExternalStore(
    store ? store.subscribe : noopSubscribe,
    () => (store ? store.entries().some(([f, m]) => m.errors.length > 0 && prefixes.some((p) => f === p || f.startsWith(`${p}.`))) : false),
    () => false,
  );
}

const noopSubscribe = () => () => {};
