/**
 * A lab's hazard thresholds and its equipment limits: the settings the safety officer
 * edits (every change audited by the app). Every field has a default, so
 * `labThresholdsSchema.parse({})` gives a complete, usable set. Sources of the defaults
 * (docs/sources.md lists them all):
 * - safety factor 0.5 of the vessel rating: keep the estimated pressure at or below
 *   about half the rating (common practice, no published source);
 * - peroxide test intervals after opening: class A 3 months, class B 12 months,
 *   unopened 18 months or the expiry date (Prudent Practices in the Laboratory, National
 *   Research Council, 2011, chapter 4); classes C and D have no fixed interval there:
 *   12 months is Tareline's common-practice default;
 * - second-person volume 10 mL: syringe transfers of pyrophoric reagents up to about
 *   10–20 mL, larger ones by cannula (common practice);
 * - sign-off temperature, autoignition margin and the block/cooling limits are
 *   Tareline's own conservative defaults (common practice: aluminium heating blocks
 *   150 °C routine; dry ice/acetone −78 °C); the lab must set its own.
 */
import { z } from "zod";

const months = () => z.number().int("a whole number of calendar months").min(1).max(120);

/** Peroxide test/discard intervals in whole calendar months, per peroxide-former class. */
export const peroxideIntervalsSchema = z
  .object({
    /** Class A: explosive peroxides without concentration — 3 months after opening (Prudent Practices, 2011). */
    A: months().default(3),
    /** Class B: hazardous on concentration — 12 months after opening (Prudent Practices, 2011). */
    B: months().default(12),
    /** Class C: peroxide-initiated polymerisation — 12 months (Tareline default, common practice). */
    C: months().default(12),
    /** Class D: may form peroxides — 12 months (Tareline default, common practice). */
    D: months().default(12),
    /** Unopened containers of any class: 18 months or the expiry date (Prudent Practices, 2011). */
    unopened: months().default(18),
  })
  .prefault({});

/** The peroxide test intervals, fully defaulted. */
export type PeroxideIntervals = z.output<typeof peroxideIntervalsSchema>;

export const labThresholdsSchema = z
  .object({
    /** Allowed estimated pressure as a fraction of the vessel's rating (0.5 = half the rating). */
    safetyFactor: z.number().gt(0).max(1).default(0.5),
    /** Any run at or above this temperature needs a safety officer's sign-off (°C). */
    signOffTemperatureC: z.number().min(-273.15).max(1000).default(120),
    /**
     * Above this total volume of one pyrophoric or water-reactive reagent in a plan (mL,
     * summed over all vials) a second trained person must be present.
     */
    pyrophoricSecondPersonVolumeMl: z.number().min(0).max(10000).default(10),
    /** Peroxide test interval by class (months). */
    peroxideTestIntervalMonths: peroxideIntervalsSchema,
    /** Block release when a run comes within this many kelvin of a solvent's autoignition temperature. */
    autoignitionMarginC: z.number().min(0).max(500).default(50),
  })
  .prefault({});

/** A lab's thresholds, fully defaulted. */
export type LabThresholds = z.output<typeof labThresholdsSchema>;
/** What a caller may send: every field optional. */
export type LabThresholdsInput = z.input<typeof labThresholdsSchema>;

/** The defaults, for display and for callers that have no lab settings yet. */
export const DEFAULT_LAB_THRESHOLDS: LabThresholds = labThresholdsSchema.parse({});

/** Limits of the lab's heating block and cooling method (°C). */
export const equipmentSchema = z
  .object({
    /** Highest set point of the heating block (common practice: aluminium blocks 150 °C routine). */
    blockMaxC: z.number().min(-273.15).max(1000).default(150),
    /** Lowest temperature the cooling method reaches (dry ice/acetone, −78 °C). */
    coolingMinC: z.number().min(-273.15).max(1000).default(-78),
  })
  .refine((e) => e.coolingMinC < e.blockMaxC, {
    message: "coolingMinC must be below blockMaxC",
    path: ["coolingMinC"],
  })
  .prefault({});

export type Equipment = z.output<typeof equipmentSchema>;

/** The default equipment limits. */
export const DEFAULT_EQUIPMENT: Equipment = equipmentSchema.parse({});

/** Positions of a heating or cooling block: the usual formats of 24, 48 or 96 vials (common practice). */
export const BLOCK_POSITIONS = [24, 48, 96] as const;

/** The block a plan runs on (its temperature limits are the plan's `equipment`). */
export const blockSchema = z.object({
  /** The lab's identifier of the block, e.g. "block-al-24". */
  id: z.string().min(1).max(80),
  name: z.string().min(1).max(200),
  /** Positions of the block: the vial map's grid. */
  positions: z.union([z.literal(24), z.literal(48), z.literal(96)], { message: "must be 24, 48 or 96" }),
});

export type Block = z.output<typeof blockSchema>;
