/**
 * Vapour pressure of a pure solvent and of an ideal solvent mixture.
 *
 * Methods, in order of preference (sources in docs/sources.md):
 * 1. water: IAPWS-IF97 region-4 saturation line;
 * 2. DIPPR equation 101 (Perry's Handbook, 8th ed., Table 2-8) inside its range;
 * 3. Antoine, NIST form, inside its range;
 * 4. otherwise the first available correlation outside its range (flagged inRange: false);
 * 5. no correlation: Clausius–Clapeyron from the normal boiling point with Trouton's
 *    rule ΔHvap ≈ 88 J/(mol·K) × Tb — an estimate, never for water or alcohols.
 * Mixtures: Raoult's law, P = Σ x_i·P_i(T), mole fractions from volume fractions via
 * density and molar mass (ideal mixing).
 */
import { AppError } from "../errors/app-error";
import { IF97_TMAX_K, IF97_TMIN_K, if97SaturationPressureBar } from "./iapws-if97";
import type { SolventRecord, SolventRecordInput, SourceTag } from "./solvent-record";
import { solventCatalogue } from "./solvents";

export type VaporMethod = "DIPPR-101" | "Antoine" | "IAPWS-IF97" | "estimate";

/** Standard atmosphere (bar). */
export const ATM_BAR = 1.01325;
/** Molar gas constant (J/(mol·K)), CODATA. */
export const R_J_PER_MOL_K = 8.314462618;
/** Trouton's rule constant (J/(mol·K)): ΔSvap ≈ 88 J/(mol·K) at the normal boiling point (Trouton, 1884; e.g. Atkins' Physical Chemistry). */
export const TROUTON_J_PER_MOL_K = 88;
const ZERO_C_IN_K = 273.15;

export interface VaporPressureResult {
  /** Vapour pressure, bar absolute. */
  bar: number;
  method: VaporMethod;
  /** Where the parameters come from. */
  source: string;
  tag: SourceTag;
  /** False when the correlation is used outside its stated range, or for an estimate. */
  inRange: boolean;
  /** Stated valid range of the correlation (K); null for an estimate or an unknown range. */
  validRangeK: [number, number] | null;
  /** The solvent's record name. */
  solvent: string;
}

interface Candidate {
  method: Exclude<VaporMethod, "estimate">;
  range: [number, number] | null;
  source: string;
  tag: SourceTag;
  bar: (t: number) => number;
}

const candidateCache = new WeakMap<SolventRecord, Candidate[]>();

/** A record's correlations in order of preference (built once per record). */
function candidates(r: SolventRecord): Candidate[] {
  let out = candidateCache.get(r);
  if (!out) {
    out = buildCandidates(r);
    candidateCache.set(r, out);
  }
  return out;
}

const inRangeOf = (c: Candidate, t: number): boolean => c.range !== null && t >= c.range[0] && t <= c.range[1];

function buildCandidates(r: SolventRecord): Candidate[] {
  const out: Candidate[] = [];
  if (r.iapwsIf97) {
    out.push({
      method: "IAPWS-IF97",
      range: [IF97_TMIN_K, IF97_TMAX_K],
      source: "IAPWS-IF97 region 4 saturation equation (eq. 30)",
      tag: "C",
      bar: if97SaturationPressureBar,
    });
  }
  const d = r.dippr101;
  if (d) {
    out.push({
      method: "DIPPR-101",
      range: [d.tminK, d.tmaxK],
      source: d.source,
      tag: d.tag,
      bar: (x) => Math.exp(d.c1 + d.c2 / x + d.c3 * Math.log(x) + d.c4 * Math.pow(x, d.c5)) / 1e5,
    });
  }
  const a = r.antoine;
  if (a) {
    const known = a.tminK !== null && a.tmaxK !== null;
    out.push({
      method: "Antoine",
      range: known ? [a.tminK ?? 0, a.tmaxK ?? 0] : null,
      source: a.source,
      tag: a.tag,
      bar: (x) => Math.pow(10, a.a - a.b / (x + a.c)),
    });
  }
  return out;
}

/**
 * The temperature (K) above which a solvent has no vapour pressure: its critical
 * temperature, else the upper limit of its correlations, else Guldberg's rule
 * Tc ≈ 1.5·Tb (an estimate).
 */
export function criticalTemperatureK(r: SolventRecord): number {
  if (r.criticalTemperatureK) return r.criticalTemperatureK.value;
  if (r.iapwsIf97) return IF97_TMAX_K;
  if (r.dippr101) return r.dippr101.tmaxK;
  return 1.5 * (r.normalBoilingPointC.value + ZERO_C_IN_K);
}

/**
 * Vapour pressure (bar) of the pure solvent `r` at `temperatureK`, by the preferred
 * method (see the module comment); the result states method, source and range.
 * @throws AppError invalid_input at `path` when the temperature is not above absolute
 * zero, is above the solvent's critical temperature, or when the solvent has no
 * correlation and Trouton's rule does not apply (a protic, hydrogen-bonded liquid).
 */
export function solventVaporPressure(r: SolventRecord, temperatureK: number, path = "temperatureC"): VaporPressureResult {
  if (!Number.isFinite(temperatureK) || temperatureK <= 0) {
    throw AppError.field(path, "temperature must be above absolute zero (−273.15 °C)");
  }
  const tc = criticalTemperatureK(r);
  if (temperatureK > tc) {
    throw AppError.field(
      path,
      `${(temperatureK - ZERO_C_IN_K).toFixed(1)} °C is above the critical temperature of ${r.name} (${(tc - ZERO_C_IN_K).toFixed(1)} °C): no vapour pressure exists there`,
    );
  }
  const list = candidates(r);
  const chosen = list.find((c) => inRangeOf(c, temperatureK)) ?? list[0];
  if (chosen) {
    return {
      bar: chosen.bar(temperatureK),
      method: chosen.method,
      source: chosen.source,
      tag: chosen.tag,
      inRange: inRangeOf(chosen, temperatureK),
      validRangeK: chosen.range,
      solvent: r.name,
    };
  }
  if (r.protic || r.aqueous) {
    throw AppError.field(
      path,
      `${r.name} has no vapour-pressure correlation, and Trouton's rule does not hold for hydrogen-bonded liquids; add DIPPR-101 or Antoine parameters to its record`,
    );
  }
  return {
    bar: troutonEstimateBar(r.normalBoilingPointC.value + ZERO_C_IN_K, temperatureK),
    method: "estimate",
    source: `Clausius–Clapeyron with Trouton's rule (ΔHvap ≈ 88 J/(mol·K) × Tb) from the normal boiling point ${r.normalBoilingPointC.value} °C (${r.normalBoilingPointC.source}); an estimate`,
    tag: "C",
    inRange: false,
    validRangeK: null,
    solvent: r.name,
  };
}

/**
 * Clausius–Clapeyron estimate (bar): ln(P/1 atm) = (ΔHvap/R)·(1/Tb − 1/T) with
 * Trouton's rule ΔHvap = 88 J/(mol·K)·Tb. Example: Tb 339.15 K, T 393.15 K → ≈ 4.34 bar.
 */
export function troutonEstimateBar(boilingPointK: number, temperatureK: number): number {
  const dH = TROUTON_J_PER_MOL_K * boilingPointK;
  return ATM_BAR * Math.exp((dH / R_J_PER_MOL_K) * (1 / boilingPointK - 1 / temperatureK));
}

/**
 * The temperature (°C) at which the solvent's vapour pressure equals `pressureBar`
 * (default 1 atm: the computed normal boiling point), by bisection on the method
 * `solventVaporPressure` would use. @throws AppError if the pressure is not reached below
 * the critical temperature.
 */
export function boilingPointC(r: SolventRecord, pressureBar = ATM_BAR): number {
  let lo = 100;
  let hi = criticalTemperatureK(r);
  if (solventVaporPressure(r, hi).bar < pressureBar) {
    throw AppError.field("pressureBar", `${r.name} does not reach ${pressureBar} bar below its critical temperature`);
  }
  for (let i = 0; i < 200 && hi - lo > 1e-9; i++) {
    const mid = (lo + hi) / 2;
    if (solventVaporPressure(r, mid).bar < pressureBar) lo = mid;
    else hi = mid;
  }
  return (lo + hi) / 2 - ZERO_C_IN_K;
}

/** One solvent of a mixture, by volume fraction of the liquid at the seal temperature. */
export interface MixturePart {
  record: SolventRecord;
  volumeFraction: number;
}

export interface MixtureVaporPressure {
  /** Total vapour pressure by Raoult's law (bar). */
  bar: number;
  /** True when every component's correlation is inside its range. */
  inRange: boolean;
  parts: Array<{
    solvent: string;
    volumeFraction: number;
    moleFraction: number;
    pureBar: number;
    partialBar: number;
    method: VaporMethod;
    source: string;
    inRange: boolean;
  }>;
}

/**
 * Mole fractions from volume fractions: n_i ∝ φ_i·ρ_i / M_i (ideal volumes, densities
 * near 20 °C).
 */
export function moleFractions(parts: readonly MixturePart[]): number[] {
  const moles = parts.map((p) => (p.volumeFraction * p.record.densityGPerMl.value) / p.record.molarMassGPerMol.value);
  const total = moles.reduce((s, m) => s + m, 0);
  return moles.map((m) => (total > 0 ? m / total : 0));
}

/**
 * Vapour pressure of an ideal mixture by Raoult's law, P = Σ x_i·P_i°(T).
 * @throws AppError as `solventVaporPressure` does, with the path of the failing part
 * (`${path}.i.name` for an unusable solvent, `temperaturePath` for the temperature).
 */
export function mixtureVaporPressure(
  parts: readonly MixturePart[],
  temperatureK: number,
  temperaturePath = "temperatureC",
): MixtureVaporPressure {
  const x = moleFractions(parts);
  let bar = 0;
  let inRange = true;
  const out: MixtureVaporPressure["parts"] = [];
  parts.forEach((p, i) => {
    const xi = x[i] ?? 0;
    const pure = solventVaporPressure(p.record, temperatureK, temperaturePath);
    const partial = xi * pure.bar;
    bar += partial;
    if (xi > 0 && !pure.inRange) inRange = false;
    out.push({
      solvent: p.record.name,
      volumeFraction: p.volumeFraction,
      moleFraction: xi,
      pureBar: pure.bar,
      partialBar: partial,
      method: pure.method,
      source: pure.source,
      inRange: pure.inRange,
    });
  });
  return { bar, inRange, parts: out };
}

/**
 * Vapour pressure (bar) of a solvent given by name, synonym or CAS number at
 * `temperatureC`, looked up among the built-in records and `labSolvents` (a lab's own
 * records, validated with `solventRecordSchema`). Method as in `solventVaporPressure`.
 * Example: `vaporPressure("THF", 120).bar` ≈ 4.437 (DIPPR-101, Perry's).
 * @throws AppError invalid_input at `solvent` (unknown name), `temperatureC` (below
 * absolute zero, above the critical temperature) or `labSolvents.…` (a bad record).
 */
export function vaporPressure(
  solvent: string,
  temperatureC: number,
  labSolvents?: readonly SolventRecordInput[],
): VaporPressureResult {
  const record = solventCatalogue(labSolvents).resolve(solvent, "solvent");
  if (!Number.isFinite(temperatureC) || temperatureC <= -ZERO_C_IN_K) {
    throw AppError.field("temperatureC", "temperature must be above absolute zero (−273.15 °C)");
  }
  return solventVaporPressure(record, temperatureC + ZERO_C_IN_K, "temperatureC");
}
