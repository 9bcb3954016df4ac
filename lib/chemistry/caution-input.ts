/**
 * The hazard engine's input for a plan (lib/hazards `planCautionInputSchema`), built from
 * a plan document and its run sheet: per run the temperature, time, final volume, the
 * solvent system, the gas the recipe declares, and every component with its hazard
 * flags, its container's dates and the volume dispensed into that vial. The types are
 * the hazard engine's own (z.input of its schemas), not a copy.
 */
import type { PlanCautionComponentInput, PlanCautionInput, PlanCautionRunInput } from "../hazards/plan-cautions/schema";
import type { VesselType } from "../hazards/vessels";
import type { PlanDocument } from "./plan-document";
import type { RunSheet } from "./run-sheet";
import { solventFlags } from "./stoichiometry";
import { ulToMl } from "./units";

export type CautionComponent = PlanCautionComponentInput;
/** A run of the hazard engine's input, with its components always listed. */
export type CautionRun = PlanCautionRunInput & { components: CautionComponent[] };
export type CautionInput = Omit<PlanCautionInput, "runs"> & { runs: CautionRun[] };

/**
 * Builds the caution input. A component's `volumeUl` is the volume of the dispense
 * that carries it (the stock, master mix or the liquid itself); solids have none.
 * Flags are passed as the plan declares them; the hazard engine applies the GHS
 * statements (lib/hazards/hazard-flags.ts) and its solvent records. Solvents of the system are listed
 * as components too (protic/aqueous defaults for water and the common alcohols, and the
 * container dates the plan gives), so the incompatibility and peroxide rules see them.
 */
export function buildCautionInput(doc: PlanDocument, sheet: RunSheet): CautionInput {
  const profiles = cautionProfiles(doc);
  return { ...cautionSettings(doc, sheet.vessel), runs: sheet.runs.map((r) => cautionRun(doc, profiles, r)) };
}

/** Everything of the caution input except the runs. */
export function cautionSettings(doc: PlanDocument, vessel: VesselType): Omit<CautionInput, "runs"> {
  return {
    vessel,
    thresholds: doc.thresholds,
    equipment: { blockMaxC: doc.equipment.blockMaxC, coolingMinC: doc.equipment.coolingMinC },
    ...(doc.now !== undefined ? { now: doc.now } : {}),
  };
}

/**
 * The hazard profile of each recipe component, the same in every run: flags only as
 * declared; the hazard engine applies the GHS statements and its solvent records.
 */
export function cautionProfiles(doc: PlanDocument): CautionProfiles {
  return {
    components: doc.recipe.components.map((c) => ({ name: c.name, ...cautionHazards(c.hazards) })),
    solvents: doc.recipe.solvents.map((s) => {
      const flags = solventFlags(s);
      return {
        name: s.name,
        ...cautionHazards({ ghs: s.ghs, peroxideClass: s.peroxideClass, openedOn: s.openedOn, peroxideTestedOn: s.peroxideTestedOn, receivedOn: s.receivedOn, expiresOn: s.expiresOn }),
        protic: flags.protic,
        aqueous: flags.aqueous,
      };
    }),
  };
}

/** The hazard profiles of a plan's components and of its solvents (in recipe order). */
export interface CautionProfiles {
  components: CautionComponent[];
  solvents: CautionComponent[];
}

/** What `cautionRun` reads of a run-sheet run (a point's own run has the same fields). */
export type CautionRunSource = Pick<RunSheet["runs"][number], "run" | "temperatureC" | "timeH" | "finalVolumeUl" | "solvents" | "dispense" | "totals"> & {
  components: ReadonlyArray<{ source: string }>;
};

/**
 * One run of the caution input: its conditions and every component in the vial, with the
 * volume dispensed of each (`withVolumes: false` leaves the volumes out — they matter only
 * to the plan-wide second-person rule — and reuses the profile objects themselves).
 */
export function cautionRun(doc: PlanDocument, profiles: CautionProfiles, r: CautionRunSource, withVolumes = true): CautionRun {
  const components: CautionComponent[] = doc.recipe.components.map((_c, ci) => {
    const profile = profiles.components[ci]!;
    if (!withVolumes) return profile;
    const row = r.components[ci]!;
    const carrier = r.dispense.find((d) => d.source === row.source);
    return carrier && carrier.volumeUl !== null && carrier.kind !== "solid" ? { ...profile, volumeUl: carrier.volumeUl } : profile;
  });
  doc.recipe.solvents.forEach((s, si) => {
    const sv = r.solvents.find((x) => x.name === s.name);
    if (!sv || sv.volumeFraction <= 0) return;
    components.push(withVolumes ? { ...profiles.solvents[si]!, volumeUl: sv.volumeUl } : profiles.solvents[si]!);
  });
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
}

/**
 * The solvents actually in a vial, by volume: the solvent system's volumes plus the
 * carrier solvent of every solution dispensed as supplied (`form.solvent`, e.g. the
 * hexanes of n-butyllithium), as fractions of their sum (ideal mixing, as the hazard
 * engine's Raoult's-law estimate assumes). Neat liquid reagents are solutes here.
 */
export function liquidSolvents(doc: PlanDocument, r: Pick<RunSheet["runs"][number], "solvents" | "dispense">): Array<{ name: string; volumeFraction: number }> {
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

/**
 * The hazard fields of a component or solvent as the hazard engine takes them: flags and
 * dates only where stated (an opening date not given is "not recorded", which the
 * peroxide rule reports for a peroxide former).
 */
export function cautionHazards(h: PlanDocument["recipe"]["components"][number]["hazards"]): Omit<CautionComponent, "name"> {
  const out: Omit<CautionComponent, "name"> = { ghs: [...h.ghs] };
  if (h.openedOn !== undefined) out.openedOn = h.openedOn;
  if (h.peroxideTestedOn !== undefined) out.peroxideTestedOn = h.peroxideTestedOn;
  if (h.pyrophoric !== undefined) out.pyrophoric = h.pyrophoric;
  if (h.waterReactive !== undefined) out.waterReactive = h.waterReactive;
  if (h.peroxideClass !== undefined) out.peroxideClass = h.peroxideClass;
  if (h.protic !== undefined) out.protic = h.protic;
  if (h.aqueous !== undefined) out.aqueous = h.aqueous;
  if (h.receivedOn !== undefined) out.receivedOn = h.receivedOn;
  if (h.expiresOn !== undefined) out.expiresOn = h.expiresOn;
  return out;
}
