/**
 * The run sheet of a plan: per run and component mmol, mg and µL; the stocks and master
 * mixes to prepare; the per-vial dispense list in order of addition; per-run totals;
 * and the total needed of every chemical (what inventory reserves).
 */
import { AppError } from "../errors/app-error";
import type { VesselType } from "../hazards/vessels";
import type { ResolvedRun } from "./design-runs";
import { planDispensing, type Dispense, type DispenseMode, type PlanNote, type RunAmounts, type Stock } from "./dispensing";
import type { Dispensing, PlanDocument } from "./plan-document";
import { componentAmounts, runConditions, type ComponentAmount, type ComponentInfo, type RunProblem } from "./stoichiometry";
import { validatePlan } from "./validate-plan";

export interface RunSheetComponent extends ComponentAmount {
  dispensedAs: DispenseMode;
  /** Stock / master-mix id, or the component's own id for solids and neat liquids. */
  source: string;
}

export interface RunSheetRun {
  run: number;
  standardOrder: number;
  runOrder: number;
  kind: string;
  block: number | string | null;
  coded: Record<string, number>;
  natural: Record<string, number>;
  temperatureC: number;
  timeH: number | null;
  stirringRpm: number | null;
  concentrationM: number;
  limitingMmol: number;
  finalVolumeUl: number;
  solvents: Array<{ name: string; volumeFraction: number; volumeUl: number; topUpUl: number }>;
  components: RunSheetComponent[];
  dispense: Dispense[];
  totals: {
    finalVolumeUl: number;
    /** Sum of every liquid dispensed (µL): equals the final volume. */
    dispensedVolumeUl: number;
    solidMassMg: number;
    gasReleasedMmol: number;
    /** Final volume / vessel total volume, at room temperature. */
    fillFraction: number;
  };
}

export interface InventoryLine {
  kind: "component" | "solvent";
  id: string;
  name: string;
  formula: string | null;
  casNumber: string | null;
  /** Amount of compound needed (mmol), null for solvents. */
  mmol: number | null;
  /** Mass of material as supplied to take (mg), null when only a volume is known. */
  massMg: number | null;
  /** Volume of liquid, supplied solution or solvent to take (µL), null for solids. */
  volumeUl: number | null;
}

export interface RunSheet {
  name: string | null;
  vessel: VesselType;
  dispensing: Dispensing;
  components: Array<{ id: string; name: string; role: string; molarMassGPerMol: number; dispensedAs: DispenseMode; source: string }>;
  runs: RunSheetRun[];
  stocks: Stock[];
  inventory: InventoryLine[];
  notes: PlanNote[];
}

/** The final volumes (µL) a vessel takes: its working range, capped by its maximum fill at room temperature. */
export function vesselVolumeRangeUl(vessel: VesselType): { minUl: number; maxUl: number } {
  return { minUl: vessel.workingMinMl * 1000, maxUl: Math.min(vessel.workingMaxMl, vessel.maxFillFraction * vessel.totalVolumeMl) * 1000 };
}

/** Whether a final volume leaves the vessel's range (with the run sheet's tolerance of 1e-9). */
export function vesselVolumeProblem(vessel: VesselType, finalVolumeUl: number): "above" | "below" | null {
  const { minUl, maxUl } = vesselVolumeRangeUl(vessel);
  if (finalVolumeUl > maxUl * (1 + 1e-9)) return "above";
  if (finalVolumeUl < minUl * (1 - 1e-9)) return "below";
  return null;
}

/** Gas released in a vial (mmol): Σ gasReleasedMolPerMol × mmol of each component. */
export function gasReleased(infos: readonly ComponentInfo[], amounts: readonly ComponentAmount[]): number {
  return infos.reduce((a, info) => a + (info.component.gasReleasedMolPerMol ?? 0) * amounts[info.index]!.mmol, 0);
}

function groupProblems(problems: RunProblem[]): AppError {
  const byKey = new Map<string, { p: RunProblem; runs: number[] }>();
  for (const p of problems) {
    const e = byKey.get(p.key) ?? { p, runs: [] };
    if (!e.runs.includes(p.run)) e.runs.push(p.run);
    byKey.set(p.key, e);
  }
  const parts = [...byKey.values()].map(({ p, runs }) => `${p.message} in runs ${runs.sort((a, b) => a - b).join(", ")}`);
  return new AppError(
    "infeasible",
    `Some runs ask for impossible amounts: ${parts.join("; ")}. Narrow the factor range or use a smaller axial distance.`,
    [...byKey.values()].map(({ p, runs }) => ({ path: "factors", message: `${p.component ? `${p.component}: ` : ""}${p.message} (runs ${runs.join(", ")})` })),
  );
}

/**
 * Builds the run sheet of a plan document (see the module comment). Accepts a parsed
 * document or raw JSON (parsed with `planDocumentSchema`).
 * @throws AppError("invalid_input") with dotted paths for a document that does not
 *   validate; AppError("infeasible") naming components and runs when amounts would be
 *   non-positive, a vial's final volume leaves the vessel's working range or maximum
 *   fill, or the stocks cannot fit.
 */
export function buildRunSheet(input: unknown): RunSheet {
  const { doc, vessel, infos, runs } = validatePlan(input);
  return buildFromRuns(doc, vessel, infos, runs);
}

/** As {@link buildRunSheet}, for a parsed document and resolved runs. */
export function buildFromRuns(doc: PlanDocument, vessel: VesselType, infos: ComponentInfo[], resolved: ResolvedRun[]): RunSheet {
  const problems: RunProblem[] = [];
  const runs: RunAmounts[] = resolved.map((r) => {
    const cond = runConditions(doc, r.natural, r.standardOrder, problems);
    return { run: r.standardOrder, cond, amounts: componentAmounts(infos, cond) };
  });
  if (problems.length > 0) throw groupProblems(problems);

  // Vessel working range and maximum fill at room temperature.
  const { minUl, maxUl } = vesselVolumeRangeUl(vessel);
  const tooMuch = runs.filter((r) => vesselVolumeProblem(vessel, r.cond.finalVolumeUl) === "above");
  const tooLittle = runs.filter((r) => vesselVolumeProblem(vessel, r.cond.finalVolumeUl) === "below");
  if (tooMuch.length > 0 || tooLittle.length > 0) {
    const parts: string[] = [];
    if (tooMuch.length > 0) {
      parts.push(
        `runs ${tooMuch.map((r) => r.run).join(", ")} need up to ${Math.max(...tooMuch.map((r) => r.cond.finalVolumeUl))} µL, above the ${maxUl} µL the ${vessel.name} may hold (working volume and maximum fill)`,
      );
    }
    if (tooLittle.length > 0) {
      parts.push(
        `runs ${tooLittle.map((r) => r.run).join(", ")} have as little as ${Math.min(...tooLittle.map((r) => r.cond.finalVolumeUl))} µL, below the vessel's working minimum of ${minUl} µL`,
      );
    }
    // The field that sets the volume: a concentration factor holding the scale (low
    // concentration, large volume), else the recipe's scale.
    const ci = doc.factors.findIndex((f) => f.binding.kind === "concentration" && f.binding.hold === "scale");
    const path = ci >= 0 ? `factors.${ci}.${tooMuch.length > 0 ? "low" : "high"}` : "recipe.scaleMmol";
    throw new AppError("infeasible", `The final volume does not suit the vessel: ${parts.join("; ")}. Change the scale, the concentration or the vessel.`, [
      { path, message: parts.join("; ") },
    ]);
  }

  const plan = planDispensing(doc, infos, runs);
  const modeOf = new Map(plan.modes.map((m) => [m.id, m]));
  const modes = plan.modes;

  const sheetRuns: RunSheetRun[] = runs.map((r, ri) => {
    const res = resolved[ri]!;
    const dispense = plan.dispenses[ri]!;
    const dispensedVolumeUl = dispense.reduce((a, d) => a + (d.kind === "solid" ? 0 : (d.volumeUl ?? 0)), 0);
    const solidMassMg = dispense.reduce((a, d) => a + (d.kind === "solid" ? (d.massMg ?? 0) : 0), 0);
    const gasReleasedMmol = gasReleased(infos, r.amounts);
    return {
      run: r.run,
      standardOrder: res.standardOrder,
      runOrder: res.runOrder,
      kind: res.kind,
      block: res.block,
      coded: res.coded,
      natural: res.natural,
      temperatureC: r.cond.temperatureC,
      timeH: r.cond.timeH,
      stirringRpm: r.cond.stirringRpm,
      concentrationM: r.cond.concentrationM,
      limitingMmol: r.cond.limitingMmol,
      finalVolumeUl: r.cond.finalVolumeUl,
      solvents: doc.recipe.solvents.map((s) => ({
        name: s.name,
        volumeFraction: r.cond.solventFractions[s.name] ?? 0,
        volumeUl: plan.solventVolumesUl[ri]![s.name] ?? 0,
        topUpUl: plan.topUpsUl[ri]![s.name] ?? 0,
      })),
      components: r.amounts.map((a, ci) => {
        // The amounts are this function's own objects: extend them in place rather than copy.
        const row = a as RunSheetComponent;
        row.dispensedAs = modes[ci]!.mode;
        row.source = modes[ci]!.source;
        return row;
      }),
      dispense,
      totals: {
        finalVolumeUl: r.cond.finalVolumeUl,
        dispensedVolumeUl,
        solidMassMg,
        gasReleasedMmol,
        fillFraction: r.cond.finalVolumeUl / 1000 / vessel.totalVolumeMl,
      },
    };
  });

  return {
    name: doc.name ?? null,
    vessel,
    dispensing: doc.dispensing,
    components: infos.map((info) => ({
      id: info.component.id,
      name: info.component.name,
      role: info.component.role,
      molarMassGPerMol: info.molarMassGPerMol,
      dispensedAs: modeOf.get(info.component.id)!.mode,
      source: modeOf.get(info.component.id)!.source,
    })),
    runs: sheetRuns,
    stocks: plan.stocks,
    inventory: inventory(doc, infos, sheetRuns, plan.stocks),
    notes: plan.notes,
  };
}

/**
 * Total needed of every chemical: stocks as prepared (with overage and dead volume),
 * solids as weighed per vial, liquids dispensed as supplied and solvent top-ups plus
 * overage and one dead volume, and the volume of every stock made up in each solvent
 * (an upper bound on that solvent: the solutes take part of the volume).
 */
function inventory(doc: PlanDocument, infos: ComponentInfo[], runs: RunSheetRun[], stocks: Stock[]): InventoryLine[] {
  const d = doc.dispensing;
  const over = 1 + d.overagePercent / 100;
  // One pass over every vial's dispenses: solids weighed and liquids taken as supplied.
  const directTotals = new Map<string, { solidMmol: number; solidMassMg: number | null; neatMmol: number; neatVolumeUl: number; neatMassMg: number | null }>();
  for (const r of runs) {
    for (const dsp of r.dispense) {
      if (dsp.kind !== "solid" && dsp.kind !== "neat") continue;
      const t = directTotals.get(dsp.source) ?? { solidMmol: 0, solidMassMg: 0, neatMmol: 0, neatVolumeUl: 0, neatMassMg: 0 };
      const mm = dsp.delivers[0]?.mmol ?? 0;
      if (dsp.kind === "solid") {
        t.solidMmol += mm;
        t.solidMassMg = t.solidMassMg === null || dsp.massMg === null ? null : t.solidMassMg + dsp.massMg;
      } else {
        t.neatMmol += mm;
        t.neatVolumeUl += dsp.volumeUl ?? 0;
        t.neatMassMg = t.neatMassMg === null || dsp.massMg === null ? null : t.neatMassMg + dsp.massMg;
      }
      directTotals.set(dsp.source, t);
    }
  }
  const lines: InventoryLine[] = infos.map((info) => {
    const c = info.component;
    let mmol = 0;
    let massMg: number | null = 0;
    let volumeUl: number | null = c.form.state === "solid" ? null : 0;
    const add = (m: number, mass: number | null, vol: number | null) => {
      mmol += m;
      massMg = massMg === null || mass === null ? null : massMg + mass;
      if (volumeUl !== null) volumeUl = vol === null ? volumeUl : volumeUl + vol;
    };
    for (const s of stocks) for (const m of s.members) if (m.id === c.id) add(m.mmol, m.weighMg, m.measureUl);
    const direct = directTotals.get(c.id);
    if (direct) add(direct.solidMmol, direct.solidMassMg, null);
    const neatVol = direct?.neatVolumeUl ?? 0;
    const neatMass = direct?.neatMassMg ?? null;
    const neatMmol = direct?.neatMmol ?? 0;
    if (neatVol > 0) {
      const factor = (neatVol * over + d.deadVolumeUl) / neatVol;
      add(neatMmol * factor, neatMass === null ? null : neatMass * factor, neatVol * factor);
    }
    return {
      kind: "component",
      id: c.id,
      name: c.name,
      formula: c.formula ?? null,
      casNumber: c.casNumber ?? null,
      mmol,
      massMg,
      volumeUl,
    };
  });
  for (const s of doc.recipe.solvents) {
    const topUps = runs.reduce((a, r) => a + (r.solvents.find((x) => x.name === s.name)?.topUpUl ?? 0), 0);
    const fromStocks = stocks.filter((st) => st.solvent === s.name).reduce((a, st) => a + st.finalVolumeUl, 0);
    const volumeUl = (topUps > 0 ? topUps * over + d.deadVolumeUl : 0) + fromStocks;
    lines.push({ kind: "solvent", id: s.name, name: s.name, formula: null, casNumber: null, mmol: null, massMg: null, volumeUl });
  }
  return lines;
}
