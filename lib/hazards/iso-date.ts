/**
 * The one ISO calendar-date schema (YYYY-MM-DD) of Tareline: the plan document, the
 * hazard engine's caution input and the inventory all parse dates with it. A date must
 * exist in the proleptic Gregorian calendar (2026-02-30 and 2025-02-29 are refused) and
 * lie in the years 0001–9999 (there is no year 0000).
 */
import { z } from "zod";

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

/** Whether `s` is a real calendar date written YYYY-MM-DD (years 0001–9999). */
export function isIsoDate(s: string): boolean {
  const m = ISO_DATE.exec(s);
  if (!m) return false;
  const y = Number(m[1]);
  const mo = Number(m[2]);
  const d = Number(m[3]);
  if (y < 1 || mo < 1 || mo > 12 || d < 1) return false;
  return d <= daysInMonth(y, mo);
}

/** Days in month `month` (1–12) of year `year`, Gregorian leap-year rule. */
export function daysInMonth(year: number, month: number): number {
  if (month === 2) return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0 ? 29 : 28;
  return [4, 6, 9, 11].includes(month) ? 30 : 31;
}

/** An ISO calendar date, YYYY-MM-DD; the message names the expected form. */
export const isoDateSchema = z
  .string()
  .refine(isIsoDate, "must be a real calendar date written YYYY-MM-DD (years 0001–9999)");

/** Today's date in UTC, YYYY-MM-DD. */
export function todayIsoUtc(now: Date = new Date()): string {
  return now.toISOString().slice(0, 10);
}
