/**
 * Central composite designs (Box & Wilson 1951; NIST/SEMATECH e-Handbook of
 * Statistical Methods §5.3.3.6.1): a two-level factorial (or fraction), 2k axial
 * points at ±α on each axis, and centre points.
 */
import { AppError } from "../errors/app-error";

/** How α is chosen: by name, or a positive number. */
export type AlphaChoice = "rotatable" | "spherical" | "face-centered" | number;

/**
 * The axial distance α: rotatable α = F^(1/4) with F the number of factorial points
 * (NIST/SEMATECH §5.3.3.6.1), spherical α = √k, face-centred α = 1, or the number
 * given. Throws an invalid-input AppError (path `alpha`) for a non-positive number.
 * Example: ccdAlpha("rotatable", 2, 4) ≈ 1.41421
 */
export function ccdAlpha(choice: AlphaChoice, k: number, factorialPoints: number): number {
  if (typeof choice === "number") {
    if (!(choice > 0) || !Number.isFinite(choice)) throw AppError.field("alpha", "must be a positive number");
    return choice;
  }
  switch (choice) {
    case "rotatable":
      return Math.pow(factorialPoints, 0.25);
    case "spherical":
      return Math.sqrt(k);
    case "face-centered":
      return 1;
  }
}

/**
 * The 2k axial points in standard order: first factor −α, +α, then the next factor.
 */
export function axialPointsCoded(k: number, alpha: number): number[][] {
  const rows: number[][] = [];
  for (let i = 0; i < k; i++) {
    for (const s of [-1, 1]) {
      const row = new Array<number>(k).fill(0);
      row[i] = s * alpha;
      rows.push(row);
    }
  }
  return rows;
}
