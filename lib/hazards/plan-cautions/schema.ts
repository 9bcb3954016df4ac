/**
 * The hazard engine's input for a plan's cautions: the vessel, the lab's thresholds and
 * equipment, and per run its conditions and the components in the vial with their
 * hazards and container dates. The chemistry engine derives its caution input types
 * from these schemas (lib/chemistry/caution-input.ts).
 *
 * Per-run schemas keep only the checks that matter: they are parsed once per vial and
 * component (a 1536-vial plate has ~10⁴ components).
 */
import { z } from "zod";
import { hazardFlagFields } from "../hazard-flags";
import { isoDateSchema } from "../iso-date";
import { solventRecordSchema } from "../solvent-record";
import { solventShareSchema } from "../solvent-system";
import { equipmentSchema, labThresholdsSchema } from "../thresholds";
import { ATM_BAR } from "../vapor-pressure";
import { vesselTypeSchema } from "../vessels";

/** Absolute zero (°C): no run, seal or equipment temperature may reach it. */
export const ABSOLUTE_ZERO_C = -273.15;
/** The highest run temperature the engine accepts (°C). */
export const MAX_RUN_TEMPERATURE_C = 3000;

/** A run's temperature as the hazard engine accepts it: above absolute zero, at most 3000 °C. */
export const runTemperatureSchema = z
  .number()
  .gt(ABSOLUTE_ZERO_C, "temperature must be above absolute zero (−273.15 °C)")
  .max(MAX_RUN_TEMPERATURE_C, `temperature must be at most ${MAX_RUN_TEMPERATURE_C} °C`);

/** The dates of the container a component is taken from (the peroxide rules use them). */
export const containerDateFields = {
  /** Date the container was opened; null = unopened; absent = not recorded. */
  openedOn: isoDateSchema.nullable().optional(),
  /** Date of the container's last (negative) peroxide test. */
  peroxideTestedOn: isoDateSchema.nullable().optional(),
  /** Date an unopened container was received (for the lab's unopened-container interval). */
  receivedOn: isoDateSchema.nullable().optional(),
  /** The container's expiry date (an unopened peroxide former is due its test then at the latest). */
  expiresOn: isoDateSchema.nullable().optional(),
};

/** A component in one vial: its hazards, the volume dispensed and its container's dates. */
export const planComponentSchema = z.object({
  name: z.string().min(1),
  ...hazardFlagFields,
  /** Volume of this component dispensed into this vial (µL). */
  volumeUl: z.number().min(0).optional(),
  ...containerDateFields,
});

export const planRunSchema = z.object({
  /** The run's standard order. */
  run: z.number().int(),
  temperatureC: runTemperatureSchema,
  timeH: z.number().min(0).optional(),
  /** Final liquid volume in the vial (mL). */
  liquidVolumeMl: z.number().positive(),
  solvents: z.array(solventShareSchema),
  gasReleasedMmol: z.number().min(0).optional(),
  concentratesOrHeatsToDryness: z.boolean().optional(),
  components: z.array(planComponentSchema).default([]),
});

/** Everything about a plan's cautions except its runs. */
export const cautionSettingsSchema = z.object({
  vessel: vesselTypeSchema,
  thresholds: labThresholdsSchema,
  equipment: equipmentSchema,
  /** ISO date for container ages; default today (UTC). */
  now: isoDateSchema.optional(),
  /** Conditions at sealing (default 25 °C, 1 atm). */
  sealTemperatureC: z.number().gt(ABSOLUTE_ZERO_C).max(500).default(25),
  sealPressureBar: z.number().positive().max(1000).default(ATM_BAR),
  /** The lab's own solvent records, on top of the built-in ones. */
  labSolvents: z.array(solventRecordSchema).max(500).optional(),
});

export const planCautionInputSchema = cautionSettingsSchema.extend({
  runs: z.array(planRunSchema).max(100000),
});

/** What a caller sends (defaults not yet applied). */
export type PlanCautionInput = z.input<typeof planCautionInputSchema>;
export type PlanCautionRunInput = z.input<typeof planRunSchema>;
export type PlanCautionComponentInput = z.input<typeof planComponentSchema>;
export type CautionSettingsInput = z.input<typeof cautionSettingsSchema>;
/** As parsed (defaults applied). */
export type ParsedPlanCautionInput = z.output<typeof planCautionInputSchema>;
export type PlanRun = z.output<typeof planRunSchema>;
export type PlanComponent = z.output<typeof planComponentSchema>;
export type CautionSettings = z.output<typeof cautionSettingsSchema>;
