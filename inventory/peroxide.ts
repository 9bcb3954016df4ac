/**
 * When a peroxide-forming container must next be tested: the last test (or the opening
 * date, or for a sealed container the receipt date) plus the lab's interval for its class
 * (lib/hazards/thresholds.ts: class A 3 months, B 12, C and D 12, unopened 18 months —
 * after Prudent Practices in the Laboratory, NRC 2011).
 */
export type PeroxideClass = "A" | "B" | "C" | "D";
export interface PeroxideIntervals {
  A: number;
  B: number;
  C: number;
  D: number;
  unopened: number;
}

/** Adds whole months to an ISO date (YYYY-MM-DD), clamping to the month's last day. */
export function addMonths(isoDate: string, months: number): string {
  const [y, m, d] = isoDate.split("-").map(Number) as [number, number, number];
  const total = y * 12 + (m - 1) + Math.round(months);
  const ny = Math.floor(total / 12);
  const nm = total % 12;
  const last = new Date(Date.UTC(ny, nm + 1, 0)).getUTCDate();
  return `${String(ny).padStart(4, "0")}-${String(nm + 1).padStart(2, "0")}-${String(Math.min(d, last)).padStart(2, "0")}`;
}

/**
 * The date a peroxide former's test falls due, or null when the container is not a
 * peroxide former or has no date to count from.
 */
export function peroxideTestDue(opts: {
  peroxideClass: PeroxideClass | null;
  openedOn: string | null;
  receivedOn: string | null;
  testedOn: string | null;
  intervals: PeroxideIntervals;
}): string | null {
  if (!opts.peroxideClass) return null;
  if (opts.openedOn) {
    const from = opts.testedOn && opts.testedOn > opts.openedOn ? opts.testedOn : opts.openedOn;
    return addMonths(from, opts.intervals[opts.peroxideClass]);
  }
  const from = opts.testedOn ?? opts.receivedOn;
  return from ? addMonths(from, opts.intervals.unopened) : null;
}
