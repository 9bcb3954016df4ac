/**
 * Checks of a run sheet that hold for every feasible plan, recomputed here from the
 * stocks' concentrations and the dispense volumes alone (not from the engine's own
 * per-dispense bookkeeping), against the values each run's factors ask for.
 */
import { expect } from "vitest";
import type { PlanDocument } from "@/lib/chemistry/plan-document";
import type { RunSheet } from "@/lib/chemistry/run-sheet";

/** Walks a JSON value and fails on any NaN, infinite or negative number. */
export function expectNoBadNumbers(value: unknown, path = ""): void {
  if (typeof value === "number") {
    expect(Number.isFinite(value), `${path} is ${value}`).toBe(true);
    // Coded values are negative by design; every amount, volume and mass must not be.
    if (!/\.coded\./.test(path) && !/temperatureC$/.test(path) && !/coolingMinC$/.test(path)) {
      expect(value, path).toBeGreaterThanOrEqual(0);
    }
    return;
  }
  if (Array.isArray(value)) value.forEach((v, i) => expectNoBadNumbers(v, `${path}.${i}`));
  else if (value && typeof value === "object") for (const [k, v] of Object.entries(value)) expectNoBadNumbers(v, `${path}.${k}`);
}

/** What each component actually receives in each vial (mmol), from the dispense list. */
export function deliveredMmol(doc: PlanDocument, sheet: RunSheet, runIndex: number): Record<string, number> {
  const run = sheet.runs[runIndex]!;
  const out: Record<string, number> = {};
  const add = (id: string, mmol: number) => (out[id] = (out[id] ?? 0) + mmol);
  for (const d of run.dispense) {
    if (d.kind === "stock" || d.kind === "master-mix") {
      const stock = sheet.stocks.find((s) => s.id === d.source)!;
      // mmol = c (mol/L = mmol/mL) × V (µL) / 1000
      for (const m of stock.members) add(m.id, (m.concentrationM * d.volumeUl!) / 1000);
    } else if (d.kind === "solid") {
      const comp = doc.recipe.components.find((c) => c.id === d.source)!;
      const mw = sheet.components.find((c) => c.id === d.source)!.molarMassGPerMol;
      const purity = comp.form.state === "solid" ? comp.form.purityWtPercent : 100;
      add(d.source, (d.massMg! * (purity / 100)) / mw);
    } else if (d.kind === "neat") {
      const comp = doc.recipe.components.find((c) => c.id === d.source)!;
      const mw = sheet.components.find((c) => c.id === d.source)!.molarMassGPerMol;
      if (comp.form.state === "liquid") add(d.source, (d.volumeUl! * comp.form.densityGPerMl * (comp.form.purityWtPercent / 100)) / mw);
      else if (comp.form.state === "solution" && comp.form.molarityM !== undefined) add(d.source, (comp.form.molarityM * d.volumeUl!) / 1000);
    }
  }
  return out;
}

/** Decodes a coded value linearly (u = u0 + x·Δu, Montgomery §6.2), computed here independently. */
function decode(low: number, high: number, x: number, scale: string): number {
  if (scale === "log") return Math.exp((Math.log(high) + Math.log(low)) / 2 + (x * (Math.log(high) - Math.log(low))) / 2);
  return (high + low) / 2 + (x * (high - low)) / 2;
}

/**
 * The stock-planning invariants (issue 4): every liquid dispense ≥ the minimum volume,
 * equal final volumes when concentration is not a factor, delivered amounts reproducing
 * each run's decoded factor values within 0.5 %, prepared amounts including overage and
 * dead volume, stock concentrations within solubility.
 */
export function expectStockInvariants(doc: PlanDocument, sheet: RunSheet): void {
  const d = doc.dispensing;
  const limiting = doc.recipe.limitingReagent;
  const concentrationIsFactor = doc.factors.some((f) => f.binding.kind === "concentration");
  const finals = new Set<string>();
  sheet.runs.forEach((run, ri) => {
    // 1. Every liquid dispense at least the minimum pipettable volume — or flagged in a
    //    note for that component (or top-up) and run.
    for (const dsp of run.dispense) {
      if (dsp.kind === "solid") continue;
      const flagged = sheet.notes.some(
        (n) =>
          n.runs.includes(run.run) &&
          ((n.code === "below_min_pipette_volume" && n.component === dsp.source) || (n.code === "topup_below_min_pipette_volume" && dsp.kind === "solvent")),
      );
      if (!flagged) expect(dsp.volumeUl!, `run ${run.run} ${dsp.name}`).toBeGreaterThanOrEqual(d.minPipetteVolumeUl * (1 - 1e-9));
    }
    // 2. The liquids add up to the final volume.
    const total = run.dispense.reduce((a, x) => a + (x.kind === "solid" ? 0 : x.volumeUl!), 0);
    expect(total / run.finalVolumeUl).toBeCloseTo(1, 9);
    finals.add(run.finalVolumeUl.toPrecision(9));
    // 3. Delivered amounts reproduce the decoded factor values within 0.5 %.
    const got = deliveredMmol(doc, sheet, ri);
    const nLim = got[limiting]!;
    const neatVolume = run.dispense.filter((x) => x.kind === "neat").reduce((a, x) => a + x.volumeUl!, 0);
    for (const f of doc.factors) {
      const x = run.coded[f.name]!;
      const want = decode(f.low, f.high, x, f.scale);
      let measured: number;
      const b = f.binding;
      if (b.kind === "temperature") measured = run.temperatureC;
      else if (b.kind === "equivalents") measured = got[b.component]! / nLim;
      else if (b.kind === "loading") {
        const comp = doc.recipe.components.find((c) => c.id === b.component)!;
        measured = ((got[b.component]! * comp.metalAtomsPerFormula) / nLim) * 100; // mol % metal
      } else if (b.kind === "ligand-ratio") {
        const lig = doc.recipe.components.find((c) => c.id === b.component)!;
        const cat = doc.recipe.components.find((c) => c.id === (lig.catalyst ?? doc.recipe.components.find((k) => k.role === "catalyst")!.id))!;
        measured = got[b.component]! / (got[cat.id]! * cat.metalAtomsPerFormula);
      } else if (b.kind === "solvent-fraction") {
        // Volume of that solvent (stocks made up in it + top-up) over the solvent-system volume.
        const vol = run.dispense.filter((x) => x.solvent?.name === b.solvent).reduce((a, x) => a + x.solvent!.volumeUl, 0);
        const fraction = vol / (run.finalVolumeUl - neatVolume);
        measured = f.unit === "vol%" || f.unit === "%" ? fraction * 100 : fraction;
      } else if (b.kind === "concentration") measured = (1000 * nLim) / total;
      else continue;
      expect(Math.abs(measured - want) / Math.abs(want), `run ${run.run} factor ${f.name}: ${measured} vs ${want}`).toBeLessThanOrEqual(0.005);
    }
  });
  if (!concentrationIsFactor) expect(finals.size).toBe(1);
  // 4. Prepared amounts include overage and dead volume; concentrations within solubility.
  for (const s of sheet.stocks) {
    const needed = sheet.runs.reduce((a, r) => a + r.dispense.filter((x) => x.source === s.id).reduce((b, x) => b + x.volumeUl!, 0), 0);
    expect(s.neededVolumeUl / needed).toBeCloseTo(1, 9);
    expect(s.finalVolumeUl).toBeGreaterThanOrEqual(needed * (1 + d.overagePercent / 100) + d.deadVolumeUl - 1e-9);
    for (const m of s.members) {
      expect(m.mmol / ((m.concentrationM * s.finalVolumeUl) / 1000)).toBeCloseTo(1, 9);
      const comp = doc.recipe.components.find((c) => c.id === m.id)!;
      if (comp.solubilityMgPerMl !== undefined) expect(m.concentrationMgPerMl).toBeLessThanOrEqual(comp.solubilityMgPerMl * (1 + 1e-9));
    }
  }
  expectNoBadNumbers(sheet);
}
