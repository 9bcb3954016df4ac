/**
 * The plan editor's form values: the plan document (lib/chemistry plan-document) in the
 * shape a form edits it — every text a string ("" = not given), every number a number or
 * undefined, GHS statements as one comma-separated text, the vessel and block as the id
 * of one of the lab's (the server fills in the vessel type, the block and its temperature
 * limits from the lab's settings). Field paths are the document's own paths
 * (`recipe.components.0.form.densityGPerMl`), so the server's issue paths
 * (`document.<path>`) land on the field that holds them (form-paths.ts).
 *
 * What the editor carries without editing (a vessel or block that is not one of the lab's,
 * design options it has no field for, runs given by an imported document) is kept in
 * `carry`, so an imported document loses nothing the form does not show.
 */
import type { Block } from "@/lib/hazards/thresholds";

/** The vessel or block select's value for "the document's own" (not one of the lab's). */
export const CUSTOM = "__document";

/** A number field: undefined when empty. */
export type Num = number | undefined;
/** An optional yes/no whose absence means "by the default rule" (e.g. water is protic). */
export type Tri = "" | "yes" | "no";
/** A date field: "" not recorded; null as carried from a document (e.g. an unopened container). */
export type DateValue = string | null;
/** A peroxide class field: "" not stated, "none" stated as none (null), or a class. */
export type PeroxideValue = "" | "none" | "A" | "B" | "C" | "D";

export const ROLES = ["reagent", "catalyst", "ligand", "additive"] as const;
export type Role = (typeof ROLES)[number];
export const STATES = ["solid", "liquid", "solution"] as const;
export type PhysicalState = (typeof STATES)[number];
export const DISPENSE_MODES = ["auto", "stock", "solid", "neat"] as const;
export const BINDING_KINDS = ["temperature", "time", "stirring", "equivalents", "loading", "ligand-ratio", "concentration", "solvent-fraction"] as const;
export type BindingKind = (typeof BINDING_KINDS)[number];
export const DESIGN_TYPES = ["full-factorial", "fractional-factorial", "central-composite", "box-behnken", "d-optimal"] as const;
export type DesignType = (typeof DESIGN_TYPES)[number];
/** "given": the runs of an already generated design, carried from the document. */
export type DesignChoice = DesignType | "given";
export const ALPHAS = ["rotatable", "spherical", "face-centered", "custom"] as const;
export const MODELS = ["linear", "interaction", "quadratic"] as const;

export interface HazardValues {
  ghs: string;
  pyrophoric: boolean;
  waterReactive: boolean;
  peroxideClass: PeroxideValue;
  protic: Tri;
  aqueous: Tri;
  openedOn: DateValue;
  peroxideTestedOn: DateValue;
  receivedOn: DateValue;
  expiresOn: DateValue;
}

export interface ComponentValues {
  id: string;
  name: string;
  role: Role;
  formula: string;
  molarMassGPerMol: Num;
  smiles: string;
  casNumber: string;
  /** A chemical of the lab's catalogue ("" when typed by hand): release reserves its containers. */
  chemicalId: string;
  form: { state: PhysicalState; purityWtPercent: Num; densityGPerMl: Num; molarityM: Num; wtPercent: Num; solvent: string };
  equivalents: Num;
  loadingMolPercent: Num;
  metalAtomsPerFormula: Num;
  ligandToMetalRatio: Num;
  catalyst: string;
  solubilityMgPerMl: Num;
  stockSolvent: string;
  dispense: (typeof DISPENSE_MODES)[number];
  addSeparately: boolean;
  addOrder: Num;
  gasReleasedMolPerMol: Num;
  hazards: HazardValues;
}

export interface SolventValues {
  name: string;
  volumeFraction: Num;
  chemicalId: string;
  ghs: string;
  peroxideClass: PeroxideValue;
  protic: Tri;
  aqueous: Tri;
  openedOn: DateValue;
  peroxideTestedOn: DateValue;
  receivedOn: DateValue;
  expiresOn: DateValue;
}

export interface FactorValues {
  name: string;
  low: Num;
  high: Num;
  unit: string;
  scale: "linear" | "log";
  /** What it drives; `component` for equivalents / loading / ligand ratio, `solvent` for a solvent fraction, `hold` for concentration. */
  binding: { kind: BindingKind; component: string; solvent: string; hold: "scale" | "volume" };
}

export interface DesignValues {
  design: DesignChoice;
  /** Fractional factorial generators, e.g. "E=ABCD, F=ABC" ("" = the minimum-aberration default). */
  generators: string;
  alpha: (typeof ALPHAS)[number];
  alphaValue: Num;
  placement: "circumscribed" | "inscribed";
  centerPoints: Num;
  replicates: Num;
  randomize: boolean;
  seed: Num;
  /** D-optimal: the number of runs. */
  runs: Num;
  model: (typeof MODELS)[number] | "custom";
  blocks: Num;
}

export interface RecipeValues {
  limitingReagent: string;
  scaleMmol: Num;
  /** Whether the amount of solvent is given by the concentration of the limiting reagent or by the final volume. */
  basis: "concentration" | "volume";
  concentrationM: Num;
  finalVolumeUl: Num;
  temperatureC: Num;
  timeH: Num;
  stirringRpm: Num;
  concentratesOrHeatsToDryness: boolean;
  components: ComponentValues[];
  solvents: SolventValues[];
}

/** What the form carries from a document without a field for it. */
export interface CarriedValues {
  /** The document's own vessel (a vessel type, or an id of the hazard engine's default vessels) when `vessel` is CUSTOM. */
  vessel?: unknown;
  /** The document's own block when `block` is CUSTOM, and its temperature limits. */
  block?: Block;
  equipment?: unknown;
  now?: string;
  /** Design options without a field (constraints, candidates, hard-to-change factor, …). */
  designExtra: Record<string, unknown>;
  /** The runs of a design already generated (design "given"). */
  givenRuns?: unknown[];
  /** A model given as a list of terms (model "custom"). */
  modelTerms?: string[];
}

export interface EditorValues {
  name: string;
  recipe: RecipeValues;
  factors: FactorValues[];
  design: DesignValues;
  /** A lab vessel type's id, or CUSTOM. */
  vessel: string;
  /** A lab block's id, or CUSTOM. */
  block: string;
  carry: CarriedValues;
}

export function blankHazards(): HazardValues {
  return { ghs: "", pyrophoric: false, waterReactive: false, peroxideClass: "", protic: "", aqueous: "", openedOn: "", peroxideTestedOn: "", receivedOn: "", expiresOn: "" };
}

export function blankComponent(id: string, role: Role = "reagent"): ComponentValues {
  return {
    id,
    name: "",
    role,
    formula: "",
    molarMassGPerMol: undefined,
    smiles: "",
    casNumber: "",
    chemicalId: "",
    form: { state: "solid", purityWtPercent: 100, densityGPerMl: undefined, molarityM: undefined, wtPercent: undefined, solvent: "" },
    equivalents: role === "reagent" || role === "additive" ? 1 : undefined,
    loadingMolPercent: role === "catalyst" ? 1 : undefined,
    metalAtomsPerFormula: 1,
    ligandToMetalRatio: role === "ligand" ? 2 : undefined,
    catalyst: "",
    solubilityMgPerMl: undefined,
    stockSolvent: "",
    dispense: "auto",
    addSeparately: false,
    addOrder: undefined,
    gasReleasedMolPerMol: undefined,
    hazards: blankHazards(),
  };
}

export function blankSolvent(name = "", volumeFraction: Num = 1): SolventValues {
  return { name, volumeFraction, chemicalId: "", ghs: "", peroxideClass: "", protic: "", aqueous: "", openedOn: "", peroxideTestedOn: "", receivedOn: "", expiresOn: "" };
}

export function blankFactor(name: string, kind: BindingKind = "temperature"): FactorValues {
  return { name, low: undefined, high: undefined, unit: DEFAULT_UNITS[kind], scale: "linear", binding: { kind, component: "", solvent: "", hold: "scale" } };
}

/** The unit a new factor of each kind starts with (the document's canonical units, lib/chemistry/units.ts). */
export const DEFAULT_UNITS: Record<BindingKind, string> = {
  temperature: "degC",
  time: "h",
  stirring: "rpm",
  equivalents: "equiv",
  loading: "mol%",
  "ligand-ratio": "mol/mol",
  concentration: "M",
  "solvent-fraction": "fraction",
};

/** Units a factor of each kind accepts (lib/chemistry/units.ts). */
export const UNITS_BY_KIND: Record<BindingKind, readonly string[]> = {
  temperature: ["degC", "K", "degF"],
  time: ["h", "min", "s", "d"],
  stirring: ["rpm", "Hz"],
  equivalents: ["equiv"],
  loading: ["mol%"],
  "ligand-ratio": ["mol/mol"],
  concentration: ["M", "mM"],
  "solvent-fraction": ["fraction", "v/v", "%", "vol%"],
};

/** A new, empty plan: one reagent (the limiting one), one solvent, no factors, a Box–Behnken design with a fixed seed. */
export function blankValues(opts: { vessel: string; block: string; seed: number }): EditorValues {
  return {
    name: "",
    recipe: {
      limitingReagent: "c1",
      scaleMmol: 0.1,
      basis: "concentration",
      concentrationM: 0.2,
      finalVolumeUl: undefined,
      temperatureC: 25,
      timeH: undefined,
      stirringRpm: undefined,
      concentratesOrHeatsToDryness: false,
      components: [{ ...blankComponent("c1"), equivalents: undefined }],
      solvents: [blankSolvent()],
    },
    factors: [],
    design: {
      design: "box-behnken",
      generators: "",
      alpha: "rotatable",
      alphaValue: undefined,
      placement: "circumscribed",
      centerPoints: undefined,
      replicates: 1,
      randomize: true,
      seed: opts.seed,
      runs: undefined,
      model: "quadratic",
      blocks: undefined,
    },
    vessel: opts.vessel,
    block: opts.block,
    carry: { designExtra: {} },
  };
}
