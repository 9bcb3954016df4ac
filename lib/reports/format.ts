/**
 * How the sheets write numbers and units (prep sheet, analysis report, worklist, vial
 * map): the unit always next to the number, a true minus sign, and a fixed number of
 * decimals per kind of amount so the columns line up (tabular figures come from the
 * font). Pure.
 */

import { displayUnit } from "../units/display-unit";

/** Units as printed: the one table (lib/units/display-unit.ts). */
export { displayUnit };

/** A plain number with `decimals` decimals, minus as U+2212. */
export function fixed(v: number, decimals: number): string {
  if (!Number.isFinite(v)) return "—";
  const s = v.toFixed(decimals);
  return Number(s) === 0 ? (0).toFixed(decimals) : s.replace("-", "−");
}

/** A number to `digits` significant digits without trailing zeros (−0 as 0), minus as U+2212. */
export function significant(v: number, digits = 4): string {
  if (!Number.isFinite(v)) return "—";
  const r = Number(v.toPrecision(digits));
  return String(Object.is(r, -0) ? 0 : r).replace("-", "−");
}

/**
 * Decimals for a bench amount (µL or mg) of this size: 2 below 10, 1 below 100, none
 * from 100 (common practice: what a pipette or a 4–5-place balance can set or read).
 */
export function amountDecimals(v: number): number {
  const a = Math.abs(v);
  return a < 10 ? 2 : a < 100 ? 1 : 0;
}

/** A volume in µL with its unit: "12.5 µL". */
export function microlitres(v: number): string {
  return `${fixed(v, amountDecimals(v))} µL`;
}

/** A mass in mg with its unit: "8.21 mg". */
export function milligrams(v: number): string {
  return `${fixed(v, amountDecimals(v))} mg`;
}

/** A temperature with its unit: "60 °C", "61.7 °C". */
export function celsius(v: number): string {
  return `${significant(v, 4)} °C`;
}

/** A factor's value with its unit: "1.5 equiv", "0.3 fraction". */
export function withUnit(v: number, unit: string | undefined | null): string {
  const u = displayUnit(unit);
  return u ? `${significant(v, 4)} ${u}` : significant(v, 4);
}

/** An ISO instant as "2026-12-01 14:05 UTC" (the sheets print UTC so they read the same everywhere). */
export function utcMinute(iso: string): string {
  const d = new Date(iso);
  if (Number.isNaN(d.getTime())) return iso;
  return `${d.toISOString().slice(0, 10)} ${d.toISOString().slice(11, 16)} UTC`;
}
