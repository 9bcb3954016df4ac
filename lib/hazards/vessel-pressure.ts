/**
 * The `vessel-pressure` calculation as the command line and the app call it
 * (the README's `vessel-pressure` verb): one sealed vessel, its solvent system, temperatures and
 * volumes in; the pressure parts, the hot fill fraction and the cautions out.
 */
import { z } from "zod";
import { AppError, parseOrThrow } from "../errors/app-error";
import { CAUTION_RULES, PLANNING_NOTICE, compareCautions, type Severity } from "./caution-rules";
import { fireFirings, pressureFirings } from "./run-checks";
import { estimateSealedVessel } from "./sealed-vessel";
import { solventRecordSchema } from "./solvent-record";
import { resolveSolventSystem, solventShareSchema } from "./solvent-system";
import { solventCatalogue } from "./solvents";
import { DEFAULT_LAB_THRESHOLDS } from "./thresholds";
import { ATM_BAR } from "./vapor-pressure";

const aboveAbsoluteZero = "temperature must be above absolute zero (−273.15 °C)";

export const vesselPressureInputSchema = z
  .object({
    solvents: z.array(solventShareSchema).min(1, "give at least one solvent").max(20),
    temperatureC: z.number().gt(-273.15, aboveAbsoluteZero).max(3000),
    sealTemperatureC: z.number().gt(-273.15, aboveAbsoluteZero).max(500).default(25),
    sealPressureBar: z.number().positive().max(1000).default(ATM_BAR),
    vesselVolumeMl: z.number().positive().max(100000),
    liquidVolumeMl: z.number().positive().max(100000),
    gasReleasedMmol: z.number().min(0).max(1e6).default(0),
    /** Vessel rating, bar absolute; without it there is no pressure-limit check. */
    ratedBar: z.number().positive().max(1000).optional(),
    /** Fraction of the rating allowed (default: the lab default, 0.5). */
    safetyFactor: z.number().gt(0).max(1).default(DEFAULT_LAB_THRESHOLDS.safetyFactor),
    /** Largest allowed liquid fraction of the vessel (default ⅔, common practice). */
    maxFillFraction: z.number().gt(0).max(1).default(2 / 3),
    autoignitionMarginC: z.number().min(0).max(500).default(DEFAULT_LAB_THRESHOLDS.autoignitionMarginC),
    labSolvents: z.array(solventRecordSchema).max(500).optional(),
  })
  .superRefine((v, ctx) => {
    if (v.liquidVolumeMl >= v.vesselVolumeMl) {
      ctx.addIssue({ code: "custom", path: ["liquidVolumeMl"], message: "the liquid volume must be smaller than the vessel volume" });
    }
  });

export type VesselPressureInput = z.input<typeof vesselPressureInputSchema>;

export interface VesselPressureOutput {
  totalBar: number | null;
  vaporBar: number;
  airBar: number | null;
  gasBar: number | null;
  fillFractionHot: number;
  fillFractionSeal: number;
  limitBar: number | null;
  headspaceHotMl: number;
  expansionPerK: number;
  inRange: boolean;
  components: Array<{
    solvent: string;
    volumeFraction: number;
    moleFraction: number;
    pureBar: number;
    partialBar: number;
    method: string;
    source: string;
    inRange: boolean;
  }>;
  cautions: Array<{ code: string; severity: Severity; message: string; remedy: string }>;
  notice: string;
}

/**
 * Pressure in one sealed vessel by the model of sealed-vessel.ts (Raoult vapour
 * pressure + headspace air at constant volume with liquid expansion + declared gas
 * n·R·T/V), compared with rating × safety factor; with the vessel and fire cautions.
 * @throws AppError invalid_input with paths (`solvents.0.name`, `solvents`,
 * `temperatureC`, `liquidVolumeMl`, …) for unknown solvents, fractions not summing to
 * 1, impossible temperatures or volumes.
 */
export function vesselPressure(input: unknown): VesselPressureOutput {
  const v = parseOrThrow(vesselPressureInputSchema, input);
  const catalogue = solventCatalogue(v.labSolvents);
  const parts = resolveSolventSystem(catalogue, v.solvents, "solvents");
  const est = estimateSealedVessel({
    parts,
    temperatureC: v.temperatureC,
    sealTemperatureC: v.sealTemperatureC,
    sealPressureBar: v.sealPressureBar,
    vesselVolumeMl: v.vesselVolumeMl,
    liquidVolumeMl: v.liquidVolumeMl,
    gasReleasedMmol: v.gasReleasedMmol,
  });
  const firings = [
    ...pressureFirings(est, parts, v.temperatureC, {
      sealed: true,
      ratedBar: v.ratedBar ?? null,
      safetyFactor: v.safetyFactor,
      maxFillFraction: v.maxFillFraction,
    }),
    ...fireFirings(parts, v.temperatureC, v.autoignitionMarginC),
  ];
  const cautions = firings
    .map((f) => ({ code: f.code, severity: f.severity, runs: [], message: f.message(), remedy: CAUTION_RULES[f.code].remedy, ...(f.component ? { component: f.component } : {}) }))
    .sort(compareCautions)
    .map(({ code, severity, message, remedy }) => ({ code, severity, message, remedy }));
  if (!Number.isFinite(est.vaporBar)) throw new AppError("internal", "vapour pressure is not a finite number");
  return {
    totalBar: est.totalBar,
    vaporBar: est.vaporBar,
    airBar: est.airBar,
    gasBar: est.gasBar,
    fillFractionHot: est.fillFractionHot,
    fillFractionSeal: est.fillFractionSeal,
    limitBar: v.ratedBar !== undefined ? v.ratedBar * v.safetyFactor : null,
    headspaceHotMl: est.headspaceHotMl,
    expansionPerK: est.expansionPerK,
    inRange: est.vapor.inRange,
    components: est.vapor.parts,
    cautions,
    notice: PLANNING_NOTICE,
  };
}
