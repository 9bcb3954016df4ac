/**
 * The verbs of the engine command line, each loaded on demand from its own module.
 * A verb module exports `run(input: unknown): unknown | Promise<unknown>` and throws
 * an AppError("invalid_input", …, issues) for bad input.
 */
export interface VerbModule {
  run(input: unknown): unknown;
}

export const VERBS = {
  design: () => import("./design"),
  fit: () => import("./fit"),
  optimize: () => import("./optimize"),
  "molar-mass": () => import("./molar-mass"),
  plan: () => import("./plan"),
  "vapor-pressure": () => import("./vapor-pressure"),
  "vessel-pressure": () => import("./vessel-pressure"),
} satisfies Record<string, () => Promise<VerbModule>>;

export type VerbName = keyof typeof VERBS;
