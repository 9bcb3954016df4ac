/**
 * What the engines would say about a run at an arbitrary point of a plan's factor space
 * (natural values, inside or outside the studied range): the blocking cautions the
 * hazard engine would raise for it and the physical limits it leaves. The primitive
 * behind safe alternatives to a design, the safe envelope drawn on a contour grid and the
 * safe optimum.
 *
 * It runs the engines' own rules — the stoichiometry (`runConditions`,
 * `componentAmounts`), the dispensing planner (`planDispensing` for a run there alone),
 * the vessel's volume range, and the hazard engine's rules for one run (`evaluateRun`:
 * pressure over rating × safety factor, fill, autoignition, unknown solvents, pyrophoric
 * or water-reactive with an aqueous or protic partner, the equipment's temperature range)
 * — with everything that does not depend on the point prepared once: the parsed
 * document, the component facts, the hazard settings and profiles and their caches.
 */
import { AppError, parseOrThrow } from "../errors/app-error";
import { cautionContext, evaluateRun } from "../hazards/plan-cautions/run-cautions";
import type { VialResult } from "../hazards/plan-cautions/vial-checks";
import { cautionSettingsSchema, runTemperatureSchema } from "../hazards/plan-cautions/schema";
import { cautionProfiles, cautionRun, cautionSettings, type CautionRunSource } from "./caution-input";
import { dispensingContext, fitStocks, type Dispense, type RunAmounts } from "./dispensing";
import { planDocumentSchema } from "./plan-document";
import { gasReleased, vesselVolumeProblem, vesselVolumeRangeUl } from "./run-sheet";
import { componentAmounts, componentInfos, runConditions, type RunProblem } from "./stoichiometry";
import { toCanonical } from "./units";
import { resolveVessel } from "./validate-plan";
import type { PlanRun } from "../hazards/plan-cautions/schema";
import type { Firing } from "../hazards/run-checks";

/** One finding at a point: a caution code (TL-…) or a limit code, with its message. */
export interface SafetyFinding {
  code: string;
  message: string;
  component?: string;
}

export interface PointSafetyResult {
  /** The blocking cautions a run here would raise (TL-V02, TL-V03, TL-V05, TL-F02, TL-R04). */
  blocking: SafetyFinding[];
  /**
   * The physical limits the point leaves: `TL-T01`/`TL-T02` (the heating block's maximum,
   * the cooling method's minimum), `vessel_volume_above`/`vessel_volume_below` (the vial's
   * working volume or maximum fill), `stock_solubility` (a stock would be above its
   * solubility: the planner has to weigh a solid per vial, or cannot fit the stocks at
   * all), `neat_over_volume` (liquids as supplied exceed the final volume),
   * `amount_not_positive`, `fraction_out_of_range` (the recipe has no meaning there) and
   * `temperature_not_accepted` (outside what the hazard engine evaluates).
   */
  limits: SafetyFinding[];
}

function lazyFinding(f: Firing): SafetyFinding {
  return {
    code: f.code,
    get message() {
      return f.message();
    },
    ...(f.component ? { component: f.component } : {}),
  };
}

/**
 * Prepares the safety check of a plan document and returns the check of one point.
 * Example: `const at = pointSafety(doc); at({ temperature: 140, waterFraction: 0.2, … }).blocking`.
 * @throws AppError("invalid_input") for a document that does not validate (at its paths),
 *   and from the returned function for a point that lacks a factor's value.
 */
export function pointSafety(input: unknown): (natural: Readonly<Record<string, number>>) => PointSafetyResult {
  const doc = parseOrThrow(planDocumentSchema, input, "The plan document is not valid.");
  const vessel = resolveVessel(doc);
  doc.factors.forEach((f, i) => void toCanonical(f.binding.kind, f.low, f.unit, `factors.${i}.unit`));
  const infos = componentInfos(doc);
  const ctx = cautionContext(parseOrThrow(cautionSettingsSchema, cautionSettings(doc, vessel), "The plan's hazard settings are not valid."));
  const profiles = cautionProfiles(doc);
  const sources = infos.map((i) => ({ source: i.component.id }));
  const { maxUl, minUl } = vesselVolumeRangeUl(vessel);
  const tIndex = doc.factors.findIndex((f) => f.binding.kind === "temperature");
  const others = doc.factors.filter((_f, i) => i !== tIndex).map((f) => f.name);

  /**
   * Everything about a point but its temperature: the stoichiometry, the vessel's volume
   * range, the dispensing planner and the vial's contents. A grid repeats these along its
   * temperature axis, so each distinct case is computed once (exact: keyed by the values).
   */
  const recipeStage = (natural: Readonly<Record<string, number>>): RecipeCase => {
    const limits: SafetyFinding[] = [];
    const problems: RunProblem[] = [];
    const cond = runConditions(doc, natural as Record<string, number>, 1, problems);
    for (const p of problems) limits.push({ code: p.key.startsWith("nonpositive") ? "amount_not_positive" : "fraction_out_of_range", message: p.message, ...(p.component ? { component: p.component } : {}) });
    if (limits.length > 0) return { limits, run: null, fatal: true };

    const amounts = componentAmounts(infos, cond);
    const volume = vesselVolumeProblem(vessel, cond.finalVolumeUl);
    if (volume) {
      limits.push({
        code: volume === "above" ? "vessel_volume_above" : "vessel_volume_below",
        message: volume === "above" ? `${cond.finalVolumeUl} µL is above the ${maxUl} µL the ${vessel.name} may hold` : `${cond.finalVolumeUl} µL is below the vessel's working minimum of ${minUl} µL`,
      });
    }
    const runs: RunAmounts[] = [{ run: 1, cond, amounts }];
    // The dispensing planner's own steps for a run here alone, as far as they decide a
    // limit: modes and the solvent system's volume (liquids as supplied over the final
    // volume), then fitting the stocks (a stock above its solubility moves a solid to
    // per-vial weighing, or nothing fits).
    let dctx: ReturnType<typeof dispensingContext>;
    try {
      dctx = dispensingContext(doc, infos, runs);
    } catch (e) {
      if (e instanceof AppError && e.code === "infeasible") {
        limits.push({ code: "neat_over_volume", message: e.message });
        return { limits, run: null, fatal: false };
      }
      throw e;
    }
    try {
      fitStocks(dctx);
      for (const n of dctx.notes.list()) if (n.code === "solid_per_vial_solubility") limits.push({ code: "stock_solubility", message: n.message, ...(n.component ? { component: n.component } : {}) });
    } catch (e) {
      if (!(e instanceof AppError) || e.code !== "infeasible") throw e;
      limits.push({ code: "stock_solubility", message: e.message });
    }
    const mode = dctx.mode;
    const systemVolume = dctx.systemVolume[0]!;
    const dispense: Dispense[] = [];
    infos.forEach((info, ci) => {
      if (mode[ci] !== "neat") return;
      const a = amounts[ci]!;
      dispense.push({ step: 0, kind: "neat", source: info.component.id, name: info.component.name, volumeUl: a.volumeUl, massMg: a.massMg, delivers: [], solvent: null });
    });
    const source: CautionRunSource = {
      run: 1,
      temperatureC: cond.temperatureC,
      timeH: cond.timeH,
      finalVolumeUl: cond.finalVolumeUl,
      solvents: doc.recipe.solvents.map((s) => {
        const fraction = cond.solventFractions[s.name] ?? 0;
        const volumeUl = fraction * systemVolume;
        return { name: s.name, volumeFraction: fraction, volumeUl, topUpUl: volumeUl };
      }),
      dispense,
      totals: { finalVolumeUl: cond.finalVolumeUl, dispensedVolumeUl: cond.finalVolumeUl, solidMassMg: 0, gasReleasedMmol: gasReleased(infos, amounts), fillFraction: 0 },
      components: sources,
    };
    // cautionRun writes the parsed shape itself (every component with its statements, the
    // components always listed), so the per-point run skips the schema's parse.
    return { limits, run: cautionRun(doc, profiles, source, false) as PlanRun, fatal: false };
  };

  const recipeCases = new Map<string, RecipeCase>();
  const vialCache = new Map<string, VialResult>();
  const temperatureOf = (natural: Readonly<Record<string, number>>): number => {
    if (tIndex < 0) return doc.recipe.temperatureC;
    const f = doc.factors[tIndex]!;
    const raw = natural[f.name];
    if (raw === undefined) throw AppError.field(`factors.${tIndex}.name`, `run 1 has no value for factor "${f.name}"`);
    return toCanonical("temperature", raw, f.unit, `factors.${tIndex}.unit`);
  };

  return (natural) => {
    const temperatureC = temperatureOf(natural);
    let key = "";
    for (const name of others) key += `${natural[name]}|`;
    let rc = recipeCases.get(key);
    if (!rc) {
      rc = recipeStage(natural);
      if (recipeCases.size >= 4096) recipeCases.clear();
      recipeCases.set(key, rc);
    }
    const blocking: SafetyFinding[] = [];
    const limits: SafetyFinding[] = [...rc.limits];
    const t = runTemperatureSchema.safeParse(temperatureC);
    if (!t.success) limits.push({ code: "temperature_not_accepted", message: `${temperatureC} °C: ${t.error.issues[0]?.message ?? "not accepted"}` });
    if (!t.success || rc.fatal || !rc.run) return { blocking, limits };
    // Messages are written only when read (a grid of points rarely reads them).
    if (vialCache.size >= 20000) vialCache.clear();
    for (const f of evaluateRun(ctx, { ...rc.run, temperatureC }, 0, vialCache).firings) {
      if (f.severity === "blocking") blocking.push(lazyFinding(f));
      else if (f.code === "TL-T01" || f.code === "TL-T02") limits.push(lazyFinding(f));
    }
    return { blocking, limits };
  };
}

/** What a point's non-temperature values give: its limits, and the run the caution rules see (temperature set per point). */
interface RecipeCase {
  limits: SafetyFinding[];
  run: PlanRun | null;
  /** The recipe has no meaning here (a non-positive amount or a fraction out of range). */
  fatal: boolean;
}
