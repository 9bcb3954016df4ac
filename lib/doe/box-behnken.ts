/**
 * Box–Behnken designs (Box & Behnken, "Some new three level designs for the study of
 * quantitative variables", Technometrics 2, 1960) for 3 to 7 factors: a 2² (or 2³)
 * factorial on each block of an incomplete block arrangement of the factors, the
 * other factors held at 0.
 */
import { AppError } from "../errors/app-error";
import { fullFactorialCoded } from "./factorial";

/**
 * The factor blocks of Box & Behnken's designs (0-based factor indices): all pairs for
 * k = 3, 4, 5; the six triples of their 6-factor design; the seven triples of the
 * balanced incomplete block design for 7 factors.
 */
export function boxBehnkenBlocks(k: number): number[][] {
  if (k >= 3 && k <= 5) {
    const pairs: number[][] = [];
    for (let i = 0; i < k; i++) for (let j = i + 1; j < k; j++) pairs.push([i, j]);
    return pairs;
  }
  if (k === 6) return [[0, 1, 3], [1, 2, 4], [2, 3, 5], [0, 3, 4], [1, 4, 5], [0, 2, 5]];
  if (k === 7) return [[3, 4, 5], [0, 5, 6], [1, 4, 6], [0, 1, 3], [2, 3, 6], [0, 2, 4], [1, 2, 5]];
  throw AppError.field("factors", "a Box–Behnken design needs 3 to 7 factors");
}

/**
 * The non-centre runs of a Box–Behnken design in standard order: block by block, the
 * factorial on the block's factors in Yates order. Run counts 12, 24, 40, 48, 56 for
 * k = 3…7. Throws an invalid-input AppError for other k.
 */
export function boxBehnkenCoded(k: number): number[][] {
  const rows: number[][] = [];
  for (const block of boxBehnkenBlocks(k)) {
    for (const f of fullFactorialCoded(block.length)) {
      const row = new Array<number>(k).fill(0);
      block.forEach((fi, j) => (row[fi] = f[j]!));
      rows.push(row);
    }
  }
  return rows;
}
