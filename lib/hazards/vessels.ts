/**
 * Vessel types: volume, working-volume range, pressure rating and maximum fill.
 *
 * The defaults are from memory and common practice (docs/sources.md), not from any
 * maker's data sheet, and are all flagged
 * `confirmWithSupplier: true`: a lab must confirm the rating of the vessels it buys,
 * and can add its own types with the same schema.
 */
import { z } from "zod";

/** The fields of a vessel type without the cross-field checks (for `.extend`). */
export const vesselTypeObjectSchema = z.object({
  /** A stable identifier, e.g. "vial-4ml-screw-septum". */
  id: z.string().min(1).max(80),
  name: z.string().min(1).max(200),
  /** Total inner volume (mL); the headspace is this minus the liquid. */
  totalVolumeMl: z.number().positive().max(100000),
  /** Stated working-volume range (mL). */
  workingMinMl: z.number().min(0).max(100000),
  workingMaxMl: z.number().positive().max(100000),
  /** Pressure rating, bar absolute. */
  ratedBar: z.number().positive().max(1000),
  /** Largest fraction of the total volume the liquid may fill, at any temperature of the run. */
  maxFillFraction: z.number().gt(0).max(1),
  /** A closed vessel in which pressure builds; false for vented vessels. */
  sealed: z.boolean(),
  /** True when the values are defaults the lab has not confirmed with its supplier. */
  confirmWithSupplier: z.boolean(),
  /** Where the values come from. */
  source: z.string().max(500).optional(),
});

/** A vessel type, with its volumes checked against each other. */
export const vesselTypeSchema = vesselTypeObjectSchema.superRefine((v, ctx) => {
  if (v.workingMinMl > v.workingMaxMl) {
    ctx.addIssue({ code: "custom", path: ["workingMinMl"], message: "workingMinMl must not exceed workingMaxMl" });
  }
  if (v.workingMaxMl > v.totalVolumeMl) {
    ctx.addIssue({ code: "custom", path: ["workingMaxMl"], message: "workingMaxMl must not exceed totalVolumeMl" });
  }
});

export type VesselType = z.output<typeof vesselTypeSchema>;

const SCREW = "Common practice, from memory: screw-cap septum vials are not pressure-rated by their makers; treat as ≈2–3 bar absolute. Working range from the usual block formats (common practice).";

/**
 * Default vessel types (from memory / common practice). Every one
 * is flagged "confirm with your supplier".
 */
export const DEFAULT_VESSELS: readonly VesselType[] = [
  {
    id: "vial-1ml-screw-septum",
    name: "1 mL screw-cap septum vial (96-position block)",
    totalVolumeMl: 1,
    workingMinMl: 0.1,
    workingMaxMl: 0.3,
    ratedBar: 3,
    maxFillFraction: 2 / 3,
    sealed: true,
    confirmWithSupplier: true,
    source: SCREW,
  },
  {
    id: "vial-2ml-screw-septum",
    name: "2 mL screw-cap septum vial (48-position block)",
    totalVolumeMl: 2,
    workingMinMl: 0.2,
    workingMaxMl: 1,
    ratedBar: 3,
    maxFillFraction: 2 / 3,
    sealed: true,
    confirmWithSupplier: true,
    source: SCREW,
  },
  {
    id: "vial-4ml-screw-septum",
    name: "4 mL screw-cap septum vial (24-position block)",
    totalVolumeMl: 4,
    workingMinMl: 0.5,
    workingMaxMl: 2,
    ratedBar: 3,
    maxFillFraction: 2 / 3,
    sealed: true,
    confirmWithSupplier: true,
    source: SCREW,
  },
  {
    id: "vial-8ml-screw-septum",
    name: "8 mL screw-cap septum vial (24-position block)",
    totalVolumeMl: 8,
    workingMinMl: 1,
    workingMaxMl: 4,
    ratedBar: 3,
    maxFillFraction: 2 / 3,
    sealed: true,
    confirmWithSupplier: true,
    source: SCREW,
  },
  {
    id: "vial-microwave-crimp-2-5ml",
    name: "Crimp-cap microwave vial, 2–5 mL working volume",
    totalVolumeMl: 10,
    workingMinMl: 2,
    workingMaxMl: 5,
    ratedBar: 20,
    maxFillFraction: 2 / 3,
    sealed: true,
    confirmWithSupplier: true,
    source:
      "From memory: crimp-cap microwave vials are typically rated 20 bar (some 30); stay inside the stated working volume. Total volume 10 mL from memory.",
  },
  {
    id: "tube-15ml-pressure-ptfe",
    name: "15 mL heavy-wall pressure tube, threaded PTFE plug (≤120 °C)",
    totalVolumeMl: 15,
    workingMinMl: 1,
    workingMaxMl: 7.5,
    ratedBar: 4,
    maxFillFraction: 2 / 3,
    sealed: true,
    confirmWithSupplier: true,
    source:
      "From memory: heavy-wall pressure tubes are typically rated 4–10 bar at ≤120 °C; the lower end is taken. Fill ≤ ½–⅔ (common practice).",
  },
  {
    id: "flask-25ml-vented",
    name: "25 mL round-bottom flask vented to an inert-gas line (not sealed)",
    totalVolumeMl: 25,
    workingMinMl: 2,
    workingMaxMl: 12.5,
    ratedBar: 1.5,
    maxFillFraction: 0.5,
    sealed: false,
    confirmWithSupplier: true,
    source: "Common practice: a flask no more than half full; vented, so no pressure builds (rating not used).",
  },
];

/** Finds a default vessel by id, or undefined. */
export function findDefaultVessel(id: string): VesselType | undefined {
  return DEFAULT_VESSELS.find((v) => v.id === id);
}
