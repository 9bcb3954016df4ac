/**
 * Saturation line of water by IAPWS-IF97 region 4 (the International Association for
 * the Properties of Water and Steam, Revised Release on the IAPWS Industrial Formulation
 * 1997, equations 29–31), valid 273.15 K ≤ T ≤ 647.096 K.
 */

const N = [
  0.11670521452767e4, -0.72421316703206e6, -0.17073846940092e2, 0.12020824702470e5, -0.32325550322333e7,
  0.14915108613530e2, -0.48232657361591e4, 0.40511340542057e6, -0.23855557567849, 0.65017534844798e3,
] as const;
const [n1, n2, n3, n4, n5, n6, n7, n8, n9, n10] = N;

/** Lowest and highest temperature of the region-4 equations (K): the triple and critical points. */
export const IF97_TMIN_K = 273.15;
export const IF97_TMAX_K = 647.096;

/**
 * Saturation pressure of water (bar) at `temperatureK`, IAPWS-IF97 eq. 30.
 * Outside 273.15–647.096 K the value is an extrapolation (callers flag it).
 * Example: `if97SaturationPressureBar(373.15)` ≈ 1.01418.
 */
export function if97SaturationPressureBar(temperatureK: number): number {
  const theta = temperatureK + n9 / (temperatureK - n10);
  const a = theta * theta + n1 * theta + n2;
  const b = n3 * theta * theta + n4 * theta + n5;
  const c = n6 * theta * theta + n7 * theta + n8;
  const pMPa = Math.pow((2 * c) / (-b + Math.sqrt(b * b - 4 * a * c)), 4);
  return pMPa * 10;
}

/**
 * Saturation temperature of water (K) at `pressureBar`, IAPWS-IF97 eq. 31 (the backward
 * equation), valid 611.213 Pa to 22.064 MPa. Example: `if97SaturationTemperatureK(1.01325)` ≈ 373.124.
 */
export function if97SaturationTemperatureK(pressureBar: number): number {
  const beta = Math.pow(pressureBar / 10, 0.25);
  const e = beta * beta + n3 * beta + n6;
  const f = n1 * beta * beta + n4 * beta + n7;
  const g = n2 * beta * beta + n5 * beta + n8;
  const d = (2 * g) / (-f - Math.sqrt(f * f - 4 * e * g));
  return (n10 + d - Math.sqrt((n10 + d) * (n10 + d) - 4 * (n9 + n10 * d))) / 2;
}
