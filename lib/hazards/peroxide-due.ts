/**
 * When a peroxide-forming container must next be tested: the one rule behind the
 * inventory's "test due" date and the hazard engine's caution TL-X01.
 *
 * - An opened container is due its test one class interval after the later of its
 *   opening and its last peroxide test (class A 3 months, B 12, C and D 12 by default;
 *   an unclassified former, EUH019 without a class, takes the shortest of the lab's class
 *   intervals).
 * - An unopened container is due the unopened interval (18 months by default) after the
 *   later of its receipt and its last test, or on its expiry date when that comes first.
 * - Intervals are whole calendar months, added with date-fns `addMonths`, which keeps the
 *   day of the month and clamps it to the month's last day: 2026-01-31 + 3 months is
 *   2026-04-30, 2024-02-29 + 12 months is 2025-02-28.
 * - The test is due ON its due date: `isPeroxideTestDue(due, today)` is true from that
 *   day on.
 *
 * Intervals after Prudent Practices in the Laboratory (National Research Council, 2011,
 * chapter 4): class A test or discard 3 months after opening, class B 12 months, unopened
 * containers 18 months or the expiry date; the lab sets its own (lib/hazards/thresholds.ts).
 */
import { addMonths, differenceInCalendarDays, format, parseISO } from "date-fns";
import type { PeroxideFormer } from "./hazard-flags";
import type { PeroxideIntervals } from "./thresholds";

/** Adds whole calendar months to an ISO date (YYYY-MM-DD), clamping to the month's last day. */
export function addCalendarMonths(isoDate: string, months: number): string {
  if (!Number.isInteger(months)) throw new RangeError(`months must be a whole number (got ${months})`);
  return format(addMonths(parseISO(isoDate), months), "yyyy-MM-dd");
}

/** Days from `from` to `to` (ISO dates; negative when `to` is earlier). */
export function daysBetween(from: string, to: string): number {
  return differenceInCalendarDays(parseISO(to), parseISO(from));
}

/** The test interval (months) of a class; an unclassified former gets the shortest class interval. */
export function peroxideIntervalMonths(intervals: PeroxideIntervals, cls: PeroxideFormer): number {
  return cls === "unclassified" ? Math.min(intervals.A, intervals.B, intervals.C, intervals.D) : intervals[cls];
}

export interface PeroxideContainerDates {
  /** The former's class (or "unclassified"); null: not a peroxide former. */
  peroxideClass: PeroxideFormer | null;
  /** Opening date; null = unopened; undefined = not recorded. */
  openedOn: string | null | undefined;
  receivedOn?: string | null | undefined;
  /** The last peroxide test (a negative result: a positive one means discard). */
  testedOn?: string | null | undefined;
  expiresOn?: string | null | undefined;
  intervals: PeroxideIntervals;
}

export interface PeroxideDue {
  /** The date the test falls due (YYYY-MM-DD). */
  due: string;
  /** What the due date counts from. */
  basis: "opened" | "tested" | "received" | "expiry";
  /** The date it counts from (for "expiry", the expiry date itself). */
  from: string;
  /** The interval applied (months); 0 for "expiry". */
  months: number;
  opened: boolean;
}

const later = (a: string | null | undefined, b: string | null | undefined): string | null => (a && b ? (a >= b ? a : b) : (a ?? b ?? null));

/**
 * The date a peroxide former's next test falls due, with what it counts from; null when
 * the container is not a peroxide former or has no date to count from (an opening date
 * not recorded, or an unopened container with neither receipt nor test date nor expiry).
 * Example: class A opened 2026-01-31, never tested → due 2026-04-30 (basis "opened").
 */
export function peroxideTestDue(c: PeroxideContainerDates): PeroxideDue | null {
  if (!c.peroxideClass) return null;
  if (typeof c.openedOn === "string") {
    const months = peroxideIntervalMonths(c.intervals, c.peroxideClass);
    const tested = c.testedOn && c.testedOn >= c.openedOn ? c.testedOn : null;
    const from = tested ?? c.openedOn;
    return { due: addCalendarMonths(from, months), basis: tested ? "tested" : "opened", from, months, opened: true };
  }
  if (c.openedOn === undefined) return null;
  const months = c.intervals.unopened;
  const from = later(c.receivedOn, c.testedOn);
  const byInterval: PeroxideDue | null = from
    ? { due: addCalendarMonths(from, months), basis: from === c.testedOn && from !== c.receivedOn ? "tested" : "received", from, months, opened: false }
    : null;
  if (c.expiresOn && (!byInterval || c.expiresOn < byInterval.due)) {
    return { due: c.expiresOn, basis: "expiry", from: c.expiresOn, months: 0, opened: false };
  }
  return byInterval;
}

/** Whether a test due on `due` must be done before use on `today` (true on the due date itself). */
export function isPeroxideTestDue(due: string, today: string): boolean {
  return today >= due;
}
