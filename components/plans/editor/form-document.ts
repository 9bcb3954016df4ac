/**
 * The plan editor's form values ↔ the plan document (lib/chemistry plan-document).
 *
 * `toDocument` writes what the editor sends: the document as the chemist typed it, with the
 * vessel and block as the ids of the lab's (the server fills in the vessel type, the block,
 * its temperature limits, the dispensing limits and the hazard thresholds from the lab's
 * settings: lib/plans/document.ts `withLabDefaults`). Fields that do not apply to what is
 * chosen (a density after the state became solid, equivalents of a catalyst, a binding's
 * component after its kind changed) are left out, so the document is what the form shows.
 *
 * `fromDocument` reads any document (a stored plan, an imported file) into form values,
 * keeping what the form has no field for in `carry`, and says where the plan will be
 * computed with the lab's current settings instead of the document's own.
 */
import { dispensingSchema } from "@/lib/chemistry/plan-document";
import { labThresholdsSchema } from "@/lib/hazards/thresholds";
import type { LabSettings } from "@/lib/lab-settings/schemas";
import {
  ALPHAS,
  BINDING_KINDS,
  CUSTOM,
  DESIGN_TYPES,
  DISPENSE_MODES,
  MODELS,
  ROLES,
  STATES,
  blankValues,
  type BindingKind,
  type ComponentValues,
  type DateValue,
  type DesignValues,
  type EditorValues,
  type FactorValues,
  type HazardValues,
  type Num,
  type PeroxideValue,
  type SolventValues,
  type Tri,
} from "./form-values";

type Doc = Record<string, unknown>;

// ——— form → document ———

const num = (v: Num): number | undefined => (typeof v === "number" && Number.isFinite(v) ? v : undefined);
const str = (v: string | undefined | null): string | undefined => (typeof v === "string" && v.trim() !== "" ? v.trim() : undefined);
const tri = (t: Tri): boolean | undefined => (t === "yes" ? true : t === "no" ? false : undefined);
const date = (d: DateValue): string | null | undefined => (d === null ? null : str(d));
const peroxide = (p: PeroxideValue): string | null | undefined => (p === "" ? undefined : p === "none" ? null : p);

/** The GHS statements of a comma-separated text, in order (the index of an issue path such as `hazards.ghs.2` is an index into this list). */
export function ghsList(text: string): string[] {
  return text
    .split(/[\s,;]+/)
    .map((t) => t.trim())
    .filter(Boolean);
}

/** An object without its undefined entries. */
function compact<T extends Doc>(o: T): T {
  const out: Doc = {};
  for (const [k, v] of Object.entries(o)) if (v !== undefined) out[k] = v;
  return out as T;
}

function formOf(f: ComponentValues["form"]): Doc {
  if (f.state === "solid") return compact({ state: "solid", purityWtPercent: num(f.purityWtPercent) });
  if (f.state === "liquid") return compact({ state: "liquid", densityGPerMl: num(f.densityGPerMl), purityWtPercent: num(f.purityWtPercent) });
  return compact({ state: "solution", molarityM: num(f.molarityM), wtPercent: num(f.wtPercent), densityGPerMl: num(f.densityGPerMl), solvent: str(f.solvent) });
}

function hazardsOf(h: HazardValues): Doc {
  return compact({
    ghs: ghsList(h.ghs),
    pyrophoric: h.pyrophoric ? true : undefined,
    waterReactive: h.waterReactive ? true : undefined,
    peroxideClass: peroxide(h.peroxideClass),
    protic: tri(h.protic),
    aqueous: tri(h.aqueous),
    openedOn: date(h.openedOn),
    peroxideTestedOn: date(h.peroxideTestedOn),
    receivedOn: date(h.receivedOn),
    expiresOn: date(h.expiresOn),
  });
}

function componentOf(c: ComponentValues): Doc {
  const amountsByEquivalents = c.role === "reagent" || c.role === "additive";
  return compact({
    id: c.id.trim(),
    name: c.name.trim(),
    role: c.role,
    formula: str(c.formula),
    molarMassGPerMol: num(c.molarMassGPerMol),
    smiles: str(c.smiles),
    casNumber: str(c.casNumber),
    form: formOf(c.form),
    equivalents: amountsByEquivalents ? num(c.equivalents) : undefined,
    loadingMolPercent: c.role === "catalyst" ? num(c.loadingMolPercent) : undefined,
    metalAtomsPerFormula: c.role === "catalyst" ? num(c.metalAtomsPerFormula) : undefined,
    ligandToMetalRatio: c.role === "ligand" ? num(c.ligandToMetalRatio) : undefined,
    catalyst: c.role === "ligand" ? str(c.catalyst) : undefined,
    solubilityMgPerMl: num(c.solubilityMgPerMl),
    stockSolvent: str(c.stockSolvent),
    dispense: c.dispense,
    addSeparately: c.addSeparately,
    addOrder: num(c.addOrder),
    gasReleasedMolPerMol: num(c.gasReleasedMolPerMol),
    hazards: hazardsOf(c.hazards),
    chemicalId: str(c.chemicalId),
  });
}

function solventOf(s: SolventValues): Doc {
  return compact({
    name: s.name.trim(),
    volumeFraction: num(s.volumeFraction),
    protic: tri(s.protic),
    aqueous: tri(s.aqueous),
    ghs: ghsList(s.ghs),
    peroxideClass: peroxide(s.peroxideClass),
    openedOn: date(s.openedOn),
    peroxideTestedOn: date(s.peroxideTestedOn),
    receivedOn: date(s.receivedOn),
    expiresOn: date(s.expiresOn),
    chemicalId: str(s.chemicalId),
  });
}

/** A factor's binding with only the fields its kind takes. */
function bindingOf(b: FactorValues["binding"]): Doc {
  if (b.kind === "equivalents" || b.kind === "loading" || b.kind === "ligand-ratio") return { kind: b.kind, component: b.component };
  if (b.kind === "solvent-fraction") return { kind: b.kind, solvent: b.solvent };
  if (b.kind === "concentration") return { kind: b.kind, hold: b.hold };
  return { kind: b.kind };
}

function factorOf(f: FactorValues): Doc {
  return compact({ name: f.name.trim(), low: num(f.low), high: num(f.high), unit: str(f.unit), scale: f.scale, binding: bindingOf(f.binding) });
}

/** The design fields each design type takes (besides the carried options). */
export function designFieldsOf(d: Pick<DesignValues, "design" | "alpha" | "model" | "randomize">): Array<keyof DesignValues> {
  if (d.design === "given") return ["design"];
  const common: Array<keyof DesignValues> = ["design", "centerPoints", "replicates", "randomize", ...(d.randomize ? (["seed"] as const) : [])];
  switch (d.design) {
    case "full-factorial":
      return [...common, "blocks"];
    case "fractional-factorial":
      return [...common, "generators", "blocks"];
    case "central-composite":
      return [...common, "alpha", ...(d.alpha === "custom" ? (["alphaValue"] as const) : []), "placement", "blocks"];
    case "box-behnken":
      return common;
    case "d-optimal":
      return [...common, "runs", "model"];
  }
}

function designOf(d: DesignValues, carry: EditorValues["carry"]): Doc {
  if (d.design === "given") return { ...carry.designExtra, runs: carry.givenRuns ?? [] };
  const fields = new Set(designFieldsOf(d));
  const generators = d.generators
    .split(/[,;\s]+/)
    .map((g) => g.trim())
    .filter(Boolean);
  return compact({
    ...carry.designExtra,
    design: d.design,
    generators: fields.has("generators") && generators.length ? generators : undefined,
    alpha: fields.has("alpha") ? (d.alpha === "custom" ? num(d.alphaValue) : d.alpha) : undefined,
    placement: fields.has("placement") ? d.placement : undefined,
    centerPoints: num(d.centerPoints),
    replicates: num(d.replicates),
    randomize: d.randomize,
    seed: d.randomize ? num(d.seed) : undefined,
    runs: fields.has("runs") ? num(d.runs) : undefined,
    model: fields.has("model") ? (d.model === "custom" ? carry.modelTerms : d.model) : undefined,
    blocks: fields.has("blocks") ? num(d.blocks) : undefined,
  });
}

/**
 * The plan document the editor sends (module comment): the vessel and block as lab ids (or
 * the document's own when CUSTOM); no dispensing limits or thresholds — the server fills
 * them in from the lab's settings.
 */
export function toDocument(v: EditorValues): Doc {
  const r = v.recipe;
  return compact({
    schemaVersion: 1,
    name: str(v.name),
    recipe: compact({
      limitingReagent: r.limitingReagent,
      scaleMmol: num(r.scaleMmol),
      concentrationM: r.basis === "concentration" ? num(r.concentrationM) : undefined,
      finalVolumeUl: r.basis === "volume" ? num(r.finalVolumeUl) : undefined,
      temperatureC: num(r.temperatureC),
      timeH: num(r.timeH),
      stirringRpm: num(r.stirringRpm),
      concentratesOrHeatsToDryness: r.concentratesOrHeatsToDryness,
      components: r.components.map(componentOf),
      solvents: r.solvents.map(solventOf),
    }),
    factors: v.factors.map(factorOf),
    design: designOf(v.design, v.carry),
    vessel: v.vessel === CUSTOM ? v.carry.vessel : v.vessel,
    block: v.block === CUSTOM ? v.carry.block : v.block,
    equipment: v.block === CUSTOM ? v.carry.equipment : undefined,
    now: v.carry.now,
  });
}

/**
 * The document as the schema checks it in the browser: the lab block's id replaced by the
 * block itself (the server does the same, lib/plans/document.ts), so the plan document's
 * own schema validates the whole of it.
 */
export function validationDocument(doc: Doc, settings: LabSettings): Doc {
  const out: Doc = { ...doc };
  if (typeof doc.block === "string") {
    const b = settings.blocks.types.find((x) => x.id === doc.block);
    if (b) out.block = { id: b.id, name: b.name, positions: b.positions };
  }
  // A component given only by SMILES gets its formula on the server (openchemlib stays out of the browser).
  const recipe = obj(doc.recipe);
  if (Array.isArray(recipe.components)) {
    const components = recipe.components.map((c) => (isObj(c) && typeof c.smiles === "string" && c.formula === undefined && c.molarMassGPerMol === undefined ? { ...c, formula: "C" } : c));
    out.recipe = { ...recipe, components };
  }
  return out;
}

// ——— document → form ———

const isObj = (v: unknown): v is Doc => !!v && typeof v === "object" && !Array.isArray(v);
const obj = (v: unknown): Doc => (isObj(v) ? v : {});
const s = (v: unknown): string => (typeof v === "string" ? v : typeof v === "number" ? String(v) : "");
const n = (v: unknown): Num => (typeof v === "number" && Number.isFinite(v) ? v : undefined);
const triOf = (v: unknown): Tri => (v === true ? "yes" : v === false ? "no" : "");
const dateOf = (v: unknown): DateValue => (v === null ? null : s(v));
const peroxideOf = (v: unknown): PeroxideValue => (v === null ? "none" : v === "A" || v === "B" || v === "C" || v === "D" ? v : "");
const ghsText = (v: unknown): string => (Array.isArray(v) ? v.filter((x) => typeof x === "string").join(", ") : "");
function oneOf<T extends string>(v: unknown, options: readonly T[], fallback: T): T {
  return typeof v === "string" && (options as readonly string[]).includes(v) ? (v as T) : fallback;
}

function componentValues(raw: unknown, i: number): ComponentValues {
  const c = obj(raw);
  const f = obj(c.form);
  const h = obj(c.hazards);
  return {
    id: s(c.id) || `c${i + 1}`,
    name: s(c.name),
    role: oneOf(c.role, ROLES, "reagent"),
    formula: s(c.formula),
    molarMassGPerMol: n(c.molarMassGPerMol),
    smiles: s(c.smiles),
    casNumber: s(c.casNumber),
    chemicalId: s(c.chemicalId),
    form: {
      state: oneOf(f.state, STATES, "solid"),
      purityWtPercent: n(f.purityWtPercent),
      densityGPerMl: n(f.densityGPerMl),
      molarityM: n(f.molarityM),
      wtPercent: n(f.wtPercent),
      solvent: s(f.solvent),
    },
    equivalents: n(c.equivalents),
    loadingMolPercent: n(c.loadingMolPercent),
    metalAtomsPerFormula: n(c.metalAtomsPerFormula),
    ligandToMetalRatio: n(c.ligandToMetalRatio),
    catalyst: s(c.catalyst),
    solubilityMgPerMl: n(c.solubilityMgPerMl),
    stockSolvent: s(c.stockSolvent),
    dispense: oneOf(c.dispense, DISPENSE_MODES, "auto"),
    addSeparately: c.addSeparately === true,
    addOrder: n(c.addOrder),
    gasReleasedMolPerMol: n(c.gasReleasedMolPerMol),
    hazards: {
      ghs: ghsText(h.ghs),
      pyrophoric: h.pyrophoric === true,
      waterReactive: h.waterReactive === true,
      peroxideClass: peroxideOf(h.peroxideClass),
      protic: triOf(h.protic),
      aqueous: triOf(h.aqueous),
      openedOn: dateOf(h.openedOn),
      peroxideTestedOn: dateOf(h.peroxideTestedOn),
      receivedOn: dateOf(h.receivedOn),
      expiresOn: dateOf(h.expiresOn),
    },
  };
}

function solventValues(raw: unknown): SolventValues {
  const x = obj(raw);
  return {
    name: s(x.name),
    volumeFraction: n(x.volumeFraction),
    chemicalId: s(x.chemicalId),
    ghs: ghsText(x.ghs),
    peroxideClass: peroxideOf(x.peroxideClass),
    protic: triOf(x.protic),
    aqueous: triOf(x.aqueous),
    openedOn: dateOf(x.openedOn),
    peroxideTestedOn: dateOf(x.peroxideTestedOn),
    receivedOn: dateOf(x.receivedOn),
    expiresOn: dateOf(x.expiresOn),
  };
}

function factorValues(raw: unknown): FactorValues {
  const f = obj(raw);
  const b = obj(f.binding);
  return {
    name: s(f.name),
    low: n(f.low),
    high: n(f.high),
    unit: s(f.unit),
    scale: f.scale === "log" ? "log" : "linear",
    binding: { kind: oneOf<BindingKind>(b.kind, BINDING_KINDS, "temperature"), component: s(b.component), solvent: s(b.solvent), hold: b.hold === "volume" ? "volume" : "scale" },
  };
}

const KNOWN_DESIGN_KEYS = new Set(["design", "generators", "alpha", "placement", "centerPoints", "replicates", "randomize", "seed", "runs", "model", "blocks"]);

/** The design section as form values, what the form carries of it, and notes. */
export function designValues(raw: unknown, base: DesignValues): { design: DesignValues; extra: Record<string, unknown>; givenRuns?: unknown[]; modelTerms?: string[] } {
  const d = obj(raw);
  const extra: Record<string, unknown> = {};
  for (const [k, v] of Object.entries(d)) if (!KNOWN_DESIGN_KEYS.has(k)) extra[k] = v;
  const given = Array.isArray(d.runs) ? d.runs : undefined;
  const modelTerms = Array.isArray(d.model) ? d.model.filter((t): t is string => typeof t === "string") : undefined;
  const alpha = d.alpha;
  const design: DesignValues = {
    design: given ? "given" : oneOf(d.design, DESIGN_TYPES, base.design === "given" ? "box-behnken" : base.design),
    generators: Array.isArray(d.generators) ? d.generators.filter((g) => typeof g === "string").join(", ") : "",
    alpha: typeof alpha === "number" ? "custom" : oneOf(alpha, ALPHAS, "rotatable"),
    alphaValue: typeof alpha === "number" ? alpha : undefined,
    placement: d.placement === "inscribed" ? "inscribed" : "circumscribed",
    centerPoints: n(d.centerPoints),
    replicates: n(d.replicates) ?? 1,
    randomize: d.randomize !== false,
    // A randomised design gets its seed now (the server would fix one on saving), so the preview's run order stays put while the chemist types.
    seed: n(d.seed) ?? base.seed,
    runs: typeof d.runs === "number" ? d.runs : undefined,
    model: modelTerms ? "custom" : oneOf(d.model, MODELS, "quadratic"),
    blocks: n(d.blocks),
  };
  if (given && typeof d.design === "string") extra.design = d.design;
  return { design, extra, givenRuns: given, modelTerms };
}

const sameJson = (a: unknown, b: unknown) => JSON.stringify(a) === JSON.stringify(b);

function sameFields(given: Doc, lab: Doc): boolean {
  return Object.keys(lab).every((k) => sameJson(given[k], lab[k]));
}

export interface FromDocument {
  values: EditorValues;
  /** Where the plan will be computed with the lab's current settings rather than the document's own values. */
  notes: string[];
}

/**
 * Form values of any plan document (a stored plan, an imported file); see the module
 * comment. Never throws: what cannot be read becomes an empty field, and the document's
 * own check (the schema, in the import flow) names what was wrong.
 */
export function fromDocument(raw: unknown, settings: LabSettings, seed: number): FromDocument {
  const doc = obj(raw);
  const notes: string[] = [];
  const base = blankValues({ vessel: settings.vessels.defaultId, block: settings.blocks.defaultId, seed });
  const recipe = obj(doc.recipe);
  const carry: EditorValues["carry"] = { designExtra: {} };

  // Vessel: one of the lab's by id, else the document's own.
  let vessel = settings.vessels.defaultId;
  const rv = doc.vessel;
  const rvId = typeof rv === "string" ? rv : isObj(rv) ? s(rv.id) : "";
  const labVessel = settings.vessels.types.find((t) => t.id === rvId);
  if (labVessel) {
    vessel = labVessel.id;
    if (isObj(rv) && !sameFields(rv, labVessel as unknown as Doc)) notes.push(`The lab's vessel type “${labVessel.name}” has changed since this document was written; the plan is computed with the lab's current values.`);
  } else if (rv !== undefined) {
    vessel = CUSTOM;
    carry.vessel = rv;
  }

  // Block: one of the lab's by id (its temperature range then sets the limits), else the document's own with its limits.
  let block = settings.blocks.defaultId;
  const rb = doc.block;
  const rbId = typeof rb === "string" ? rb : isObj(rb) ? s(rb.id) : "";
  const labBlock = settings.blocks.types.find((t) => t.id === rbId);
  if (labBlock) block = labBlock.id;
  else if (isObj(rb)) {
    block = CUSTOM;
    carry.block = { id: s(rb.id), name: s(rb.name), positions: rb.positions as 24 | 48 | 96 };
    carry.equipment = doc.equipment;
  }
  if (block !== CUSTOM && isObj(doc.equipment)) {
    const b = settings.blocks.types.find((t) => t.id === block);
    const e = doc.equipment;
    if (b && ((e.blockMaxC !== undefined && e.blockMaxC !== b.maxC) || (e.coolingMinC !== undefined && e.coolingMinC !== b.minC))) {
      notes.push(`The document's temperature limits differ from the block “${b.name}” (${b.minC} to ${b.maxC} °C); the plan is computed with the block's.`);
    }
  }

  // Dispensing limits and thresholds: always the lab's (read-only in the editor).
  if (doc.dispensing !== undefined) {
    const given = dispensingSchema.safeParse(doc.dispensing);
    if (!given.success || !sameFields(given.data as Doc, settings.dispensing as unknown as Doc)) notes.push("The document's dispensing limits differ from the lab's; the plan is computed with the lab's (Lab settings → Dispensing limits).");
  }
  if (doc.thresholds !== undefined) {
    const given = labThresholdsSchema.safeParse(doc.thresholds);
    if (!given.success || !sameFields(given.data as Doc, settings.thresholds as unknown as Doc)) notes.push("The document's hazard thresholds differ from the lab's; the plan is computed with the lab's (Lab settings → Hazard thresholds).");
  }
  if (typeof doc.now === "string") carry.now = doc.now;

  const dv = designValues(doc.design, base.design);
  carry.designExtra = dv.extra;
  if (dv.givenRuns) carry.givenRuns = dv.givenRuns;
  if (dv.modelTerms) carry.modelTerms = dv.modelTerms;
  const components = Array.isArray(recipe.components) ? recipe.components.map(componentValues) : base.recipe.components;
  const hasVolume = typeof recipe.finalVolumeUl === "number" && recipe.concentrationM === undefined;
  const values: EditorValues = {
    name: s(doc.name),
    recipe: {
      limitingReagent: s(recipe.limitingReagent),
      scaleMmol: n(recipe.scaleMmol),
      basis: hasVolume ? "volume" : "concentration",
      concentrationM: n(recipe.concentrationM),
      finalVolumeUl: n(recipe.finalVolumeUl),
      temperatureC: n(recipe.temperatureC),
      timeH: n(recipe.timeH),
      stirringRpm: n(recipe.stirringRpm),
      concentratesOrHeatsToDryness: recipe.concentratesOrHeatsToDryness === true,
      components,
      solvents: Array.isArray(recipe.solvents) ? recipe.solvents.map(solventValues) : base.recipe.solvents,
    },
    factors: Array.isArray(doc.factors) ? doc.factors.map(factorValues) : [],
    design: dv.design,
    vessel,
    block,
    carry,
  };
  return { values, notes };
}
