/**
 * The hazard engine's input for a plan (interfaces.md `PlanCautionInput`), built from a
 * plan document and its run sheet: per run the temperature, time, final volume, the
 * solvent system, the gas the recipe declares, and every component with its hazard
 * flags and the volume dispensed into that vial.
 */
import type { LabThresholds } from "../hazards/thresholds";
import type { VesselType } from "../hazards/vessels";
import type { PlanDocument } from "./plan-document";
import type { RunSheet } from "./run-sheet";
import { solventFlags } from "./stoichiometry";
import { ulToMl } from "./units";

export interface CautionComponent {
  name: string;
  ghs: string[];
  pyrophoric?: boolean;
  waterReactive?: boolean;
  peroxideClass?: "A" | "B" | "C" | "D" | null;
  protic?: boolean;
  aqueous?: boolean;
  volumeUl?: number;
  openedOn?: string | null;
  peroxideTestedOn?: string | null;
}

export interface CautionRun {
  run: number;
  temperatureC: number;
  timeH?: number;
  liquidVolumeMl: number;
  solvents: Array<{ name: string; volumeFraction: number }>;
  gasReleasedMmol?: number;
  concentratesOrHeatsToDryness?: boolean;
  components: CautionComponent[];
}

export interface CautionInput {
  vessel: VesselType;
  thresholds: LabThresholds;
  equipment: { blockMaxC: number; coolingMinC: number };
  now?: string;
  runs: CautionRun[];
}

/**
 * Builds the caution input. A component's `volumeUl` is the volume of the dispense
 * that carries it (the stock, master mix or the liquid itself); solids have none.
 * GHS codes imply the flags: H250 pyrophoric; H260, H261, EUH014 water-reactive; other
 * flags are passed only when the plan declares them. Solvents of the system are listed
 * as components too (protic/aqueous defaults for water and the common alcohols, and the
 * container dates the plan gives), so the incompatibility and peroxide rules see them.
 */
export function buildCautionInput(doc: PlanDocument, sheet: RunSheet): CautionInput {
  const comps = doc.recipe.components;
  // The hazard profile of each component, the same in every run. Flags only as declared
  // (or implied by the GHS codes): the hazard engine falls back to its solvent records and
  // the GHS codes for what is not said here.
  const profiles: CautionComponent[] = comps.map((c) => {
    const ghs = new Set(c.hazards.ghs);
    const out: CautionComponent = {
      name: c.name,
      ghs: [...ghs],
      pyrophoric: c.hazards.pyrophoric ?? ghs.has("H250"),
      waterReactive: c.hazards.waterReactive ?? (ghs.has("H260") || ghs.has("H261") || ghs.has("EUH014")),
      openedOn: c.hazards.openedOn ?? null,
      peroxideTestedOn: c.hazards.peroxideTestedOn ?? null,
    };
    if (c.hazards.peroxideClass !== undefined) out.peroxideClass = c.hazards.peroxideClass;
    if (c.hazards.protic !== undefined) out.protic = c.hazards.protic;
    if (c.hazards.aqueous !== undefined) out.aqueous = c.hazards.aqueous;
    return out;
  });
  return {
    vessel: sheet.vessel,
    thresholds: doc.thresholds,
    equipment: { blockMaxC: doc.equipment.blockMaxC, coolingMinC: doc.equipment.coolingMinC },
    ...(doc.now !== undefined ? { now: doc.now } : {}),
    runs: sheet.runs.map((r) => {
      const components: CautionComponent[] = comps.map((c, ci) => {
        const row = r.components[ci]!;
        const carrier = r.dispense.find((d) => d.source === row.source);
        const out: CautionComponent = { ...profiles[ci]! };
        if (carrier && carrier.volumeUl !== null && carrier.kind !== "solid") out.volumeUl = carrier.volumeUl;
        return out;
      });
      for (const s of doc.recipe.solvents) {
        const sv = r.solvents.find((x) => x.name === s.name);
        if (!sv || sv.volumeFraction <= 0) continue;
        const flags = solventFlags(s);
        const solvent: CautionComponent = {
          name: s.name,
          ghs: s.ghs,
          protic: flags.protic,
          aqueous: flags.aqueous,
          openedOn: s.openedOn ?? null,
          peroxideTestedOn: s.peroxideTestedOn ?? null,
          volumeUl: sv.volumeUl,
        };
        if (s.peroxideClass !== undefined) solvent.peroxideClass = s.peroxideClass;
        components.push(solvent);
      }
      const run: CautionRun = {
        run: r.run,
        temperatureC: r.temperatureC,
        liquidVolumeMl: ulToMl(r.finalVolumeUl),
        solvents: liquidSolvents(doc, r),
        gasReleasedMmol: r.totals.gasReleasedMmol,
        concentratesOrHeatsToDryness: doc.recipe.concentratesOrHeatsToDryness,
        components,
      };
      if (r.timeH !== null) run.timeH = r.timeH;
      return run;
    }),
  };
}

/**
 * The solvents actually in a vial, by volume: the solvent system's volumes plus the
 * carrier solvent of every solution dispensed as supplied (`form.solvent`, e.g. the
 * hexanes of n-butyllithium), as fractions of their sum (ideal mixing, as the hazard
 * engine's Raoult's-law estimate assumes). Neat liquid reagents are solutes here.
 */
export function liquidSolvents(doc: PlanDocument, r: RunSheet["runs"][number]): Array<{ name: string; volumeFraction: number }> {
  const volumes = new Map<string, number>();
  for (const s of r.solvents) if (s.volumeUl > 0) volumes.set(s.name, (volumes.get(s.name) ?? 0) + s.volumeUl);
  for (const d of r.dispense) {
    if (d.kind !== "neat" || d.volumeUl === null) continue;
    const comp = doc.recipe.components.find((c) => c.id === d.source);
    const carrier = comp?.form.state === "solution" ? comp.form.solvent : undefined;
    if (carrier) volumes.set(carrier, (volumes.get(carrier) ?? 0) + d.volumeUl);
  }
  const total = [...volumes.values()].reduce((a, v) => a + v, 0);
  if (!(total > 0)) return r.solvents.filter((s) => s.volumeFraction > 0).map((s) => ({ name: s.name, volumeFraction: s.volumeFraction }));
  return [...volumes.entries()].map(([name, v]) => ({ name, volumeFraction: v / total }));
}
