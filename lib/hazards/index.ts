/**
 * The hazard engine: solvent data, vapour pressure, sealed-vessel pressure and the
 * caution rules for a plan. Pure: imports nothing from the app's frameworks.
 */
export * from "./thresholds";
export * from "./vessels";
