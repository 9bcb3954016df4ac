/**
 * The inventory's peroxide test dates: the hazard engine's rule (lib/hazards/peroxide-due.ts)
 * applied to a chemical record and one of its containers, so the inventory's "test due"
 * date and the plan cautions always agree.
 */
import { impliedHazards, type PeroxideClass } from "@/lib/hazards/hazard-flags";
import { isPeroxideTestDue, peroxideTestDue as dueOf } from "@/lib/hazards/peroxide-due";
import type { PeroxideIntervals } from "@/lib/hazards/thresholds";

export type { PeroxideClass } from "@/lib/hazards/hazard-flags";
export type { PeroxideIntervals } from "@/lib/hazards/thresholds";
export { isPeroxideTestDue };

/**
 * The date a container's next peroxide test falls due (YYYY-MM-DD), or null when the
 * chemical is not a peroxide former (no class and no EUH019) or the container has no date
 * to count from. `openedOn: null` is an unopened container.
 */
export function peroxideTestDue(opts: {
  peroxideClass: PeroxideClass | null;
  /** The chemical's GHS statements: EUH019 without a class makes it an unclassified former. */
  ghs?: readonly string[];
  openedOn: string | null;
  receivedOn: string | null;
  testedOn: string | null;
  expiresOn?: string | null;
  intervals: PeroxideIntervals;
}): string | null {
  const cls = impliedHazards({ ghs: opts.ghs ?? [], peroxideClass: opts.peroxideClass }).peroxideClass;
  return (
    dueOf({
      peroxideClass: cls,
      openedOn: opts.openedOn,
      receivedOn: opts.receivedOn,
      testedOn: opts.testedOn,
      expiresOn: opts.expiresOn ?? null,
      intervals: opts.intervals,
    })?.due ?? null
  );
}
