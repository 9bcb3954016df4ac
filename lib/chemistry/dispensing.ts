/**
 * Stock-solution and master-mix planning: how each component reaches each vial.
 *
 * Method (the usual practice of parallel reaction screening; common practice):
 * - components whose amount is the same in every run go into a master mix per stock
 *   solvent (unless marked "add separately"; pyrophoric and water-reactive components
 *   never join a mix, and never a stock in a protic or aqueous solvent);
 * - every other dissolved component gets its own stock; its concentration is at most
 *   its solubility, at most what the material itself can give (a neat liquid or a
 *   supplied solution), and low enough that the smallest dispense is at least the
 *   minimum pipettable volume;
 * - within each solvent of the solvent system the stocks of a run may not take more
 *   than that solvent's share of the final volume; the stocks of one solvent are then
 *   diluted together until the most crowded vial uses `stockFillFraction` of it, and
 *   the concentration is rounded down to two significant figures;
 * - a solvent top-up per solvent makes every vial's solvent volumes, and so its final
 *   volume, exactly what the run asks for;
 * - when the stocks of a solvent cannot fit, solids (auto mode) are taken out one by
 *   one, the largest first, and weighed into each vial instead (said in a note); when
 *   nothing can be taken out the plan is infeasible;
 * - prepared volume = needed × (1 + overage) + dead volume, raised when needed so that
 *   every weighed mass reaches the lab's minimum weighing mass (up to the largest
 *   stock volume), and rounded up to two significant figures.
 */
import { AppError } from "../errors/app-error";
import { niceDown, roundUp2 } from "./nice-numbers";
import type { Dispensing, PlanDocument } from "./plan-document";
import { materialAmount, solventFlags, type ComponentAmount, type ComponentInfo, type RunConditions } from "./stoichiometry";

/** One run's conditions and amounts (amounts in the order of the recipe's components). */
export interface RunAmounts {
  run: number;
  cond: RunConditions;
  amounts: ComponentAmount[];
}

/** A note on the plan: something the chemist must know or do. */
export interface PlanNote {
  code: string;
  severity: "info" | "warning";
  message: string;
  component?: string;
  runs: number[];
  remedy: string;
}

export interface StockMember {
  id: string;
  name: string;
  /** Concentration of the compound in the stock (mol/L). */
  concentrationM: number;
  /** Concentration of the pure compound (mg/mL). */
  concentrationMgPerMl: number;
  /** Amount in the prepared volume. */
  mmol: number;
  /** Mass of material as supplied to weigh (mg, purity-corrected); null for a solution given only by molarity. */
  weighMg: number | null;
  /** Volume of liquid or supplied solution to measure (µL); null for a solid. */
  measureUl: number | null;
}

export interface Stock {
  id: string;
  kind: "stock" | "master-mix";
  name: string;
  /** The solvent it is made up in (a solvent of the recipe). */
  solvent: string;
  members: StockMember[];
  /** Sum of every vial's dispense (µL). */
  neededVolumeUl: number;
  /** What to make up: needed × (1 + overage) + dead volume, rounded up (µL). */
  finalVolumeUl: number;
  overagePercent: number;
  deadVolumeUl: number;
  /** Master mix: the one volume dispensed into every vial (µL); otherwise null (volumes vary by run). */
  dispenseVolumeUl: number | null;
  notes: string[];
}

export interface Dispense {
  /** Position in the order of addition (1-based). */
  step: number;
  kind: "solid" | "solvent" | "stock" | "master-mix" | "neat";
  /** Stock id, component id or solvent name. */
  source: string;
  name: string;
  volumeUl: number | null;
  massMg: number | null;
  /** What this dispense puts into the vial. */
  delivers: Array<{ id: string; mmol: number }>;
  /** The solvent volume it brings (µL): stocks, master mixes and top-ups. */
  solvent: { name: string; volumeUl: number } | null;
}

export type DispenseMode = "stock" | "master-mix" | "solid" | "neat";

export interface DispensePlan {
  /** Per component: how it is dispensed and from which source. */
  modes: Array<{ id: string; mode: DispenseMode; source: string }>;
  stocks: Stock[];
  /** Per run (same order as the input runs): the dispense list in order of addition. */
  dispenses: Dispense[][];
  /** Per run: solvent volumes (µL) by solvent, including stocks and top-ups. */
  solventVolumesUl: Array<Record<string, number>>;
  /** Per run: top-up (µL) by solvent. */
  topUpsUl: Array<Record<string, number>>;
  notes: PlanNote[];
}

export interface Group {
  key: string;
  kind: "stock" | "master-mix";
  solvent: string;
  members: number[];
  /** Volume basis per run: volume(r) = basis[r] / K. */
  basis: number[];
  kMax: number;
  k: number;
}

const REL = 1e-9;

function isConstant(values: number[]): boolean {
  const first = values[0] ?? 0;
  return values.every((v) => Math.abs(v - first) <= REL * Math.max(Math.abs(first), 1e-300));
}

function fmt(x: number, digits = 3): string {
  return Number(x.toPrecision(digits)).toString();
}

/** Collects notes that apply to many runs into one note per (code, component). */
export class Notes {
  private map = new Map<string, PlanNote>();
  add(note: Omit<PlanNote, "runs">, run?: number | number[]): void {
    const key = `${note.code}|${note.component ?? ""}|${note.message}`;
    const runs = run === undefined ? [] : Array.isArray(run) ? run : [run];
    const existing = this.map.get(key) ?? { ...note, runs: [] };
    for (const r of runs) if (!existing.runs.includes(r)) existing.runs.push(r);
    this.map.set(key, existing);
  }
  list(): PlanNote[] {
    return [...this.map.values()];
  }
}

/** What every step of the dispensing plan works on. */
export interface DispensingContext {
  doc: PlanDocument;
  d: Dispensing;
  minPip: number;
  infos: readonly ComponentInfo[];
  runs: readonly RunAmounts[];
  notes: Notes;
  /** How each component is dispensed (changed by the steps as the plan is made). */
  mode: DispenseMode[];
  /** Volume (µL) of solvent `solvent` that run `ri` has for stocks and top-up. */
  budget: (ri: number, solvent: string) => number;
}

/**
 * Plans stocks, master mixes, solids and neat dispenses for all runs, in named steps:
 * {@link chooseModes}, {@link solventSystemVolumes}, {@link fitStocks} (with
 * {@link buildGroups}), {@link diluteStocks}, {@link nameGroups}, {@link vialDispenses}
 * and {@link prepareStock}.
 * @throws AppError("infeasible") naming the components and runs when the stocks of a
 *   solvent cannot fit into the vials, or neat liquids exceed the final volume.
 * @throws AppError("invalid_input") when a pyrophoric or water-reactive component is
 *   asked to be made into a stock in a protic or aqueous solvent.
 */
export function planDispensing(doc: PlanDocument, infos: readonly ComponentInfo[], runs: readonly RunAmounts[]): DispensePlan {
  const ctx = dispensingContext(doc, infos, runs);
  const { notes, mode } = ctx;
  const groups = fitStocks(ctx);
  diluteStocks(ctx, groups);
  const sourceOf = nameGroups(groups, mode);
  const { dispenses, solventVolumesUl, topUpsUl } = vialDispenses(ctx, groups);
  const stocks: Stock[] = groups.map((g) => prepareStock(g, infos, runs, ctx.d, notes));
  const modes = infos.map((info) => ({
    id: info.component.id,
    mode: mode[info.index]!,
    source: sourceOf.get(info.index) ?? info.component.id,
  }));
  return { modes, stocks, dispenses, solventVolumesUl, topUpsUl, notes: notes.list() };
}

/**
 * Steps 1 and 2 ({@link chooseModes}, {@link solventSystemVolumes}): the context the
 * later steps work on.
 * @throws AppError as those steps do.
 */
export function dispensingContext(doc: PlanDocument, infos: readonly ComponentInfo[], runs: readonly RunAmounts[]): DispensingContext & { systemVolume: number[] } {
  const notes = new Notes();
  const mode = chooseModes(doc, infos, runs, notes);
  const systemVolume = solventSystemVolumes(infos, runs, mode);
  return {
    doc,
    d: doc.dispensing,
    minPip: doc.dispensing.minPipetteVolumeUl,
    infos,
    runs,
    notes,
    mode,
    systemVolume,
    budget: (ri, solvent) => (runs[ri]!.cond.solventFractions[solvent] ?? 0) * systemVolume[ri]!,
  };
}

/**
 * Step 1: how each component is dispensed before stocks are fitted — as the plan says,
 * or (auto) solids and neat liquids into solution, a supplied solution as supplied unless
 * some vial would get less than the minimum pipettable volume, and pyrophoric or
 * water-reactive liquids as supplied, alone.
 */
export function chooseModes(doc: PlanDocument, infos: readonly ComponentInfo[], runs: readonly RunAmounts[], notes: Notes): DispenseMode[] {
  const minPip = doc.dispensing.minPipetteVolumeUl;
  const solventsByName = new Map(doc.recipe.solvents.map((s) => [s.name, s]));
  const mode: DispenseMode[] = infos.map((info) => {
    const c = info.component;
    const reactive = info.pyrophoric || info.waterReactive;
    const sf = solventFlags(solventsByName.get(info.stockSolvent) ?? { name: info.stockSolvent });
    const badSolvent = reactive && (sf.protic || sf.aqueous);
    if (c.dispense === "stock" && badSolvent) {
      throw AppError.field(
        `recipe.components.${info.index}.stockSolvent`,
        `${c.name} is pyrophoric or water-reactive and is never premixed with a protic or aqueous solvent (${info.stockSolvent})`,
      );
    }
    if (c.dispense === "solid") return "solid";
    if (c.dispense === "neat") return "neat";
    if (c.dispense === "stock") return "stock";
    if (c.form.state === "solid") {
      if (badSolvent) {
        notes.add({
          code: "reactive_solid_per_vial",
          severity: "info",
          component: c.id,
          message: `${c.name} is weighed into each vial: it is pyrophoric or water-reactive and its stock solvent ${info.stockSolvent} is protic or aqueous.`,
          remedy: "Weigh it under inert atmosphere, or name an aprotic stock solvent.",
        });
        return "solid";
      }
      return "stock";
    }
    if (reactive) return "neat";
    if (c.form.state === "solution") {
      const vols = runs.map((r) => r.amounts[info.index]!.volumeUl ?? 0);
      return Math.min(...vols) >= minPip ? "neat" : "stock";
    }
    return "stock";
  });
  infos.forEach((info) => {
    if ((info.pyrophoric || info.waterReactive) && mode[info.index] === "neat") {
      notes.add({
        code: "reactive_added_separately",
        severity: "info",
        component: info.component.id,
        message: `${info.component.name} is pyrophoric or water-reactive: dispensed as supplied, separately, never premixed.`,
        remedy: "Transfer by gas-tight syringe under inert gas; add it last.",
      });
    }
  });

  return mode;
}

/**
 * Step 2: the volume of the solvent system in each run — the final volume less the
 * liquids dispensed as supplied.
 * @throws AppError("infeasible") when those liquids alone exceed the final volume.
 */
export function solventSystemVolumes(infos: readonly ComponentInfo[], runs: readonly RunAmounts[], mode: readonly DispenseMode[]): number[] {
  const neatVolume = (ri: number) =>
    infos.reduce((a, info) => a + (mode[info.index] === "neat" ? (runs[ri]!.amounts[info.index]!.volumeUl ?? 0) : 0), 0);
  const systemVolume = runs.map((r, ri) => r.cond.finalVolumeUl - neatVolume(ri));
  const overfull = runs.filter((_, ri) => systemVolume[ri]! < 0).map((r) => r.run);
  if (overfull.length > 0) {
    const names = infos.filter((i) => mode[i.index] === "neat").map((i) => i.component.name);
    throw new AppError(
      "infeasible",
      `The liquids dispensed as supplied (${names.join(", ")}) take more than the final volume in runs ${overfull.join(", ")}.`,
      [{ path: "recipe.concentrationM", message: `runs ${overfull.join(", ")}: lower the concentration or raise the final volume` }],
    );
  }

  return systemVolume;
}

/**
 * The stocks and master mixes of the components in solution: one per component, or shared
 * by components of one stock solvent whose amounts are constant (a master mix) or in
 * proportion over the runs (a premix).
 */
export function buildGroups(ctx: DispensingContext): Group[] {
  const { infos, runs, mode, minPip } = ctx;
  const mmolOf = (ci: number) => runs.map((r) => r.amounts[ci]!.mmol);
  const groups: Group[] = [];
  // Components that may share a solution, keyed by stock solvent and by the profile of
  // their amounts over the runs (constant, or proportional to each other, such as a
  // catalyst and its ligand at a fixed ratio).
  const shared: Array<{ solvent: string; profile: number[]; members: number[] }> = [];
  for (const info of infos) {
    if (mode[info.index] !== "stock" && mode[info.index] !== "master-mix") continue;
    const c = info.component;
    const reactive = info.pyrophoric || info.waterReactive;
    if (c.addSeparately || reactive) {
      groups.push(singleGroup(info, runs, minPip));
      continue;
    }
    const n = mmolOf(info.index);
    const profile = n.map((v) => v / n[0]!);
    const same = shared.find(
      (s) => s.solvent === info.stockSolvent && s.profile.every((v, ri) => Math.abs(v - profile[ri]!) <= REL * Math.max(Math.abs(v), 1e-300)),
    );
    if (same) same.members.push(info.index);
    else shared.push({ solvent: info.stockSolvent, profile, members: [info.index] });
  }
  for (const { solvent, members } of shared) {
    if (members.length === 1) {
      groups.push(singleGroup(infos[members[0]!]!, runs, minPip));
      continue;
    }
    const lead = mmolOf(members[0]!);
    const basis = lead.map((v) => v / lead[0]!);
    const constant = isConstant(lead);
    // One solution for all members: volume(r) = basis(r) · v0 with v0 ≥ minPip / min basis,
    // ≥ 1000·n/solubility and ≥ Σ 1000·n/intrinsic (liquids and supplied solutions), n in run 1.
    let v0 = minPip / Math.min(...basis);
    let liquidSum = 0;
    for (const m of members) {
      const info = infos[m]!;
      const n = runs[0]!.amounts[m]!.mmol;
      if (Number.isFinite(info.solubilityM)) v0 = Math.max(v0, (1000 * n) / info.solubilityM);
      if (Number.isFinite(info.intrinsicMaxM)) liquidSum += (1000 * n) / info.intrinsicMaxM;
    }
    v0 = Math.max(v0, liquidSum);
    groups.push({ key: "", kind: constant ? "master-mix" : "stock", solvent, members, basis, kMax: 1 / v0, k: 1 / v0 });
  }
  return groups;
}

/** A stock of one component: as concentrated as its solubility, the material and the minimum pipettable volume allow. */
function singleGroup(info: ComponentInfo, runs: readonly RunAmounts[], minPip: number): Group {
  const basis = runs.map((r) => 1000 * r.amounts[info.index]!.mmol);
  const kMax = Math.min(info.solubilityM, info.intrinsicMaxM, Math.min(...basis) / minPip);
  return { key: "", kind: "stock", solvent: info.stockSolvent, members: [info.index], basis, kMax, k: kMax };
}

/**
 * Step 3: the groups, fitted into each solvent's share of every vial. While the stocks of
 * a solvent do not fit, the auto-mode solid that uses most volume in the crowded runs is
 * taken out of solution and weighed per vial (with a note).
 * @throws AppError("infeasible") when nothing can be taken out and the stocks still do not fit.
 */
export function fitStocks(ctx: DispensingContext): Group[] {
  const { infos, runs, mode, notes, budget } = ctx;
  const nRuns = runs.length;
  let groups = buildGroups(ctx);
  for (;;) {
    const over: Array<{ solvent: string; ri: number; need: number; have: number }> = [];
    for (const solvent of new Set(groups.map((g) => g.solvent))) {
      const gs = groups.filter((g) => g.solvent === solvent);
      for (let ri = 0; ri < nRuns; ri++) {
        const need = gs.reduce((a, g) => a + g.basis[ri]! / g.kMax, 0);
        const have = budget(ri, solvent);
        if (need > have * (1 + 1e-9)) over.push({ solvent, ri, need, have });
      }
    }
    if (over.length === 0) break;
    // Take the auto-mode solid that uses most volume in the crowded runs out of solution.
    const crowded = new Map<string, boolean[]>();
    for (const o of over) {
      const flags = crowded.get(o.solvent) ?? new Array<boolean>(nRuns).fill(false);
      flags[o.ri] = true;
      crowded.set(o.solvent, flags);
    }
    let best: { index: number; volume: number } | null = null;
    for (const g of groups) {
      for (const m of g.members) {
        const info = infos[m]!;
        if (info.component.dispense !== "auto" || info.component.form.state !== "solid") continue;
        const flags = crowded.get(g.solvent);
        if (!flags) continue;
        const limit = Math.min(info.solubilityM, info.intrinsicMaxM);
        let volume = 0;
        for (let ri = 0; ri < nRuns; ri++) {
          if (!flags[ri]) continue;
          volume += g.members.length === 1 ? g.basis[ri]! / g.kMax : Number.isFinite(limit) ? (1000 * runs[ri]!.amounts[m]!.mmol) / limit : 0;
        }
        if (volume > 0 && (!best || volume > best.volume)) best = { index: m, volume };
      }
    }
    if (!best) {
      const first = over[0]!;
      const gs = groups.filter((g) => g.solvent === first.solvent);
      const parts = gs
        .map((g) => ({ g, v: g.basis[first.ri]! / g.kMax }))
        .sort((a, b) => b.v - a.v)
        .map(({ g, v }) => `${g.members.map((m) => infos[m]!.component.name).join(" + ")} ${fmt(v)} µL`);
      const runList = [...new Set(over.filter((o) => o.solvent === first.solvent).map((o) => runs[o.ri]!.run))].sort((a, b) => a - b);
      const componentIds = gs.flatMap((g) => g.members.map((m) => infos[m]!.component.id));
      throw new AppError(
        "infeasible",
        `The stocks in ${first.solvent} do not fit into the vials: run ${runs[first.ri]!.run} needs at least ${fmt(first.need)} µL of ${first.solvent} for ${parts.join(", ")}, but has ${fmt(first.have)} µL (runs affected: ${runList.join(", ")}). Raise the final volume (lower the concentration), raise that solvent's fraction, or check the solubility limits.`,
        componentIds.map((id) => ({
          path: `recipe.components.${infos.findIndex((i) => i.component.id === id)}`,
          message: `${id}: stock in ${first.solvent} does not fit in runs ${runList.join(", ")}`,
        })),
      );
    }
    const info = infos[best.index]!;
    mode[best.index] = "solid";
    const crowdedRuns = [...new Set(over.filter((o) => o.solvent === info.stockSolvent).map((o) => runs[o.ri]!.run))].sort((a, b) => a - b);
    const sol = info.component.solubilityMgPerMl;
    notes.add({
      code: "solid_per_vial_solubility",
      severity: "warning",
      component: info.component.id,
      message: `${info.component.name} is weighed into each vial as a solid: ${
        sol !== undefined ? `at its solubility of ${fmt(sol)} mg/mL in ${info.stockSolvent}` : "even at the highest concentration allowed"
      } a stock would need more ${info.stockSolvent} than the vial has.`,
      remedy: "Weigh it per vial (or use a solid-dispensing aid); raising the final volume would allow a stock.",
    }, crowdedRuns);
    groups = buildGroups(ctx);
  }

  return groups;
}

/**
 * Step 4: dilutes each solvent's stocks together until the most crowded vial uses
 * `stockFillFraction` of that solvent, and rounds each concentration down to two
 * significant figures (kept only if every vial still fits).
 */
export function diluteStocks(ctx: DispensingContext, groups: Group[]): void {
  const { d, runs, budget } = ctx;
  const nRuns = runs.length;
  const alpha = d.stockFillFraction;
  for (const solvent of new Set(groups.map((g) => g.solvent))) {
    const gs = groups.filter((g) => g.solvent === solvent);
    let lambda = Infinity;
    for (let ri = 0; ri < nRuns; ri++) {
      const need = gs.reduce((a, g) => a + g.basis[ri]! / g.kMax, 0);
      if (need > 0) lambda = Math.min(lambda, (alpha * budget(ri, solvent)) / need);
    }
    if (!Number.isFinite(lambda) || lambda < 1) lambda = 1;
    for (const g of gs) {
      const k = g.kMax / lambda;
      if (g.members.length === 1) g.k = Math.min(niceDown(k), g.kMax);
      else {
        // Round the lead member's concentration down; the others keep their ratio to it.
        const lead = 1000 * runs[0]!.amounts[g.members[0]!]!.mmol;
        g.k = Math.min(niceDown(lead * k) / lead, g.kMax);
      }
      if (g.k > g.kMax) g.k = g.kMax;
    }
    const fits = (ri: number) => gs.reduce((a, g) => a + g.basis[ri]! / g.k, 0) <= budget(ri, solvent) * (1 + 1e-9);
    let ok = true;
    for (let ri = 0; ri < nRuns; ri++) if (!fits(ri)) ok = false;
    if (!ok) for (const g of gs) g.k = g.kMax / lambda;
  }
}

/** Step 5: ids (S1, S2 … for stocks, MM1 … for master mixes) and the source of each component in solution. */
export function nameGroups(groups: Group[], mode: DispenseMode[]): Map<number, string> {
  let sCount = 0;
  let mCount = 0;
  for (const g of groups) {
    g.key = g.kind === "master-mix" ? `MM${++mCount}` : `S${++sCount}`;
  }

  const sourceOf = new Map<number, string>();
  for (const g of groups) for (const m of g.members) {
    sourceOf.set(m, g.key);
    mode[m] = g.kind === "master-mix" ? "master-mix" : "stock";
  }
  return sourceOf;
}

/**
 * Step 6: every vial's dispense list in order of addition (solids, top-ups, master
 * mixes, stocks, catalyst and ligand stocks, liquids as supplied, reactive reagents last;
 * `addOrder` overrides), with the solvent top-ups that give every vial its solvent
 * volumes, and the notes on masses and volumes below the lab's limits.
 */
export function vialDispenses(ctx: DispensingContext, groups: readonly Group[]): Pick<DispensePlan, "dispenses" | "solventVolumesUl" | "topUpsUl"> {
  const { doc, d, minPip, infos, runs, notes, mode, budget } = ctx;
  const nRuns = runs.length;
  const defaultRank = (info: ComponentInfo, m: DispenseMode): number => {
    if (m === "solid") return 100;
    if (m === "master-mix") return 300;
    if (m === "neat") return info.pyrophoric || info.waterReactive ? 700 : 500;
    return info.component.role === "catalyst" || info.component.role === "ligand" ? 450 : 400;
  };
  const topUpRank = 200;
  const dispenses: Dispense[][] = [];
  const solventVolumesUl: Array<Record<string, number>> = [];
  const topUpsUl: Array<Record<string, number>> = [];
  // Per group, computed once: rank in the order of addition, name, member concentrations.
  const groupFacts = groups.map((g) => ({
    rank: Math.min(...g.members.map((m) => infos[m]!.component.addOrder ?? defaultRank(infos[m]!, g.kind))),
    order: g.members[0]!,
    name: groupName(g, infos),
    members: g.members.map((m) => ({ id: infos[m]!.component.id, c: concentrationOf(g, m, runs) })),
  }));
  for (let ri = 0; ri < nRuns; ri++) {
    const r = runs[ri]!;
    const items: Array<{ rank: number; order: number; d: Dispense }> = [];
    const fromStocks: Record<string, number> = {};
    groups.forEach((g, gi) => {
      const v = g.basis[ri]! / g.k;
      const facts = groupFacts[gi]!;
      fromStocks[g.solvent] = (fromStocks[g.solvent] ?? 0) + v;
      items.push({
        rank: facts.rank,
        order: facts.order,
        d: {
          step: 0,
          kind: g.kind,
          source: g.key,
          name: facts.name,
          volumeUl: v,
          massMg: null,
          delivers: facts.members.map((m) => ({ id: m.id, mmol: (v * m.c) / 1000 })),
          solvent: { name: g.solvent, volumeUl: v },
        },
      });
    });
    for (const info of infos) {
      const m = mode[info.index]!;
      const a = r.amounts[info.index]!;
      if (m === "solid") {
        items.push({
          rank: info.component.addOrder ?? defaultRank(info, m),
          order: info.index,
          d: { step: 0, kind: "solid", source: info.component.id, name: info.component.name, volumeUl: null, massMg: a.massMg, delivers: [{ id: a.id, mmol: a.mmol }], solvent: null },
        });
        if (d.minWeighMassMg > 0 && (a.massMg ?? 0) < d.minWeighMassMg) {
          notes.add(
            {
              code: "below_min_weighing_mass",
              severity: "warning",
              component: info.component.id,
              message: `${info.component.name}: the per-vial mass is below the lab's minimum weighing mass of ${fmt(d.minWeighMassMg)} mg.`,
              remedy:
                info.component.form.state === "solid" && mode[info.index] === "solid" && info.component.dispense === "solid"
                  ? "Dose it from a stock solution (set dispense to auto or stock), or weigh on a more sensitive balance."
                  : "Dose it from a stock solution in a solvent that dissolves it, raise the scale, or use a solid-dispensing aid.",
            },
            r.run,
          );
        }
      } else if (m === "neat") {
        items.push({
          rank: info.component.addOrder ?? defaultRank(info, m),
          order: info.index,
          d: { step: 0, kind: "neat", source: info.component.id, name: info.component.name, volumeUl: a.volumeUl, massMg: a.massMg, delivers: [{ id: a.id, mmol: a.mmol }], solvent: null },
        });
        if ((a.volumeUl ?? 0) < minPip * (1 - 1e-9)) {
          notes.add(
            {
              code: "below_min_pipette_volume",
              severity: "warning",
              component: info.component.id,
              message: `${info.component.name}: the volume dispensed as supplied is below the minimum pipettable volume of ${fmt(minPip)} µL.`,
              remedy: info.pyrophoric || info.waterReactive
                ? "Use a gas-tight microsyringe, a more dilute commercial solution, or a larger scale."
                : "Make a stock solution (dispense auto or stock), or raise the scale.",
            },
            r.run,
          );
        }
      }
    }
    const volumes: Record<string, number> = {};
    const tops: Record<string, number> = {};
    doc.recipe.solvents.forEach((s, si) => {
      const want = budget(ri, s.name);
      let top = want - (fromStocks[s.name] ?? 0);
      if (top < 0 && top > -1e-6 * Math.max(want, 1)) top = 0;
      if (top < 0) throw new AppError("internal", `Negative ${s.name} top-up (${top} µL) in run ${r.run}: the stock plan is inconsistent.`);
      tops[s.name] = top;
      volumes[s.name] = want;
      if (top > 0) {
        items.push({
          rank: topUpRank,
          order: si,
          d: { step: 0, kind: "solvent", source: s.name, name: `${s.name} (top-up)`, volumeUl: top, massMg: null, delivers: [], solvent: { name: s.name, volumeUl: top } },
        });
        if (top < minPip * (1 - 1e-9)) {
          notes.add(
            {
              code: "topup_below_min_pipette_volume",
              severity: "warning",
              message: `The ${s.name} top-up is below the minimum pipettable volume of ${fmt(minPip)} µL.`,
              remedy: "Dispense it with a positive-displacement pipette or microsyringe, or adjust the final volume.",
            },
            r.run,
          );
        }
      }
    });
    items.sort((a, b) => a.rank - b.rank || a.order - b.order);
    dispenses.push(
      items.map((it, i) => {
        it.d.step = i + 1;
        return it.d;
      }),
    );
    solventVolumesUl.push(volumes);
    topUpsUl.push(tops);
  }
  return { dispenses, solventVolumesUl, topUpsUl };
}

/** Concentration (M) of member m in group g: 1000·n(r)·K/basis(r), the same in every run. */
function concentrationOf(g: Group, m: number, runs: readonly RunAmounts[]): number {
  const n = runs[0]!.amounts[m]!.mmol;
  return (1000 * n * g.k) / g.basis[0]!;
}

function groupName(g: Group, infos: readonly ComponentInfo[]): string {
  const names = g.members.map((m) => infos[m]!.component.name);
  if (g.members.length === 1) return `${names[0]} in ${g.solvent}`;
  return `${g.kind === "master-mix" ? "Master mix" : "Premix"} (${names.join(", ")}) in ${g.solvent}`;
}

function prepareStock(g: Group, infos: readonly ComponentInfo[], runs: readonly RunAmounts[], d: Dispensing, notes: Notes): Stock {
  const needed = runs.reduce((a, _r, ri) => a + g.basis[ri]! / g.k, 0);
  let prep = needed * (1 + d.overagePercent / 100) + d.deadVolumeUl;
  const stockNotes: string[] = [];
  const conc = g.members.map((m) => concentrationOf(g, m, runs));
  const maxUl = d.maxStockVolumeMl * 1000;
  // Smallest weighed mass / measured volume at this volume, and the factor to reach the limits.
  let raise = 1;
  g.members.forEach((m, j) => {
    const info = infos[m]!;
    const amt = materialAmount(info, (conc[j]! * prep) / 1000);
    if (info.component.form.state === "solid" && d.minWeighMassMg > 0 && (amt.massMg ?? 0) < d.minWeighMassMg) {
      raise = Math.max(raise, d.minWeighMassMg / (amt.massMg ?? d.minWeighMassMg));
    }
    if (info.component.form.state !== "solid" && (amt.volumeUl ?? 0) < d.minPipetteVolumeUl) {
      raise = Math.max(raise, d.minPipetteVolumeUl / (amt.volumeUl ?? d.minPipetteVolumeUl));
    }
  });
  if (raise > 1) {
    const raised = prep * raise;
    if (raised <= maxUl) {
      stockNotes.push(`Made up larger than needed so that every weighed mass is at least ${fmt(d.minWeighMassMg)} mg and every measured volume at least ${fmt(d.minPipetteVolumeUl)} µL.`);
      prep = raised;
    } else {
      prep = Math.max(prep, maxUl);
      for (const m of g.members) {
        notes.add({
          code: "stock_below_min_weighing_mass",
          severity: "warning",
          component: infos[m]!.component.id,
          message: `${g.key} (${groupName(g, infos)}): even at the largest stock volume of ${fmt(d.maxStockVolumeMl)} mL the amount to weigh or measure is below the lab's minimum.`,
          remedy: "Prepare a more concentrated primary stock and dilute it (serial dilution), or weigh on a more sensitive balance.",
        });
      }
    }
  }
  prep = roundUp2(prep);
  if (prep > maxUl) stockNotes.push(`Larger than ${fmt(d.maxStockVolumeMl)} mL: prepare it in portions.`);
  const members: StockMember[] = g.members.map((m, j) => {
    const info = infos[m]!;
    const mmol = (conc[j]! * prep) / 1000;
    const amt = materialAmount(info, mmol);
    if (info.component.solubilityMgPerMl === undefined && info.component.form.state === "solid") {
      stockNotes.push(`Solubility of ${info.component.name} in ${g.solvent} not given: check that ${fmt(conc[j]! * info.molarMassGPerMol)} mg/mL dissolves.`);
    }
    return {
      id: info.component.id,
      name: info.component.name,
      concentrationM: conc[j]!,
      concentrationMgPerMl: conc[j]! * info.molarMassGPerMol,
      mmol,
      weighMg: amt.massMg,
      measureUl: info.component.form.state === "solid" ? null : amt.volumeUl,
    };
  });
  return {
    id: g.key,
    kind: g.kind,
    name: groupName(g, infos),
    solvent: g.solvent,
    members,
    neededVolumeUl: needed,
    finalVolumeUl: prep,
    overagePercent: d.overagePercent,
    deadVolumeUl: d.deadVolumeUl,
    dispenseVolumeUl: g.kind === "master-mix" ? 1 / g.k : null,
    notes: stockNotes,
  };
}
