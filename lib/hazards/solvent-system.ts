/**
 * A solvent system as given by a caller (names and volume fractions), resolved to
 * solvent records and checked.
 */
import { z } from "zod";
import { AppError } from "../errors/app-error";
import type { SolventCatalogue } from "./solvents";
import type { MixturePart } from "./vapor-pressure";

export const solventShareSchema = z.object({
  /** Name, synonym or CAS number of a solvent record. */
  name: z.string().min(1).max(200),
  /** Fraction of the liquid volume at the seal temperature, 0–1. */
  volumeFraction: z.number().min(0).max(1),
});
export type SolventShare = z.output<typeof solventShareSchema>;

/** How far the fractions may miss 1 (rounding in a caller's arithmetic). */
export const FRACTION_SUM_TOLERANCE = 1e-6;

/**
 * Resolves each solvent and checks the system: known names, no solvent twice, volume
 * fractions summing to 1 (within 1e-6).
 * @throws AppError invalid_input at `${path}.i.name` (unknown or repeated solvent) or at
 * `path` (fractions not summing to 1, or an empty list).
 */
export function resolveSolventSystem(
  catalogue: SolventCatalogue,
  shares: readonly SolventShare[],
  path: string,
): MixturePart[] {
  if (shares.length === 0) throw AppError.field(path, "give at least one solvent");
  const seen = new Map<string, number>();
  const parts = shares.map((s, i) => {
    const record = catalogue.resolve(s.name, `${path}.${i}.name`);
    const before = seen.get(record.id);
    if (before !== undefined) {
      throw AppError.field(`${path}.${i}.name`, `"${s.name}" is the same solvent as entry ${before} (${record.name}); list it once`);
    }
    seen.set(record.id, i);
    return { record, volumeFraction: s.volumeFraction };
  });
  const sum = shares.reduce((t, s) => t + s.volumeFraction, 0);
  if (Math.abs(sum - 1) > FRACTION_SUM_TOLERANCE) {
    throw AppError.field(path, `volume fractions must sum to 1 (they sum to ${sum})`);
  }
  return parts;
}
