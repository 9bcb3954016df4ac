/**
 * The rules about the components of a vial: TL-R01 pyrophoric, TL-R02 water-reactive,
 * TL-R04 reactive with an aqueous or protic partner, TL-X01–X03 peroxide formers,
 * TL-H01 CMR; and TL-R03, the second-person rule over the whole plan.
 */
import type { Firing } from "../run-checks";
import { fmt } from "../run-checks";
import { daysBetween, isPeroxideTestDue, peroxideIntervalMonths, peroxideTestDue } from "../peroxide-due";
import type { PeroxideFormer } from "../hazard-flags";
import type { LabThresholds } from "../thresholds";
import type { HazardProfile, Material } from "./hazard-profile";

function cmrKinds(cmr: readonly string[]): string {
  return [
    cmr.some((g) => g.toUpperCase().startsWith("H340")) ? "mutagenic" : "",
    cmr.some((g) => g.toUpperCase().startsWith("H350")) ? "carcinogenic" : "",
    cmr.some((g) => g.toUpperCase().startsWith("H360")) ? "toxic to reproduction" : "",
  ]
    .filter(Boolean)
    .join(", ");
}

function waterMessage(h: HazardProfile): string {
  const gas = h.waterCodes.filter((c) => !c.toUpperCase().startsWith("EUH014"));
  const violent = h.waterCodes.length > gas.length;
  const what = gas.length > 0 ? `reacts with water and releases flammable gas${violent ? ", violently" : ""}` : violent ? "reacts violently with water" : "reacts with water";
  return `${h.name} ${what}${h.waterCodes.length ? ` (${h.waterCodes.join(", ")})` : ""}.`;
}

/** The rules about a component itself: TL-R01, TL-R02, TL-X01–X03, TL-H01 (`today` an ISO date). */
export function ownFirings(m: Material, concentrates: boolean, t: LabThresholds, today: string): Firing[] {
  const h = m.p;
  const out: Firing[] = [];
  if (h.pyrophoric) {
    out.push({ code: "TL-R01", severity: "warning", component: h.name, score: 0, message: () => `${h.name} is pyrophoric (H250): it catches fire on contact with air.${h.waterReactive ? " It also reacts with water." : ""}` });
  }
  if (h.waterReactive) {
    out.push({ code: "TL-R02", severity: "warning", component: h.name, score: 0, message: () => waterMessage(h) });
  }
  if (h.peroxideClass) peroxideFirings(m, h.peroxideClass, concentrates, t, today, out);
  const cmr = h.cmrCodes;
  if (cmr.length > 0) {
    out.push({ code: "TL-H01", severity: "warning", component: h.name, score: 0, message: () => `${h.name} is ${cmrKinds(cmr)} (${cmr.join(", ")}).` });
  }
  return out;
}

/**
 * TL-X01 when the container's peroxide test is due on `today` or earlier (the one due-date
 * rule, lib/hazards/peroxide-due.ts); TL-X02 when the run concentrates the former;
 * TL-X03 when the opening date is not recorded.
 */
function peroxideFirings(m: Material, cls: PeroxideFormer, concentrates: boolean, t: LabThresholds, today: string, out: Firing[]): void {
  const intervals = t.peroxideTestIntervalMonths;
  const label = cls === "unclassified" ? "unclassified peroxide former (EUH019)" : `peroxide former, class ${cls}`;
  const due = peroxideTestDue({ peroxideClass: cls, openedOn: m.openedOn, receivedOn: m.receivedOn, testedOn: m.peroxideTestedOn, expiresOn: m.expiresOn, intervals });
  const overdue = due !== null && isPeroxideTestDue(due.due, today);
  if (due && overdue) {
    const days = daysBetween(due.due, today);
    const since = days === 0 ? "today" : `${days} day${days === 1 ? "" : "s"} ago`;
    const basis =
      due.basis === "expiry"
        ? "the expiry date of its unopened container"
        : due.basis === "tested"
          ? `${fmt(due.months, 0)} months after its last peroxide test on ${due.from}`
          : due.basis === "opened"
            ? `${fmt(due.months, 0)} months after its container was opened on ${due.from}, with no later peroxide test on record`
            : `${fmt(due.months, 0)} months after its unopened container was received on ${due.from}, with no later peroxide test on record`;
    out.push({
      code: "TL-X01",
      severity: "warning",
      component: m.p.name,
      score: days,
      message: () => `${m.p.name} (${label}) was due its peroxide test on ${due.due} (${since}): ${basis}.`,
    });
  } else if (m.openedOn === undefined) {
    out.push({
      code: "TL-X03",
      severity: "info",
      component: m.p.name,
      score: 0,
      message: () => `${m.p.name} is a ${label}; the opening date of its container is not recorded.`,
    });
  }
  if (concentrates) {
    const months = peroxideIntervalMonths(intervals, cls);
    out.push({
      code: "TL-X02",
      severity: "warning",
      component: m.p.name,
      score: 1,
      message: () => `${m.p.name} (${label}) is concentrated or heated to dryness in this run${overdue || !m.peroxideTestedOn ? `, and there is no peroxide test on record within the lab's ${fmt(months, 0)}-month interval` : ""}.`,
    });
  }
}

/** TL-R04: a pyrophoric or water-reactive material with an aqueous or protic partner in the same vial. */
export function wetPartnerFirings(inVial: readonly HazardProfile[], out: { push(f: Firing): unknown }): void {
  for (const h of inVial) {
    if (!(h.pyrophoric || h.waterReactive)) continue;
    const wet = inVial.filter((w) => w.key !== h.key && (w.protic || w.aqueous));
    if (wet.length > 0) {
      out.push({
        code: "TL-R04",
        severity: "blocking",
        component: h.name,
        score: wet.length,
        message: () => `${h.name} is ${h.pyrophoric ? "pyrophoric" : "water-reactive"} and shares the vial with ${wet.map((w) => `${w.name} (${w.aqueous ? "aqueous" : "protic"})`).join(", ")}.`,
      });
    }
  }
}

/** TL-R03: one reactive reagent's volume summed over the plan above the lab's second-person threshold. */
export function secondPersonFirings(
  totals: Iterable<{ name: string; ul: number; runs: Set<number> }>,
  t: LabThresholds,
  add: (run: number, f: Firing) => void,
): void {
  for (const tot of totals) {
    const ml = tot.ul / 1000;
    if (ml <= t.pyrophoricSecondPersonVolumeMl) continue;
    for (const r of tot.runs) {
      add(r, {
        code: "TL-R03",
        severity: "warning",
        component: tot.name,
        score: ml,
        message: () => `${fmt(ml, 2)} mL of ${tot.name} is handled in this plan, above the lab's second-person threshold of ${fmt(t.pyrophoricSecondPersonVolumeMl, 2)} mL.`,
      });
    }
  }
}
