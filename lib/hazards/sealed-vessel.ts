/**
 * Pressure in a sealed vessel heated (or cooled) from its seal temperature, by the
 * model below (an ideal-gas and Raoult's-law estimate, docs/hazards.md):
 *
 *   P(T) ≈ P_air + P_v(T) + P_gas
 *   P_air = (P_seal − P_v(T_seal)) · (T/T_seal) · (V_head,seal / V_head,T)
 *   V_liq,T = V_liq,seal · (1 + β·(T − T_seal))      (liquid thermal expansion)
 *   P_gas = n·R·T / V_head,T,  R = 0.0831446 L·bar/(mol·K)
 *
 * P_v by Raoult's law over the solvent mixture (vapor-pressure.ts). Air is an ideal
 * gas at constant volume; gas solubility in the liquid and evaporation losses are
 * ignored (both make the estimate slightly high, the cautious side).
 */
import { AppError } from "../errors/app-error";
import { mixtureVaporPressure, type MixturePart, type MixtureVaporPressure } from "./vapor-pressure";

/** Gas constant in L·bar/(mol·K): 8.314462618 J/(mol·K) (CODATA 2018) × 0.01 L·bar/J. */
export const R_L_BAR_PER_MOL_K = 0.0831446;
const ZERO_C_IN_K = 273.15;

export interface SealedVesselConditions {
  parts: readonly MixturePart[];
  temperatureC: number;
  sealTemperatureC: number;
  sealPressureBar: number;
  vesselVolumeMl: number;
  /** Liquid volume at the seal temperature (mL). */
  liquidVolumeMl: number;
  gasReleasedMmol: number;
}

export interface SealedVesselEstimate {
  /** Total pressure, bar absolute; null when the expanded liquid fills the vessel. */
  totalBar: number | null;
  vaporBar: number;
  airBar: number | null;
  gasBar: number | null;
  /** Liquid fraction of the vessel volume at the seal and at the run temperature. */
  fillFractionSeal: number;
  fillFractionHot: number;
  liquidVolumeHotMl: number;
  headspaceHotMl: number;
  /** Volume-weighted mean expansion coefficient used (1/K). */
  expansionPerK: number;
  vapor: MixtureVaporPressure;
  sealVaporBar: number;
  /** True when the liquid, expanded, would fill the vessel (hydraulic rupture risk). */
  liquidFull: boolean;
}

/**
 * Estimates the pressure in a sealed vessel (see the module comment).
 * Example: THF, 2 mL in 4 mL, sealed at 25 °C and 1 atm, heated to 120 °C → ≈ 5.6 bar.
 * @throws AppError invalid_input (paths `temperatureC`, `sealTemperatureC`) when a
 * temperature is below absolute zero or above a solvent's critical temperature.
 */
export function estimateSealedVessel(c: SealedVesselConditions): SealedVesselEstimate {
  const t = c.temperatureC + ZERO_C_IN_K;
  const tSeal = c.sealTemperatureC + ZERO_C_IN_K;
  if (!(t > 0)) throw AppError.field("temperatureC", "temperature must be above absolute zero (−273.15 °C)");
  if (!(tSeal > 0)) throw AppError.field("sealTemperatureC", "temperature must be above absolute zero (−273.15 °C)");
  const vapor = mixtureVaporPressure(c.parts, t, "temperatureC");
  const sealVaporBar = mixtureVaporPressure(c.parts, tSeal, "sealTemperatureC").bar;
  const beta = c.parts.reduce((s, p) => s + p.volumeFraction * p.record.thermalExpansionPerK.value, 0);
  const liquidHot = c.liquidVolumeMl * (1 + beta * (t - tSeal));
  const headSeal = c.vesselVolumeMl - c.liquidVolumeMl;
  const headHot = c.vesselVolumeMl - liquidHot;
  const fillFractionSeal = c.liquidVolumeMl / c.vesselVolumeMl;
  const fillFractionHot = liquidHot / c.vesselVolumeMl;
  const liquidFull = headHot <= 0 || headSeal <= 0;
  let airBar: number | null = null;
  let gasBar: number | null = null;
  let totalBar: number | null = null;
  if (!liquidFull) {
    // Air partial pressure at the seal; zero if the solvent alone exceeded P_seal.
    const airSeal = Math.max(0, c.sealPressureBar - sealVaporBar);
    airBar = airSeal * (t / tSeal) * (headSeal / headHot);
    gasBar = (c.gasReleasedMmol * R_L_BAR_PER_MOL_K * t) / headHot;
    totalBar = airBar + vapor.bar + gasBar;
  }
  return {
    totalBar,
    vaporBar: vapor.bar,
    airBar,
    gasBar,
    fillFractionSeal,
    fillFractionHot,
    liquidVolumeHotMl: liquidHot,
    headspaceHotMl: headHot,
    expansionPerK: beta,
    vapor,
    sealVaporBar,
    liquidFull,
  };
}
