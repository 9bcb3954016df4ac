/**
 * All caution rules for one run of a plan: the equipment range, the vial's pressure,
 * fill and fire rules, each component's own rules and the reactive-with-water rule.
 * `evaluatePlanCautions` calls it for every run of a plan; `runCautionEvaluator` for an
 * arbitrary point (the chemistry engine's `pointSafety`), so both use the same rules.
 */
import { todayIsoUtc } from "../iso-date";
import type { Firing } from "../run-checks";
import type { SolventRecord } from "../solvent-record";
import { solventCatalogue, type SolventCatalogue } from "../solvents";
import { ownFirings, wetPartnerFirings } from "./component-checks";
import { profileOf, solventMaterial, type HazardProfile, type Material } from "./hazard-profile";
import { cautionSettingsSchema, type CautionSettings, type CautionSettingsInput, type PlanComponent, type PlanRun } from "./schema";
import { equipmentFirings, evaluateVial, vialKey, type VialResult } from "./vial-checks";
import { parseOrThrow } from "../../errors/app-error";

interface CachedComponent {
  c: PlanComponent;
  concentrates: boolean;
  profile: HazardProfile;
  firings: Firing[];
}

/** What the rules need besides the run, prepared once per plan (with its caches). */
export interface CautionContext {
  settings: CautionSettings;
  catalogue: SolventCatalogue;
  /** ISO date the container ages are judged on. */
  today: string;
  find(name: string): SolventRecord | undefined;
  componentCache: Map<string, CachedComponent[]>;
  /** The same component objects seen again (runs built once and reused, e.g. by pointSafety). */
  componentSeen: [WeakMap<PlanComponent, CachedComponent>, WeakMap<PlanComponent, CachedComponent>];
  solventCache: Map<string, { profile: HazardProfile; firings: Firing[] }>;
}

/** Prepares the context of a plan's parsed settings. */
export function cautionContext(settings: CautionSettings): CautionContext {
  const catalogue = solventCatalogue(settings.labSolvents);
  const findCache = new Map<string, SolventRecord | undefined>();
  return {
    settings,
    catalogue,
    today: settings.now ?? todayIsoUtc(),
    find(name) {
      if (!findCache.has(name)) findCache.set(name, catalogue.find(name));
      return findCache.get(name);
    },
    componentCache: new Map(),
    componentSeen: [new WeakMap(), new WeakMap()],
    solventCache: new Map(),
  };
}

export interface RunEvaluation {
  vial: VialResult;
  /** Every firing of the run, in rule order. */
  firings: Firing[];
  /** The run's components with their profiles (same order as `run.components`). */
  components: Array<{ c: PlanComponent; profile: HazardProfile }>;
}

function sameStrings(a: readonly string[], b: readonly string[]): boolean {
  if (a.length !== b.length) return false;
  for (let i = 0; i < a.length; i++) if (a[i] !== b[i]) return false;
  return true;
}

/** A component seen before with the same hazards, dates and run treatment (compared field by field). */
function findCached(cache: Map<string, CachedComponent[]>, c: PlanComponent, concentrates: boolean): CachedComponent | undefined {
  const list = cache.get(c.name);
  if (!list) return undefined;
  for (const e of list) {
    const d = e.c;
    if (
      e.concentrates === concentrates &&
      d.pyrophoric === c.pyrophoric &&
      d.waterReactive === c.waterReactive &&
      d.peroxideClass === c.peroxideClass &&
      d.protic === c.protic &&
      d.aqueous === c.aqueous &&
      d.openedOn === c.openedOn &&
      d.peroxideTestedOn === c.peroxideTestedOn &&
      d.receivedOn === c.receivedOn &&
      d.expiresOn === c.expiresOn &&
      sameStrings(d.ghs, c.ghs)
    ) {
      return e;
    }
  }
  return undefined;
}

/** Whether a solvent record is already among the vial's materials. */
function listed(inVial: readonly HazardProfile[], r: SolventRecord): boolean {
  for (const h of inVial) if (h.record === r) return true;
  return false;
}

/**
 * Every caution rule for one run (see the module comment). `runIndex` names the run in
 * error paths (`runs.<i>.solvents`); `vialCache`, when given, shares the vial rules
 * between runs with the same conditions (a design repeats its levels).
 * @throws AppError invalid_input at `runs.<i>.solvents` when the fractions do not sum to 1.
 */
export function evaluateRun(ctx: CautionContext, run: PlanRun, runIndex: number, vialCache?: Map<string, VialResult>): RunEvaluation {
  const p = ctx.settings;
  const firings: Firing[] = equipmentFirings(run.temperatureC, p.equipment);
  let vial: VialResult | undefined;
  const key = vialCache ? vialKey(run) : "";
  if (vialCache) vial = vialCache.get(key);
  if (!vial) {
    vial = evaluateVial(ctx.catalogue, run, `runs.${runIndex}.solvents`, p, p.thresholds);
    vialCache?.set(key, vial);
  }
  for (const f of vial.firings) firings.push(f);

  // Materials in the vial: the components, plus solvents not listed as components. A
  // component's own rules depend only on what it is, its container dates and whether the
  // run concentrates it: computed once per such case.
  const concentrates = run.concentratesOrHeatsToDryness === true;
  const inVial: HazardProfile[] = [];
  const components: RunEvaluation["components"] = [];
  for (const c of run.components) {
    const seen = ctx.componentSeen[concentrates ? 1 : 0];
    let cached = seen.get(c) ?? findCached(ctx.componentCache, c, concentrates);
    if (cached) seen.set(c, cached);
    else {
      const profile = profileOf(c.name, c.ghs, c, ctx.find(c.name));
      const item: Material = { p: profile, openedOn: c.openedOn, peroxideTestedOn: c.peroxideTestedOn, receivedOn: c.receivedOn, expiresOn: c.expiresOn };
      cached = { c, concentrates, profile, firings: ownFirings(item, concentrates, p.thresholds, ctx.today) };
      const list = ctx.componentCache.get(c.name);
      if (!list) ctx.componentCache.set(c.name, [cached]);
      else if (list.length < 32) list.push(cached); // bounded: the scan stays short
      seen.set(c, cached);
    }
    for (const f of cached.firings) firings.push(f);
    inVial.push(cached.profile);
    components.push({ c, profile: cached.profile });
  }
  for (const part of vial.parts ?? []) {
    if (part.volumeFraction <= 0 || listed(inVial, part.record)) continue;
    const sk = `${part.record.id}\u0001${concentrates}`;
    let cached = ctx.solventCache.get(sk);
    if (!cached) {
      const item = solventMaterial(part.record);
      cached = { profile: item.p, firings: ownFirings(item, concentrates, p.thresholds, ctx.today) };
      ctx.solventCache.set(sk, cached);
    }
    for (const f of cached.firings) firings.push(f);
    inVial.push(cached.profile);
  }
  wetPartnerFirings(inVial, firings);
  return { vial, firings, components };
}

/**
 * The blocking cautions a run would raise, for runs built by the caller without
 * validation (fast: the settings are parsed once). Used for points of a factor space.
 * @throws AppError invalid_input for settings that do not validate.
 */
export function runCautionEvaluator(settings: CautionSettingsInput): (run: PlanRun) => Firing[] {
  const ctx = cautionContext(parseOrThrow(cautionSettingsSchema, settings, "The plan's hazard settings are not valid."));
  return (run) => evaluateRun(ctx, run, 0).firings;
}
