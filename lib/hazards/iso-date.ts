/**
 * The one ISO calendar-date schema (YYYY-MM-DD) of Tareline: the plan document, the
 * hazard engine's caution input and the inventory all parse dates with it. A date must
 * exist in the Gregorian calendar (2026-02-30 and 2025-02-29 are refused) and lie in the
 * years 1900–2200 (PostgreSQL has no year 0000, and no lab record is older than 1900).
 */
import { z } from "zod";

const ISO_DATE = /^(\d{4})-(\d{2})-(\d{2})$/;

/** The first and last years a date may carry. */
export const ISO_DATE_YEARS = { first: 1900, last: 2200 } as const;

/** Days in month `month` (1–12) of year `year`, Gregorian leap-year rule. */
export function daysInMonth(year: number, month: number): number {
  if (month === 2) return (year % 4 === 0 && year % 100 !== 0) || year % 400 === 0 ? 29 : 28;
  return [4, 6, 9, 11].includes(month) ? 30 : 31;
}

/** What is wrong with `s` as a date, or null for a real calendar date written YYYY-MM-DD in the accepted years. */
export function isoDateProblem(s: string): string | null {
  const m = ISO_DATE.exec(s);
  if (!m) return "use YYYY-MM-DD";
  const y = Number(m[1]);
  const mo = Number(m[2]);
  const d = Number(m[3]);
  if (y < ISO_DATE_YEARS.first || y > ISO_DATE_YEARS.last) return `use a year from ${ISO_DATE_YEARS.first} to ${ISO_DATE_YEARS.last}`;
  if (mo < 1 || mo > 12 || d < 1 || d > daysInMonth(y, mo)) return "not a real date";
  return null;
}

/** Whether `s` is a real calendar date written YYYY-MM-DD in the accepted years. */
export function isIsoDate(s: string): boolean {
  return isoDateProblem(s) === null;
}

/** An ISO calendar date, YYYY-MM-DD, in the years 1900–2200; the message says what is wrong. */
export const isoDateSchema = z.string().superRefine((s, ctx) => {
  const problem = isoDateProblem(s);
  if (problem) ctx.addIssue({ code: "custom", message: problem });
});

/** Today's date in UTC, YYYY-MM-DD. */
export function todayIsoUtc(now: Date = new Date()): string {
  return now.toISOString().slice(0, 10);
}
