import { unitLabel } from "@/lib/plans/safe-design-labels";

/** A number to 4 significant digits, a true minus sign, no trailing zeros. */
export function num(v: number): string {
  if (!Number.isFinite(v)) return String(v);
  const r = Number(v.toPrecision(4));
  return String(Object.is(r, -0) ? 0 : r).replace("-", "−");
}

/** A value with its factor's unit ("125.2 °C", "2.25 equiv", "0.1"). */
export function withUnit(v: number, unit: string | undefined): string {
  const u = unitLabel(unit);
  return u ? `${num(v)} ${u}` : num(v);
}

/** The factors' units by name, from the document the form holds. */
export function factorUnits(document: Record<string, unknown> | null): Map<string, string | undefined> {
  const out = new Map<string, string | undefined>();
  const factors = document?.factors;
  if (Array.isArray(factors)) {
    for (const f of factors) {
      if (f && typeof f === "object" && "name" in f) out.set(String((f as { name: unknown }).name), typeof (f as { unit?: unknown }).unit === "string" ? ((f as { unit: string }).unit) : undefined);
    }
  }
  return out;
}
