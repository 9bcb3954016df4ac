/**
 * The hazard engine: solvent data, vapour pressure, sealed-vessel pressure and the
 * caution rules for a plan. Pure: imports nothing from the app's frameworks.
 */
export * from "./hazard-flags";
export * from "./iso-date";
export * from "./peroxide-due";
export * from "./thresholds";
export * from "./vessels";
export * from "./solvent-record";
export { BUILT_IN_SOLVENTS } from "./solvent-data";
export * from "./solvents";
export * from "./iapws-if97";
export * from "./vapor-pressure";
export * from "./solvent-system";
export * from "./sealed-vessel";
export * from "./caution-rules";
export * from "./plan-cautions";
export * from "./vessel-pressure";
export * from "./ghs-pictograms";
