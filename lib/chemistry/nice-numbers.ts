/**
 * Rounding to numbers a chemist can make up and read: two significant figures from the
 * series 1, 1.2, 1.5, 2, 2.5, 3, 4, 5, 6, 8 (× 10ⁿ), rounded down for concentrations
 * (so volumes only grow) and up for volumes to prepare (so there is never too little).
 */
const SERIES = [1, 1.2, 1.5, 2, 2.5, 3, 4, 5, 6, 8, 10];

/** The largest series value ≤ x (x > 0); returns x itself for non-finite or non-positive x. */
export function niceDown(x: number): number {
  if (!(x > 0) || !Number.isFinite(x)) return x;
  const p = Math.pow(10, Math.floor(Math.log10(x)));
  const m = x / p;
  let best = 1;
  for (const s of SERIES) if (s <= m * (1 + 1e-12)) best = s;
  return Number((best * p).toPrecision(12));
}

/** The smallest value ≥ x on a grid of two significant figures (x > 0). */
export function roundUp2(x: number): number {
  if (!(x > 0) || !Number.isFinite(x)) return x;
  const p = Math.pow(10, Math.floor(Math.log10(x)) - 1);
  return Number((Math.ceil(x / p - 1e-9) * p).toPrecision(12));
}
