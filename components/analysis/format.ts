/** Number formatting for the analysis tables (significant digits, p-values, units beside numbers). */
import { displayUnit } from "@/lib/units/display-unit";

/** A number to `digits` significant digits, without trailing noise; "—" for null. */
export function sig(v: number | null | undefined, digits = 4): string {
  if (v === null || v === undefined || !Number.isFinite(v)) return "—";
  if (v === 0) return "0";
  const a = Math.abs(v);
  if (a >= 1e6 || a < 1e-4) return v.toExponential(digits - 1);
  return Number(v.toPrecision(digits)).toString();
}

/** A p-value: "< 0.0001" below 1e-4, else 4 decimals. */
export function pValue(p: number | null | undefined): string {
  if (p === null || p === undefined || !Number.isFinite(p)) return "—";
  return p < 1e-4 ? "< 0.0001" : p.toFixed(4);
}

/** A number with its unit ("72.1 %", "80 °C"). */
export function withUnit(v: number | null | undefined, unit: string | undefined, digits = 4): string {
  const s = sig(v, digits);
  if (s === "—" || !unit) return s;
  const u = displayUnit(unit);
  return u ? `${s} ${u}` : s;
}

/** A term's name for people: time^2 → time², a*b → a × b. */
export function termLabel(term: string): string {
  if (term === "intercept") return "intercept";
  return term.replace(/\^2/g, "²").replace(/\^3/g, "³").replace(/\*/g, " × ");
}
