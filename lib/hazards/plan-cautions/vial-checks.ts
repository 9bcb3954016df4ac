/**
 * The rules about one vial's conditions: the equipment's temperature range (TL-T01,
 * TL-T02), and the solvent system's pressure, fill and fire rules (TL-V01–V05, TL-F01,
 * TL-F02; run-checks.ts) for the run's temperature, volume and released gas.
 */
import type { z } from "zod";
import { AppError } from "../../errors/app-error";
import { fireFirings, fmt, pressureFirings, type Firing } from "../run-checks";
import { estimateSealedVessel } from "../sealed-vessel";
import { FRACTION_SUM_TOLERANCE, resolveSolventSystem, type solventShareSchema } from "../solvent-system";
import type { SolventCatalogue } from "../solvents";
import type { Equipment, LabThresholds } from "../thresholds";
import type { MixturePart } from "../vapor-pressure";
import type { CautionSettings, PlanRun } from "./schema";

/** TL-T01 above the heating block's maximum, TL-T02 below the cooling method's minimum. */
export function equipmentFirings(temperatureC: number, equipment: Equipment): Firing[] {
  const T = temperatureC;
  const out: Firing[] = [];
  if (T > equipment.blockMaxC) {
    out.push({ code: "TL-T01", severity: "warning", score: T, message: () => `${fmt(T, 1)} °C is above the heating block's maximum of ${fmt(equipment.blockMaxC, 1)} °C.` });
  }
  if (T < equipment.coolingMinC) {
    out.push({ code: "TL-T02", severity: "warning", score: -T, message: () => `${fmt(T, 1)} °C is below the cooling method's minimum of ${fmt(equipment.coolingMinC, 1)} °C.` });
  }
  return out;
}

export interface VialResult {
  parts: MixturePart[] | null;
  firings: Firing[];
  totalBar: number | null;
  vaporBar: number | null;
  fillFractionHot: number | null;
}

/** The key under which vials with the same conditions share one result. */
export function vialKey(run: PlanRun): string {
  let key = `${run.temperatureC}/${run.liquidVolumeMl}/${run.gasReleasedMmol ?? 0}`;
  for (const x of run.solvents) key += `\u0001${x.name}\u0002${x.volumeFraction}`;
  return key;
}

/** Pressure, fill and fire rules for one vial's conditions (see run-checks.ts). */
export function evaluateVial(catalogue: SolventCatalogue, run: PlanRun, solventsPath: string, p: CautionSettings, t: LabThresholds): VialResult {
  const T = run.temperatureC;
  const firings: Firing[] = [];
  const parts = solventParts(catalogue, run.solvents, solventsPath, p.vessel.sealed, firings);
  const out: VialResult = { parts, firings, totalBar: null, vaporBar: null, fillFractionHot: null };
  if (!parts) return out;
  try {
    const est = estimateSealedVessel({
      parts,
      temperatureC: T,
      sealTemperatureC: p.sealTemperatureC,
      sealPressureBar: p.sealPressureBar,
      vesselVolumeMl: p.vessel.totalVolumeMl,
      liquidVolumeMl: run.liquidVolumeMl,
      gasReleasedMmol: run.gasReleasedMmol ?? 0,
    });
    out.totalBar = p.vessel.sealed ? est.totalBar : null;
    out.vaporBar = est.vaporBar;
    out.fillFractionHot = est.fillFractionHot;
    firings.push(
      ...pressureFirings(est, parts, T, {
        sealed: p.vessel.sealed,
        ratedBar: p.vessel.ratedBar,
        safetyFactor: t.safetyFactor,
        maxFillFraction: p.vessel.maxFillFraction,
      }),
    );
  } catch (error) {
    if (!(error instanceof AppError)) throw error;
    firings.push({
      code: "TL-V05",
      severity: p.vessel.sealed ? "blocking" : "warning",
      score: T,
      message: () => `The pressure at ${fmt(T, 1)} °C cannot be estimated: ${error.issues[0]?.message ?? error.message}.`,
    });
  }
  firings.push(...fireFirings(parts, T, t.autoignitionMarginC));
  return out;
}

/**
 * Resolves a run's solvents; unknown names give a TL-V05 caution (not an error: a lab
 * may not have entered its solvent yet). Fractions not summing to 1 are an input error.
 */
function solventParts(
  catalogue: SolventCatalogue,
  shares: ReadonlyArray<z.output<typeof solventShareSchema>>,
  path: string,
  sealed: boolean,
  firings: Firing[],
): MixturePart[] | null {
  if (shares.length === 0) {
    firings.push({ code: "TL-V05", severity: sealed ? "blocking" : "warning", score: 0, message: () => "No solvent is given for the vial, so its pressure and fire data cannot be checked." });
    return null;
  }
  const sum = shares.reduce((s, x) => s + x.volumeFraction, 0);
  if (Math.abs(sum - 1) > FRACTION_SUM_TOLERANCE) {
    throw AppError.field(path, `volume fractions must sum to 1 (they sum to ${sum})`);
  }
  const unknown = shares.filter((s) => !catalogue.find(s.name)).map((s) => s.name);
  if (unknown.length > 0) {
    firings.push({
      code: "TL-V05",
      severity: sealed ? "blocking" : "warning",
      component: unknown.join(", "),
      score: 0,
      message: () => `No solvent record for ${unknown.map((u) => `"${u}"`).join(", ")}: the vial's pressure and fire data cannot be checked.`,
    });
    return null;
  }
  return resolveSolventSystem(catalogue, shares, path);
}
