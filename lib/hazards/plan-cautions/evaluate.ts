/**
 * The cautions of a whole plan: every rule applied to every run (run-cautions.ts), merged
 * into one caution per rule and component listing the runs it touches, plus the plan-wide
 * rules (second person, unconfirmed vessel), the sign-off decision and the per-run
 * pressure estimates. Called by the chemistry engine's `plan` verb and by the app's
 * safety review.
 */
import { parseOrThrow } from "../../errors/app-error";
import { PLANNING_NOTICE, SIGN_OFF_RULES, type Caution } from "../caution-rules";
import { fmt } from "../run-checks";
import { CautionAccumulator } from "./accumulator";
import { secondPersonFirings } from "./component-checks";
import { cautionContext, evaluateRun } from "./run-cautions";
import { planCautionInputSchema, type PlanCautionInput } from "./schema";
import type { VialResult } from "./vial-checks";

export interface PlanCautionReport {
  cautions: Caution[];
  signOffRequired: boolean;
  signOffReasons: string[];
  releasable: boolean;
  perRun: Array<{ run: number; totalBar: number | null; vaporBar: number | null; fillFractionHot: number | null }>;
  notice: string;
}

/**
 * Evaluates every caution rule for every run of a plan (rules and codes in
 * caution-rules.ts; the sealed-vessel pressure model in sealed-vessel.ts; peroxide test
 * dates by the rule of peroxide-due.ts). One caution per rule and component, listing
 * every run it touches; `releasable` is false whenever a caution is blocking; sign-off is
 * required for a run at or above the lab's sign-off temperature (TL-S01), any
 * pyrophoric reagent (TL-S02) and any sealed run above the solvent's boiling point (TL-S03).
 * @throws AppError invalid_input with dotted paths (e.g. `runs.3.temperatureC`,
 * `runs.0.solvents` for fractions not summing to 1) when the input does not validate.
 */
export function evaluatePlanCautions(input: PlanCautionInput): PlanCautionReport {
  const p = parseOrThrow(planCautionInputSchema, input, "The plan's hazard input is not valid.");
  const ctx = cautionContext(p);
  const t = p.thresholds;
  const acc = new CautionAccumulator();
  const perRun: PlanCautionReport["perRun"] = [];
  const reactiveTotals = new Map<string, { name: string; ul: number; runs: Set<number> }>();
  const pyrophoricNames = new Set<string>();
  const aboveBoiling = new Set<number>();
  let hottest = -Infinity;
  const hotRuns: number[] = [];
  const vialCache = new Map<string, VialResult>();

  p.runs.forEach((run, i) => {
    acc.current = run.run;
    if (run.temperatureC >= t.signOffTemperatureC) {
      hotRuns.push(run.run);
      hottest = Math.max(hottest, run.temperatureC);
    }
    const ev = evaluateRun(ctx, run, i, vialCache);
    for (const f of ev.firings) {
      acc.push(f);
      if (f.code === "TL-V01") aboveBoiling.add(run.run);
    }
    perRun.push({ run: run.run, totalBar: ev.vial.totalBar, vaporBar: ev.vial.vaporBar, fillFractionHot: ev.vial.fillFractionHot });
    for (const { c, profile: h } of ev.components) {
      if (!(h.pyrophoric || h.waterReactive)) continue;
      let tot = reactiveTotals.get(h.key);
      if (!tot) {
        tot = { name: h.name, ul: 0, runs: new Set<number>() };
        reactiveTotals.set(h.key, tot);
      }
      tot.ul += c.volumeUl ?? 0;
      tot.runs.add(run.run);
      if (h.pyrophoric) pyrophoricNames.add(h.name);
    }
  });

  secondPersonFirings(reactiveTotals.values(), t, (r, f) => acc.add(r, f));

  // The vessel's own rating.
  if (p.vessel.sealed && p.vessel.confirmWithSupplier && p.runs.length > 0) {
    for (const r of p.runs) {
      acc.add(r.run, {
        code: "TL-V06",
        severity: "info",
        component: p.vessel.name,
        score: 0,
        message: () => `The rating of ${p.vessel.name} (${fmt(p.vessel.ratedBar)} bar absolute, maximum fill ${fmt(p.vessel.maxFillFraction * 100, 1)} %) is a default that has not been confirmed with the supplier.`,
      });
    }
  }

  const cautions = acc.cautions();
  const signOffReasons: string[] = [];
  if (hotRuns.length > 0) {
    signOffReasons.push(
      `TL-S01: ${hotRuns.length} run(s) at or above the lab's sign-off temperature of ${fmt(t.signOffTemperatureC, 1)} °C (highest ${fmt(hottest, 1)} °C).`,
    );
  }
  if (pyrophoricNames.size > 0) {
    signOffReasons.push(`TL-S02: ${SIGN_OFF_RULES["TL-S02"]}: ${[...pyrophoricNames].join(", ")}.`);
  }
  if (aboveBoiling.size > 0) {
    signOffReasons.push(`TL-S03: ${SIGN_OFF_RULES["TL-S03"]} (${aboveBoiling.size} run(s)).`);
  }
  return {
    cautions,
    signOffRequired: signOffReasons.length > 0,
    signOffReasons,
    releasable: !cautions.some((c) => c.severity === "blocking"),
    perRun,
    notice: PLANNING_NOTICE,
  };
}
