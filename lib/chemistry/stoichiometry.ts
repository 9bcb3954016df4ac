/**
 * Per-vial stoichiometry: from a recipe and one run's factor values to the amount of
 * every component in that vial — mmol, mass (mg, corrected for purity) and volume (µL,
 * from density for neat liquids, from molarity or wt % and density for solutions).
 *
 * Definitions (the everyday ones of synthetic chemistry):
 * - n(limiting) = scale (mmol per vial); c = n(limiting) / V(final) (mol/L);
 * - reagent or additive: n = equivalents × n(limiting);
 * - catalyst: n(metal) = loading (mol %) / 100 × n(limiting); n(complex) = n(metal) /
 *   metal atoms per formula unit (a dimer at 1 mol % metal is 0.5 mol % complex);
 * - ligand: n = ratio (ligand : metal) × n(metal of its catalyst);
 * - mass of pure compound m = n × M (mmol × g/mol = mg); mass as supplied = m / (purity/100)
 *   (or / (wt %/100) for a solution given in wt %); volume of a neat liquid V = mass as
 *   supplied / density (mg ÷ g/mL = µL); of a solution V = n / molarity × 1000 (µL).
 */
import { AppError } from "../errors/app-error";
import { impliedHazards } from "../hazards/hazard-flags";
import { formulaMolarMass } from "./molar-mass";
import { formatNumber } from "../doe/format";
import type { Component, PlanDocument } from "./plan-document";
import { toCanonical } from "./units";

/** What the planner needs to know about one component, computed once per plan. */
export interface ComponentInfo {
  index: number;
  component: Component;
  molarMassGPerMol: number;
  /** Highest concentration of the compound this material can give in a stock (mol/L): Infinity for a solid (see solubility). */
  intrinsicMaxM: number;
  /** Solubility limit in its stock solvent (mol/L), Infinity when not given. */
  solubilityM: number;
  stockSolvent: string;
  pyrophoric: boolean;
  waterReactive: boolean;
  protic: boolean;
  aqueous: boolean;
}

/** The conditions of one run after its factor values are applied. */
export interface RunConditions {
  temperatureC: number;
  timeH: number | null;
  stirringRpm: number | null;
  concentrationM: number;
  limitingMmol: number;
  finalVolumeUl: number;
  /** Volume fraction of each solvent of the solvent system. */
  solventFractions: Record<string, number>;
  equivalents: Record<string, number>;
  loadingMolPercent: Record<string, number>;
  ligandToMetalRatio: Record<string, number>;
}

/** One component's amount in one vial. */
export interface ComponentAmount {
  id: string;
  name: string;
  role: Component["role"];
  mmol: number;
  /** Mass of the pure compound (mg). */
  pureMassMg: number;
  /** Mass of the material as supplied, corrected for purity (mg); null for a solution given only by molarity. */
  massMg: number | null;
  /** Volume of the material as supplied (µL); null for a solid. */
  volumeUl: number | null;
  /** Equivalents relative to the limiting reagent (mmol / mmol). */
  equivalents: number;
  /** Catalysts: mol % of metal; ligands: ligand-to-metal ratio; otherwise null. */
  loadingMolPercent: number | null;
  ligandToMetalRatio: number | null;
}

const PROTIC_SOLVENTS = new Set(["water", "methanol", "ethanol", "2-propanol", "isopropanol", "tert-butanol", "n-butanol", "1-butanol", "7732-18-5", "67-56-1", "64-17-5", "67-63-0"]);
const AQUEOUS_SOLVENTS = new Set(["water", "7732-18-5"]);

/** Whether a solvent of the recipe is protic / aqueous (explicit flags win over the defaults). */
export function solventFlags(s: { name: string; protic?: boolean | undefined; aqueous?: boolean | undefined }): { protic: boolean; aqueous: boolean } {
  const key = s.name.trim().toLowerCase();
  return { protic: s.protic ?? PROTIC_SOLVENTS.has(key), aqueous: s.aqueous ?? AQUEOUS_SOLVENTS.has(key) };
}

/**
 * Molar mass, concentration limits and hazard flags of every component.
 * @throws AppError("invalid_input") at `recipe.components.<i>.formula` for a bad formula.
 */
export function componentInfos(doc: PlanDocument): ComponentInfo[] {
  const major = [...doc.recipe.solvents].sort((a, b) => b.volumeFraction - a.volumeFraction)[0]!.name;
  return doc.recipe.components.map((component, index) => {
    const molarMassGPerMol =
      component.molarMassGPerMol ?? formulaMolarMass(component.formula ?? "", `recipe.components.${index}.formula`).gPerMol;
    const form = component.form;
    let intrinsicMaxM = Infinity;
    if (form.state === "liquid") intrinsicMaxM = (form.densityGPerMl * 1000 * (form.purityWtPercent / 100)) / molarMassGPerMol;
    if (form.state === "solution") {
      intrinsicMaxM =
        form.molarityM ?? ((form.densityGPerMl ?? 0) * 1000 * ((form.wtPercent ?? 0) / 100)) / molarMassGPerMol;
    }
    const hazards = impliedHazards(component.hazards);
    return {
      index,
      component,
      molarMassGPerMol,
      intrinsicMaxM,
      solubilityM: component.solubilityMgPerMl !== undefined ? component.solubilityMgPerMl / molarMassGPerMol : Infinity,
      stockSolvent: component.stockSolvent ?? major,
      pyrophoric: hazards.pyrophoric,
      waterReactive: hazards.waterReactive,
      protic: component.hazards.protic ?? false,
      aqueous: component.hazards.aqueous ?? false,
    };
  });
}

/** A problem with a run's values, gathered so one error names every run it touches. */
export interface RunProblem {
  key: string;
  message: string;
  component?: string;
  run: number;
}

/** Records a problem when a factor makes a quantity that must be positive ≤ 0 (or NaN). */
function requirePositive(problems: RunProblem[], factor: string, v: number, run: number, what: string, component?: string): void {
  if (v > 0) return;
  problems.push({ key: `nonpositive:${factor}`, component, run, message: `factor "${factor}" gives ${what} ${formatNumber(v)} (not positive)` });
}

/**
 * Applies one run's natural factor values (in the factors' own units) to the recipe.
 * Values that make an amount non-positive, or a solvent fraction leave [0, 1], are
 * reported in `problems` (keyed, so the caller can list all runs per problem).
 */
export function runConditions(doc: PlanDocument, natural: Record<string, number>, run: number, problems: RunProblem[]): RunConditions {
  const r = doc.recipe;
  const cond: RunConditions = {
    temperatureC: r.temperatureC,
    timeH: r.timeH ?? null,
    stirringRpm: r.stirringRpm ?? null,
    concentrationM: NaN,
    limitingMmol: r.scaleMmol,
    finalVolumeUl: NaN,
    solventFractions: Object.fromEntries(r.solvents.map((s) => [s.name, s.volumeFraction])),
    equivalents: {},
    loadingMolPercent: {},
    ligandToMetalRatio: {},
  };
  for (const c of r.components) {
    if (c.equivalents !== undefined) cond.equivalents[c.id] = c.equivalents;
    if (c.loadingMolPercent !== undefined) cond.loadingMolPercent[c.id] = c.loadingMolPercent;
    if (c.ligandToMetalRatio !== undefined) cond.ligandToMetalRatio[c.id] = c.ligandToMetalRatio;
  }
  cond.equivalents[r.limitingReagent] = 1;
  const baseVolumeUl = r.finalVolumeUl ?? (1000 * r.scaleMmol) / (r.concentrationM ?? 1);
  let concentration: { value: number; hold: "scale" | "volume" } | null = null;
  const fixedFractions: Record<string, number> = {};

  doc.factors.forEach((f, i) => {
    const raw = natural[f.name];
    if (raw === undefined) throw AppError.field(`factors.${i}.name`, `run ${run} has no value for factor "${f.name}"`);
    const v = toCanonical(f.binding.kind, raw, f.unit, `factors.${i}.unit`);
    const b = f.binding;
    switch (b.kind) {
      case "temperature":
        cond.temperatureC = v;
        break;
      case "time":
        requirePositive(problems, f.name, v, run, "a time of");
        cond.timeH = v;
        break;
      case "stirring":
        if (v < 0) problems.push({ key: `nonpositive:${f.name}`, run, message: `factor "${f.name}" gives a negative stirring rate` });
        cond.stirringRpm = v;
        break;
      case "equivalents":
        requirePositive(problems, f.name, v, run, `${b.component} equivalents of`, b.component);
        cond.equivalents[b.component] = v;
        break;
      case "loading":
        requirePositive(problems, f.name, v, run, `a ${b.component} loading (mol % metal) of`, b.component);
        cond.loadingMolPercent[b.component] = v;
        break;
      case "ligand-ratio":
        requirePositive(problems, f.name, v, run, `a ${b.component} ligand-to-metal ratio of`, b.component);
        cond.ligandToMetalRatio[b.component] = v;
        break;
      case "concentration":
        requirePositive(problems, f.name, v, run, "a concentration (M) of");
        concentration = { value: v, hold: b.hold };
        break;
      case "solvent-fraction":
        if (!(v >= 0 && v <= 1)) {
          problems.push({ key: `fraction:${f.name}`, run, message: `factor "${f.name}" gives a ${b.solvent} volume fraction of ${v} (outside 0–1)` });
        }
        fixedFractions[b.solvent] = v;
        break;
    }
  });

  const conc = concentration as { value: number; hold: "scale" | "volume" } | null;
  if (conc) {
    cond.concentrationM = conc.value;
    if (conc.hold === "scale") {
      cond.limitingMmol = r.scaleMmol;
      cond.finalVolumeUl = (1000 * r.scaleMmol) / conc.value;
    } else {
      cond.finalVolumeUl = baseVolumeUl;
      cond.limitingMmol = (conc.value * baseVolumeUl) / 1000;
    }
  } else if (r.concentrationM !== undefined) {
    cond.concentrationM = r.concentrationM;
    cond.finalVolumeUl = (1000 * r.scaleMmol) / r.concentrationM;
  } else {
    cond.finalVolumeUl = baseVolumeUl;
    cond.concentrationM = (1000 * r.scaleMmol) / baseVolumeUl;
  }

  const fixedNames = Object.keys(fixedFractions);
  if (fixedNames.length > 0) {
    const fixedSum = fixedNames.reduce((a, n) => a + (fixedFractions[n] ?? 0), 0);
    const free = r.solvents.filter((s) => !(s.name in fixedFractions));
    const freeBase = free.reduce((a, s) => a + s.volumeFraction, 0);
    const rest = 1 - fixedSum;
    if (rest < -1e-12 || (free.length === 0 && Math.abs(rest) > 1e-9) || (free.length > 0 && freeBase <= 0 && rest > 1e-12)) {
      problems.push({ key: "fraction-sum", run, message: `the solvent fractions set by the factors cannot be completed to 1 (the others would get ${rest})` });
    }
    for (const s of r.solvents) {
      cond.solventFractions[s.name] =
        s.name in fixedFractions
          ? (fixedFractions[s.name] ?? 0)
          : freeBase > 0
            ? Math.max(0, rest) * (s.volumeFraction / freeBase)
            : 0;
    }
  }
  return cond;
}

/** The amount of every component in one vial under `cond`. */
export function componentAmounts(infos: readonly ComponentInfo[], cond: RunConditions): ComponentAmount[] {
  const metalMmol: Record<string, number> = {};
  for (const info of infos) {
    const c = info.component;
    if (c.role === "catalyst") metalMmol[c.id] = ((cond.loadingMolPercent[c.id] ?? 0) / 100) * cond.limitingMmol;
  }
  const catalystIds = infos.filter((i) => i.component.role === "catalyst").map((i) => i.component.id);
  return infos.map((info) => {
    const c = info.component;
    let mmol: number;
    let loading: number | null = null;
    let ratio: number | null = null;
    if (c.role === "catalyst") {
      mmol = (metalMmol[c.id] ?? 0) / c.metalAtomsPerFormula;
      loading = cond.loadingMolPercent[c.id] ?? null;
    } else if (c.role === "ligand") {
      const cat = c.catalyst ?? catalystIds[0] ?? "";
      ratio = cond.ligandToMetalRatio[c.id] ?? 0;
      mmol = ratio * (metalMmol[cat] ?? 0);
    } else {
      mmol = (cond.equivalents[c.id] ?? 0) * cond.limitingMmol;
    }
    return { id: c.id, name: c.name, role: c.role, mmol, ...materialAmount(info, mmol), equivalents: mmol / cond.limitingMmol, loadingMolPercent: loading, ligandToMetalRatio: ratio };
  });
}

/**
 * Mass and volume of the material as supplied that contains `mmol` of the compound.
 * Solid: m/(purity/100), no volume. Neat liquid: the same mass, volume = mass/density.
 * Solution by molarity: V = 1000·n/M (µL), mass = V·density when known. Solution by
 * wt %: mass = m/(wt %/100), V = mass/density.
 */
export function materialAmount(info: ComponentInfo, mmol: number): { pureMassMg: number; massMg: number | null; volumeUl: number | null } {
  const pureMassMg = mmol * info.molarMassGPerMol;
  const form = info.component.form;
  if (form.state === "solid") return { pureMassMg, massMg: pureMassMg / (form.purityWtPercent / 100), volumeUl: null };
  if (form.state === "liquid") {
    const massMg = pureMassMg / (form.purityWtPercent / 100);
    return { pureMassMg, massMg, volumeUl: massMg / form.densityGPerMl };
  }
  if (form.molarityM !== undefined) {
    const volumeUl = (1000 * mmol) / form.molarityM;
    return { pureMassMg, massMg: form.densityGPerMl !== undefined ? volumeUl * form.densityGPerMl : null, volumeUl };
  }
  const massMg = pureMassMg / ((form.wtPercent ?? 100) / 100);
  return { pureMassMg, massMg, volumeUl: massMg / (form.densityGPerMl ?? 1) };
}
