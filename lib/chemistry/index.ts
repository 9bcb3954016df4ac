/**
 * The chemistry engine: molar masses, per-vial stoichiometry, stock solutions and
 * master mixes, and the plan document. Pure: imports nothing from the app's frameworks.
 */
export * from "./atomic-weights";
export * from "./molar-mass";
export * from "./plan-document";
export * from "./stoichiometry";
export * from "./dispensing";
export * from "./design-runs";
export * from "./run-sheet";
export * from "./caution-input";
export * from "./inventory-facts";
export * from "./plan-report";
export * from "./validate-plan";
export * from "./point-safety";
export * from "./smiles";
