/**
 * Two-level full factorial designs in Yates (standard) order: the first factor
 * changes fastest (Montgomery, Design and Analysis of Experiments, §6.3, "standard
 * order"). Coded levels are −1 and +1.
 */
import { AppError } from "../errors/app-error";

/** The largest number of factors for a full two-level factorial. */
export const MAX_FULL_FACTORIAL_FACTORS = 10;

/**
 * The 2^k runs of a full two-level factorial in Yates order: run r (0-based) has
 * factor i at +1 when bit i of r is set. Throws an invalid-input AppError for
 * k < 1 or k > maxFactors.
 * Example: fullFactorialCoded(2) → [[-1,-1],[1,-1],[-1,1],[1,1]]
 */
export function fullFactorialCoded(k: number, maxFactors = MAX_FULL_FACTORIAL_FACTORS): number[][] {
  if (!Number.isInteger(k) || k < 1 || k > maxFactors) {
    throw AppError.field("factors", `a full factorial needs between 1 and ${maxFactors} factors`);
  }
  const n = 2 ** k;
  const rows: number[][] = new Array(n);
  for (let r = 0; r < n; r++) {
    const row = new Array<number>(k);
    for (let i = 0; i < k; i++) row[i] = (r >> i) & 1 ? 1 : -1;
    rows[r] = row;
  }
  return rows;
}

/** The number of set bits of a word (the length of an interaction). */
export function wordLength(mask: number): number {
  let c = 0;
  let m = mask;
  while (m) {
    m &= m - 1;
    c++;
  }
  return c;
}

/** The ±1 value of the interaction `mask` (product of the columns in it) on one coded row. */
export function interactionSign(row: readonly number[], mask: number): number {
  let s = 1;
  for (let i = 0; i < row.length; i++) if ((mask >> i) & 1) s *= row[i]! < 0 ? -1 : 1;
  return s;
}
