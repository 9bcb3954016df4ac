/**
 * Study A's results in the demo scenario (PRODUCT.md "Demo scenario"): INVENTED numbers, not
 * measurements — each a stated model in the plan's coded units plus a fixed scatter by run
 * number, so the analyses show what the scenario tells.
 *
 * - The screen (2^(5−1), 18 runs): temperature, base and Pd loading matter, with a
 *   temperature × Pd interaction; boronic acid and water fraction hardly do; the centre runs
 *   sit a little above the corners' mean (some curvature: the reason for the Box–Behnken plan).
 *   Homocoupling rises with temperature and Pd.
 * - The Box–Behnken plan (15 runs on temperature 80–110 °C, base and Pd): a curved surface
 *   with its maximum inside the cube, near 101 °C, 2.5 equiv base and 1.55 mol % Pd.
 */

/** Scatter added to each run by run number (standard order), in % yield; invented. */
const SCATTER = [0.6, -0.9, 0.3, 1.1, -0.4, -1.2, 0.8, 0.1, -0.7, 0.9, -0.2, 0.5, -1.0, 0.4, 0.0, -0.6, 0.7, -0.3];
const scatter = (run: number) => SCATTER[(run - 1) % SCATTER.length]!;
const round1 = (v: number) => Math.round(v * 10) / 10;
const round2 = (v: number) => Math.round(v * 100) / 100;

/** The screen's assay yield (%) and homocoupling (area %) at a run (coded values by factor name). */
export function screenResult(run: number, c: Record<string, number>): { yield: number; homocoupling: number } {
  const T = c.temperature!;
  const base = c.baseEquiv!;
  const boron = c.boronicEquiv!;
  const pd = c.pdLoading!;
  const water = c.waterFraction!;
  const centre = [T, base, boron, pd, water].every((v) => v === 0) ? 2.5 : 0;
  const y = 62 + 9 * T + 4 * base + 5 * pd + 0.15 * boron - 0.1 * water + 2.5 * T * pd + centre + scatter(run);
  const h = 1.1 + 0.35 * T + 0.2 * pd - 0.05 * boron + 0.04 * scatter(run);
  return { yield: round1(y), homocoupling: round2(h) };
}

/** The Box–Behnken plan's assay yield (%) and homocoupling (area %) at a run. */
export function boxBehnkenResult(run: number, c: Record<string, number>): { yield: number; homocoupling: number } {
  const T = c.temperature!;
  const base = c.baseEquiv!;
  const pd = c.pdLoading!;
  const y = 84 + 3 * T + 1.5 * base + 2 * pd - 4 * T * T - 2.5 * base * base - 3 * pd * pd + T * pd + 0.5 * scatter(run);
  const h = 1.0 + 0.3 * T + 0.2 * pd + 0.15 * T * T + 0.03 * scatter(run);
  return { yield: round1(y), homocoupling: round2(h) };
}
