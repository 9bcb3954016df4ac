/**
 * The caution rules: Tareline's own codes, their severity and remedy. The messages are
 * written by the engine for each case (plan-cautions.ts); the table here is the fixed
 * part, shown in the docs and on the safety pages.
 *
 * Code scheme: TL-<area><number>: V vessel and pressure, F fire, T temperature limits
 * of the equipment, R reactive reagents, X peroxide formers, H health (CMR), S sign-off.
 */

export type Severity = "info" | "warning" | "blocking";

/** One caution in a report: one per rule and component, listing every run it touches. */
export interface Caution {
  code: string;
  severity: Severity;
  runs: number[];
  component?: string;
  message: string;
  remedy: string;
}

export interface CautionRule {
  title: string;
  severity: Severity;
  remedy: string;
}

/** The standard notice every output that shows cautions carries. */
export const PLANNING_NOTICE =
  "These cautions are planning aids, not a risk assessment. Local regulations, the institution's chemical hygiene plan and the judgement of qualified staff decide.";

export const CAUTION_RULES = {
  "TL-V01": {
    title: "Sealed vessel above the solvent's boiling point",
    severity: "warning",
    remedy:
      "Check that the vessel is rated for the estimated pressure, heat behind a shield, and let the vessel cool to room temperature before opening; or run below the boiling point, or open under reflux.",
  },
  "TL-V02": {
    title: "Estimated pressure over the lab's limit for the vessel",
    severity: "blocking",
    remedy: "Lower the temperature, reduce the fill or the gas released, or choose a vessel with a higher rating.",
  },
  "TL-V03": {
    title: "Fill above the vessel's maximum",
    severity: "blocking",
    remedy: "Reduce the liquid volume per vial or use a larger vessel; leave room for the liquid to expand on heating.",
  },
  "TL-V04": {
    title: "Vapour pressure extrapolated or estimated",
    severity: "info",
    remedy:
      "Treat the pressure as approximate; add cited vapour-pressure parameters for this solvent that cover the temperature.",
  },
  "TL-V05": {
    title: "Pressure cannot be estimated",
    severity: "blocking",
    remedy:
      "Add the solvent to the lab's records with cited vapour-pressure parameters, or change the solvent or the temperature.",
  },
  "TL-V06": {
    title: "Vessel rating not confirmed",
    severity: "info",
    remedy: "Enter the supplier's pressure rating, working volume and maximum fill for this vessel type.",
  },
  "TL-F01": {
    title: "Above the flash point",
    severity: "warning",
    remedy:
      "Keep ignition sources away: heat with a block or bath, never an open flame; work in a fume hood and keep the vessel closed while hot.",
  },
  "TL-F02": {
    title: "Near the autoignition temperature",
    severity: "blocking",
    remedy: "Lower the temperature well below the autoignition temperature, or change the solvent.",
  },
  "TL-T01": {
    title: "Above the heating block's maximum",
    severity: "warning",
    remedy: "Lower the factor's high level or use equipment rated for the temperature.",
  },
  "TL-T02": {
    title: "Below the cooling method's minimum",
    severity: "warning",
    remedy: "Raise the factor's low level or use a cooling method that reaches the temperature.",
  },
  "TL-R01": {
    title: "Pyrophoric reagent",
    severity: "warning",
    remedy:
      "Follow a written procedure after training; transfer under inert gas by syringe (up to about 10–20 mL) or by cannula; flame-resistant lab coat; fume hood or glovebox; never work alone; have the quench ready (inert solvent, cold, then isopropanol, methanol, water).",
  },
  "TL-R02": {
    title: "Water-reactive reagent",
    severity: "warning",
    remedy: "Use dry solvents and dry glassware under inert gas; keep water away; quench slowly and cold.",
  },
  "TL-R03": {
    title: "Second trained person required",
    severity: "warning",
    remedy: "A second trained person must be present for all transfers of this reagent.",
  },
  "TL-R04": {
    title: "Water-reactive or pyrophoric reagent with an aqueous or protic component",
    severity: "blocking",
    remedy:
      "Take the aqueous or protic component out of the vial, or add the reactive reagent in a separate dry step before any water or alcohol.",
  },
  "TL-X01": {
    title: "Peroxide former past its test interval",
    severity: "warning",
    remedy: "Test the container for peroxides before use and record the result; discard it if the test is positive.",
  },
  "TL-X02": {
    title: "Peroxide former concentrated or heated to dryness",
    severity: "warning",
    remedy:
      "Test for peroxides immediately before use and record the result; never concentrate a peroxide former to dryness — leave solvent in the residue.",
  },
  "TL-X03": {
    title: "Peroxide former without an opening date",
    severity: "info",
    remedy: "Record the opening date on the container so its test dates can be tracked.",
  },
  "TL-H01": {
    title: "Carcinogenic, mutagenic or reprotoxic component",
    severity: "warning",
    remedy:
      "Handle in a fume hood or ventilated enclosure with suitable gloves, weigh in a contained balance, keep exposure minimal and label the waste; check whether your institution requires a designated area.",
  },
} as const satisfies Record<string, CautionRule>;

export type CautionCode = keyof typeof CAUTION_RULES;

/** Sign-off reasons (strings in the report), with their codes. */
export const SIGN_OFF_RULES = {
  "TL-S01": "a run at or above the lab's sign-off temperature",
  "TL-S02": "a pyrophoric reagent in the plan",
  "TL-S03": "a sealed vessel heated above the solvent's boiling point",
} as const;

const RANK: Record<Severity, number> = { info: 0, warning: 1, blocking: 2 };

/** Orders cautions: blocking first, then warning, then info; then by code and component. */
export function compareCautions(a: Caution, b: Caution): number {
  return (
    RANK[b.severity] - RANK[a.severity] ||
    a.code.localeCompare(b.code) ||
    (a.component ?? "").localeCompare(b.component ?? "")
  );
}
