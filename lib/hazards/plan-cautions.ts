/**
 * The cautions of a whole plan: every rule of caution-rules.ts applied to every run,
 * merged into one caution per rule and component listing the runs it touches, plus the
 * sign-off decision and the per-run pressure estimates. Called by the chemistry
 * engine's `plan` verb (../shared/CONTRACT.md) and by the app's safety review.
 */
import { z } from "zod";
import { AppError, parseOrThrow } from "../errors/app-error";
import {
  CAUTION_RULES,
  PLANNING_NOTICE,
  SIGN_OFF_RULES,
  compareCautions,
  type Caution,
  type CautionCode,
  type Severity,
} from "./caution-rules";
import { fireFirings, fmt, pressureFirings, type Firing } from "./run-checks";
import { estimateSealedVessel } from "./sealed-vessel";
import { peroxideClassSchema, solventRecordSchema, type PeroxideClass, type SolventRecord } from "./solvent-record";
import { FRACTION_SUM_TOLERANCE, resolveSolventSystem, solventShareSchema } from "./solvent-system";
import { solventCatalogue, type SolventCatalogue } from "./solvents";
import { equipmentSchema, labThresholdsSchema, type LabThresholds } from "./thresholds";
import { ATM_BAR, type MixturePart } from "./vapor-pressure";
import { vesselTypeSchema } from "./vessels";

const isoDate = z
  .string()
  .refine((s) => /^\d{4}-\d{2}-\d{2}/.test(s) && !Number.isNaN(Date.parse(s)), "not an ISO date (YYYY-MM-DD)");

// Per-run schemas keep only the checks that matter: they are parsed once per vial and
// component (a 1536-vial plate has ~10⁴ components).
export const planComponentSchema = z.object({
  name: z.string().min(1),
  /** GHS hazard statements, e.g. ["H225", "H250", "H261", "H314"] (unchecked strings: unknown ones are ignored). */
  ghs: z.array(z.string()).default([]),
  pyrophoric: z.boolean().optional(),
  waterReactive: z.boolean().optional(),
  peroxideClass: peroxideClassSchema.nullable().optional(),
  protic: z.boolean().optional(),
  aqueous: z.boolean().optional(),
  /** Volume of this component dispensed into this vial (µL). */
  volumeUl: z.number().min(0).optional(),
  /** Date the container was opened; null = unopened; absent = not recorded. */
  openedOn: isoDate.nullable().optional(),
  peroxideTestedOn: isoDate.nullable().optional(),
  /** Date an unopened container was received (for the lab's unopened-container interval). */
  receivedOn: isoDate.nullable().optional(),
});

export const planRunSchema = z.object({
  /** The run's standard order. */
  run: z.number().int(),
  temperatureC: z.number().gt(-273.15, "temperature must be above absolute zero (−273.15 °C)").max(3000),
  timeH: z.number().min(0).optional(),
  /** Final liquid volume in the vial (mL). */
  liquidVolumeMl: z.number().positive(),
  solvents: z.array(solventShareSchema),
  gasReleasedMmol: z.number().min(0).optional(),
  concentratesOrHeatsToDryness: z.boolean().optional(),
  components: z.array(planComponentSchema).default([]),
});

export const planCautionInputSchema = z.object({
  vessel: vesselTypeSchema,
  thresholds: labThresholdsSchema,
  equipment: equipmentSchema,
  /** ISO date for container ages; default today. */
  now: isoDate.optional(),
  /** Conditions at sealing (default 25 °C, 1 atm). */
  sealTemperatureC: z.number().gt(-273.15).max(500).default(25),
  sealPressureBar: z.number().positive().max(1000).default(ATM_BAR),
  /** The lab's own solvent records, on top of the built-in ones. */
  labSolvents: z.array(solventRecordSchema).max(500).optional(),
  runs: z.array(planRunSchema).max(100000),
});

export type PlanCautionInput = z.input<typeof planCautionInputSchema>;
export type PlanComponent = z.output<typeof planComponentSchema>;
export type { Caution } from "./caution-rules";

export interface PlanCautionReport {
  cautions: Caution[];
  signOffRequired: boolean;
  signOffReasons: string[];
  releasable: boolean;
  perRun: Array<{ run: number; totalBar: number | null; vaporBar: number | null; fillFractionHot: number | null }>;
  notice: string;
}

const DAYS_PER_MONTH = 30.4375;
const MS_PER_DAY = 86_400_000;

interface Entry {
  code: CautionCode;
  severity: Severity;
  component?: string;
  runs: number[];
  worstScore: number;
  leastScore: number;
  worstRun: number;
  message: () => string;
}

class CautionAccumulator {
  private readonly entries = new Map<string, Map<string, Entry>>();
  /** The run that `push` files firings under. */
  current = 0;

  push(f: Firing): void {
    this.add(this.current, f);
  }

  add(run: number, f: Firing): void {
    let byComponent = this.entries.get(f.code);
    if (!byComponent) {
      byComponent = new Map();
      this.entries.set(f.code, byComponent);
    }
    const component = f.component ?? "";
    const e = byComponent.get(component);
    if (!e) {
      byComponent.set(component, {
        code: f.code,
        severity: f.severity,
        ...(f.component ? { component: f.component } : {}),
        runs: [run],
        worstScore: f.score,
        leastScore: f.score,
        worstRun: run,
        message: f.message,
      });
      return;
    }
    if (e.runs[e.runs.length - 1] !== run) e.runs.push(run);
    if (f.score < e.leastScore) e.leastScore = f.score;
    if (f.score > e.worstScore) {
      e.worstScore = f.score;
      e.worstRun = run;
      e.message = f.message;
    }
    if (f.severity === "blocking" || (f.severity === "warning" && e.severity === "info")) e.severity = f.severity;
  }

  cautions(): Caution[] {
    return [...this.entries.values()]
      .flatMap((m) => [...m.values()])
      .map((e): Caution => {
        const runs = sortedUnique(e.runs);
        const where = runs.length > 1 && e.worstScore > e.leastScore ? ` Worst case: run ${e.worstRun} of ${runs.length} runs.` : "";
        return {
          code: e.code,
          severity: e.severity,
          runs,
          ...(e.component ? { component: e.component } : {}),
          message: e.message() + where,
          remedy: CAUTION_RULES[e.code].remedy,
        };
      })
      .sort(compareCautions);
  }
}

function cmrKinds(cmr: readonly string[]): string {
  return [
    cmr.some((g) => g.startsWith("H340")) ? "mutagenic" : "",
    cmr.some((g) => g.startsWith("H350")) ? "carcinogenic" : "",
    cmr.some((g) => g.startsWith("H360")) ? "toxic to reproduction" : "",
  ]
    .filter(Boolean)
    .join(", ");
}

/** The run numbers in ascending order without repeats (usually already so: no copy made). */
function sortedUnique(runs: number[]): number[] {
  let ordered = true;
  for (let i = 1; i < runs.length && ordered; i++) ordered = runs[i - 1]! < runs[i]!;
  if (ordered) return runs;
  return [...new Set(runs)].sort((a, b) => a - b);
}

/** GHS statements (H250, H360FD, …) match by their three-digit stem. */
function hasStatement(ghs: readonly string[], stems: readonly string[]): string[] {
  return ghs.filter((g) => stems.some((s) => g.startsWith(s)));
}

/** What is fixed about a component whatever the run: its hazards. */
interface HazardProfile {
  name: string;
  key: string;
  /** The solvent record it is, if any. */
  record: SolventRecord | undefined;
  ghs: string[];
  pyrophoric: boolean;
  waterReactive: boolean;
  /** "unclassified" when EUH019 is stated without a class. */
  peroxideClass: PeroxideClass | "unclassified" | null;
  protic: boolean;
  aqueous: boolean;
  /** H260/H261 statements, and the CMR statements H340/H350/H360 (with suffixes). */
  waterCodes: string[];
  cmrCodes: string[];
}

/** A component as it is in one vial. */
interface Material {
  p: HazardProfile;
  volumeUl: number;
  openedOn: string | null | undefined;
  peroxideTestedOn: string | null | undefined;
  receivedOn?: string | null | undefined;
}

function profileOf(
  name: string,
  statements: readonly string[],
  flags: { pyrophoric?: boolean; waterReactive?: boolean; peroxideClass?: PeroxideClass | null; protic?: boolean; aqueous?: boolean },
  record: SolventRecord | undefined,
): HazardProfile {
  const ghs = [...new Set([...statements.map((g) => g.toUpperCase()), ...(record?.ghs.value ?? [])])];
  const declared = flags.peroxideClass ?? record?.peroxideClass?.value ?? null;
  const waterCodes = hasStatement(ghs, ["H260", "H261"]);
  return {
    name,
    key: record ? `solvent:${record.id}` : `name:${name.trim().toLowerCase()}`,
    record,
    ghs,
    pyrophoric: flags.pyrophoric === true || hasStatement(ghs, ["H250"]).length > 0,
    waterReactive: flags.waterReactive === true || waterCodes.length > 0,
    peroxideClass: declared ?? (ghs.includes("EUH019") ? "unclassified" : null),
    protic: flags.protic ?? record?.protic ?? false,
    aqueous: flags.aqueous ?? record?.aqueous ?? false,
    waterCodes,
    cmrCodes: hasStatement(ghs, ["H340", "H350", "H360"]),
  };
}

const solventMaterials = new WeakMap<SolventRecord, Material>();

/** A solvent of the vial that is not listed among its components (no container data). */
function solventMaterial(r: SolventRecord): Material {
  let m = solventMaterials.get(r);
  if (!m) {
    m = { p: profileOf(r.name, [], {}, r), volumeUl: 0, openedOn: undefined, peroxideTestedOn: undefined };
    solventMaterials.set(r, m);
  }
  return m;
}

/** Test interval (months) for a peroxide class; unclassified formers get the shortest one. */
function intervalMonths(t: LabThresholds, cls: PeroxideClass | "unclassified"): number {
  const i = t.peroxideTestIntervalMonths;
  return cls === "unclassified" ? Math.min(i.A, i.B, i.C, i.D) : i[cls];
}

const dateCache = new Map<string, number>();

function ageMonths(nowMs: number, iso: string): number {
  let ms = dateCache.get(iso);
  if (ms === undefined) {
    ms = Date.parse(iso);
    if (dateCache.size > 10000) dateCache.clear();
    dateCache.set(iso, ms);
  }
  return (nowMs - ms) / MS_PER_DAY / DAYS_PER_MONTH;
}

/**
 * Evaluates every caution rule for every run of a plan (rules and codes in
 * caution-rules.ts; pressure model of REFERENCE.md §2 in sealed-vessel.ts; peroxide
 * intervals after Prudent Practices in the Laboratory, NRC 2011, as lab thresholds).
 * One caution per rule and component, listing every run it touches; `releasable` is
 * false whenever a caution is blocking; sign-off is required for a run at or above the
 * lab's sign-off temperature (TL-S01), any pyrophoric reagent (TL-S02) and any sealed
 * run above the solvent's boiling point (TL-S03).
 * @throws AppError invalid_input with dotted paths (e.g. `runs.3.temperatureC`,
 * `runs.0.solvents` for fractions not summing to 1) when the input does not validate.
 */
export function evaluatePlanCautions(input: PlanCautionInput): PlanCautionReport {
  const p = parseOrThrow(planCautionInputSchema, input, "The plan's hazard input is not valid.");
  const catalogue = solventCatalogue(p.labSolvents);
  const t = p.thresholds;
  const nowMs = p.now ? Date.parse(p.now) : Date.now();
  const acc = new CautionAccumulator();
  const perRun: PlanCautionReport["perRun"] = [];
  const findCache = new Map<string, SolventRecord | undefined>();
  const find = (name: string): SolventRecord | undefined => {
    if (!findCache.has(name)) findCache.set(name, catalogue.find(name));
    return findCache.get(name);
  };
  const reactiveTotals = new Map<string, { name: string; ul: number; runs: Set<number> }>();
  const pyrophoricNames = new Set<string>();
  const aboveBoiling = new Set<number>();
  let hottest = -Infinity;
  const hotRuns: number[] = [];
  const vialCache = new Map<string, VialResult>();
  const componentCache = new Map<string, CachedComponent[]>();
  const solventCache = new Map<string, { profile: HazardProfile; firings: Firing[] }>();

  p.runs.forEach((run, i) => {
    const T = run.temperatureC;
    acc.current = run.run;

    // Equipment limits.
    if (T > p.equipment.blockMaxC) {
      acc.push({ code: "TL-T01", severity: "warning", score: T, message: () => `${fmt(T, 1)} °C is above the heating block's maximum of ${fmt(p.equipment.blockMaxC, 1)} °C.` });
    }
    if (T < p.equipment.coolingMinC) {
      acc.push({ code: "TL-T02", severity: "warning", score: -T, message: () => `${fmt(T, 1)} °C is below the cooling method's minimum of ${fmt(p.equipment.coolingMinC, 1)} °C.` });
    }
    if (T >= t.signOffTemperatureC) {
      hotRuns.push(run.run);
      hottest = Math.max(hottest, T);
    }

    // Solvent system, pressure, fire data: the same conditions give the same answer,
    // so each distinct vial is computed once (a design repeats its levels).
    let key = `${T}/${run.liquidVolumeMl}/${run.gasReleasedMmol ?? 0}`;
    for (const x of run.solvents) key += `\u0001${x.name}\u0002${x.volumeFraction}`;
    let vial = vialCache.get(key);
    if (!vial) {
      vial = evaluateVial(catalogue, run, `runs.${i}.solvents`, p, t);
      vialCache.set(key, vial);
    }
    for (const f of vial.firings) {
      acc.push(f);
      if (f.code === "TL-V01") aboveBoiling.add(run.run);
    }
    const row = { run: run.run, totalBar: vial.totalBar, vaporBar: vial.vaporBar, fillFractionHot: vial.fillFractionHot };
    perRun.push(row);

    // Materials in the vial: the components, plus solvents not listed as components.
    // A component's own rules (R01, R02, X01–X03, H01) depend only on what it is, its
    // container dates and whether the run concentrates it: computed once per such case.
    const concentrates = run.concentratesOrHeatsToDryness === true;
    const inVial: HazardProfile[] = [];
    for (const c of run.components) {
      let cached = findCached(componentCache, c, concentrates);
      if (!cached) {
        const profile = profileOf(c.name, c.ghs, c, find(c.name));
        const item: Material = { p: profile, volumeUl: 0, openedOn: c.openedOn, peroxideTestedOn: c.peroxideTestedOn, receivedOn: c.receivedOn };
        cached = { c, concentrates, profile, firings: ownFirings(item, concentrates, t, nowMs) };
        const list = componentCache.get(c.name);
        if (!list) componentCache.set(c.name, [cached]);
        else if (list.length < 32) list.push(cached); // bounded: the scan stays short
      }
      const h = cached.profile;
      for (const f of cached.firings) acc.push(f);
      inVial.push(h);
      if (h.pyrophoric || h.waterReactive) {
        let tot = reactiveTotals.get(h.key);
        if (!tot) {
          tot = { name: h.name, ul: 0, runs: new Set<number>() };
          reactiveTotals.set(h.key, tot);
        }
        tot.ul += c.volumeUl ?? 0;
        tot.runs.add(run.run);
        if (h.pyrophoric) pyrophoricNames.add(h.name);
      }
    }
    for (const part of vial.parts ?? []) {
      if (part.volumeFraction <= 0 || listed(inVial, part.record)) continue;
      const sk = `${part.record.id}\u0001${concentrates}`;
      let cached = solventCache.get(sk);
      if (!cached) {
        const item = solventMaterial(part.record);
        cached = { profile: item.p, firings: ownFirings(item, concentrates, t, nowMs) };
        solventCache.set(sk, cached);
      }
      for (const f of cached.firings) acc.push(f);
      inVial.push(cached.profile);
    }
    // Water-reactive or pyrophoric with an aqueous or protic partner in the same vial.
    for (const h of inVial) {
      if (!(h.pyrophoric || h.waterReactive)) continue;
      const wet = inVial.filter((w) => w.key !== h.key && (w.protic || w.aqueous));
      if (wet.length > 0) {
        acc.push({
          code: "TL-R04",
          severity: "blocking",
          component: h.name,
          score: wet.length,
          message: () => `${h.name} is ${h.pyrophoric ? "pyrophoric" : "water-reactive"} and shares the vial with ${wet.map((w) => `${w.name} (${w.aqueous ? "aqueous" : "protic"})`).join(", ")}.`,
        });
      }
    }
  });

  // Second-person rule over the whole plan.
  for (const tot of reactiveTotals.values()) {
    const ml = tot.ul / 1000;
    if (ml > t.pyrophoricSecondPersonVolumeMl) {
      for (const r of tot.runs) {
        acc.add(r, {
          code: "TL-R03",
          severity: "warning",
          component: tot.name,
          score: ml,
          message: () => `${fmt(ml, 2)} mL of ${tot.name} is handled in this plan, above the lab's second-person threshold of ${fmt(t.pyrophoricSecondPersonVolumeMl, 2)} mL.`,
        });
      }
    }
  }

  // The vessel's own rating.
  if (p.vessel.sealed && p.vessel.confirmWithSupplier && p.runs.length > 0) {
    for (const r of p.runs) {
      acc.add(r.run, {
        code: "TL-V06",
        severity: "info",
        component: p.vessel.name,
        score: 0,
        message: () => `The rating of ${p.vessel.name} (${fmt(p.vessel.ratedBar)} bar absolute, maximum fill ${fmt(p.vessel.maxFillFraction * 100, 1)} %) is a default that has not been confirmed with the supplier.`,
      });
    }
  }

  const cautions = acc.cautions();
  const signOffReasons: string[] = [];
  if (hotRuns.length > 0) {
    signOffReasons.push(
      `TL-S01: ${hotRuns.length} run(s) at or above the lab's sign-off temperature of ${fmt(t.signOffTemperatureC, 1)} °C (highest ${fmt(hottest, 1)} °C).`,
    );
  }
  if (pyrophoricNames.size > 0) {
    signOffReasons.push(`TL-S02: ${SIGN_OFF_RULES["TL-S02"]}: ${[...pyrophoricNames].join(", ")}.`);
  }
  if (aboveBoiling.size > 0) {
    signOffReasons.push(`TL-S03: ${SIGN_OFF_RULES["TL-S03"]} (${aboveBoiling.size} run(s)).`);
  }
  return {
    cautions,
    signOffRequired: signOffReasons.length > 0,
    signOffReasons,
    releasable: !cautions.some((c) => c.severity === "blocking"),
    perRun,
    notice: PLANNING_NOTICE,
  };
}

interface VialResult {
  parts: MixturePart[] | null;
  firings: Firing[];
  totalBar: number | null;
  vaporBar: number | null;
  fillFractionHot: number | null;
}

type ParsedInput = z.output<typeof planCautionInputSchema>;

/** Pressure, fill and fire rules for one vial's conditions (see run-checks.ts). */
function evaluateVial(
  catalogue: SolventCatalogue,
  run: ParsedInput["runs"][number],
  solventsPath: string,
  p: ParsedInput,
  t: LabThresholds,
): VialResult {
  const T = run.temperatureC;
  const firings: Firing[] = [];
  const parts = solventParts(catalogue, run.solvents, solventsPath, p.vessel.sealed, firings);
  const out: VialResult = { parts, firings, totalBar: null, vaporBar: null, fillFractionHot: null };
  if (!parts) return out;
  try {
    const est = estimateSealedVessel({
      parts,
      temperatureC: T,
      sealTemperatureC: p.sealTemperatureC,
      sealPressureBar: p.sealPressureBar,
      vesselVolumeMl: p.vessel.totalVolumeMl,
      liquidVolumeMl: run.liquidVolumeMl,
      gasReleasedMmol: run.gasReleasedMmol ?? 0,
    });
    out.totalBar = p.vessel.sealed ? est.totalBar : null;
    out.vaporBar = est.vaporBar;
    out.fillFractionHot = est.fillFractionHot;
    firings.push(
      ...pressureFirings(est, parts, T, {
        sealed: p.vessel.sealed,
        ratedBar: p.vessel.ratedBar,
        safetyFactor: t.safetyFactor,
        maxFillFraction: p.vessel.maxFillFraction,
      }),
    );
  } catch (error) {
    if (!(error instanceof AppError)) throw error;
    firings.push({
      code: "TL-V05",
      severity: p.vessel.sealed ? "blocking" : "warning",
      score: T,
      message: () => `The pressure at ${fmt(T, 1)} °C cannot be estimated: ${error.issues[0]?.message ?? error.message}.`,
    });
  }
  firings.push(...fireFirings(parts, T, t.autoignitionMarginC));
  return out;
}

/**
 * Resolves a run's solvents; unknown names give a TL-V05 caution (not an error: a lab
 * may not have entered its solvent yet). Fractions not summing to 1 are an input error.
 */
function solventParts(
  catalogue: SolventCatalogue,
  shares: ReadonlyArray<z.output<typeof solventShareSchema>>,
  path: string,
  sealed: boolean,
  firings: Firing[],
): MixturePart[] | null {
  if (shares.length === 0) {
    firings.push({ code: "TL-V05", severity: sealed ? "blocking" : "warning", score: 0, message: () => "No solvent is given for the vial, so its pressure and fire data cannot be checked." });
    return null;
  }
  const sum = shares.reduce((s, x) => s + x.volumeFraction, 0);
  if (Math.abs(sum - 1) > FRACTION_SUM_TOLERANCE) {
    throw AppError.field(path, `volume fractions must sum to 1 (they sum to ${sum})`);
  }
  const unknown = shares.filter((s) => !catalogue.find(s.name)).map((s) => s.name);
  if (unknown.length > 0) {
    firings.push({
      code: "TL-V05",
      severity: sealed ? "blocking" : "warning",
      component: unknown.join(", "),
      score: 0,
      message: () => `No solvent record for ${unknown.map((u) => `"${u}"`).join(", ")}: the vial's pressure and fire data cannot be checked.`,
    });
    return null;
  }
  return resolveSolventSystem(catalogue, shares, path);
}

interface CachedComponent {
  c: PlanComponent;
  concentrates: boolean;
  profile: HazardProfile;
  firings: Firing[];
}

/** Whether a solvent record is already among the vial's materials. */
function listed(inVial: readonly HazardProfile[], r: SolventRecord): boolean {
  for (const h of inVial) if (h.record === r) return true;
  return false;
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
      sameStrings(d.ghs, c.ghs)
    ) {
      return e;
    }
  }
  return undefined;
}

/** The rules about a component itself: TL-R01, TL-R02, TL-X01–X03, TL-H01. */
function ownFirings(m: Material, concentrates: boolean, t: LabThresholds, nowMs: number): Firing[] {
  const h = m.p;
  const out: Firing[] = [];
  if (h.pyrophoric) {
    out.push({ code: "TL-R01", severity: "warning", component: h.name, score: 0, message: () => `${h.name} is pyrophoric (H250): it catches fire on contact with air.${h.waterReactive ? " It also reacts with water." : ""}` });
  }
  if (h.waterReactive) {
    const codes = h.waterCodes;
    out.push({ code: "TL-R02", severity: "warning", component: h.name, score: 0, message: () => `${h.name} reacts with water and releases flammable gas${codes.length ? ` (${codes.join(", ")})` : ""}.` });
  }
  if (h.peroxideClass) peroxideChecks(m, h.peroxideClass, concentrates, t, nowMs, out);
  const cmr = h.cmrCodes;
  if (cmr.length > 0) {
    out.push({ code: "TL-H01", severity: "warning", component: h.name, score: 0, message: () => `${h.name} is ${cmrKinds(cmr)} (${cmr.join(", ")}).` });
  }
  return out;
}

function peroxideChecks(
  m: Material,
  cls: PeroxideClass | "unclassified",
  concentrates: boolean,
  t: LabThresholds,
  nowMs: number,
  acc: { push(f: Firing): unknown },
): void {
  const months = intervalMonths(t, cls);
  const label = cls === "unclassified" ? "unclassified peroxide former (EUH019)" : `peroxide former, class ${cls}`;
  const testedOn = m.peroxideTestedOn;
  const testAge = testedOn ? ageMonths(nowMs, testedOn) : null;
  const testCurrent = testAge !== null && testAge <= months;
  const openedOn = m.openedOn;
  if (typeof openedOn === "string") {
    const opened = ageMonths(nowMs, openedOn);
    if (opened > months && !testCurrent) {
      acc.push({
        code: "TL-X01",
        severity: "warning",
        component: m.p.name,
        score: opened,
        message: () => `${m.p.name} (${label}) was opened on ${openedOn.slice(0, 10)}, ${fmt(opened, 1)} months ago, beyond the lab's ${fmt(months, 1)}-month limit, ${testedOn ? `and its last peroxide test (${testedOn.slice(0, 10)}) is older than that` : "with no peroxide test on record"}.`,
      });
    }
  } else if (openedOn === null && typeof m.receivedOn === "string") {
    const receivedOn = m.receivedOn;
    const held = ageMonths(nowMs, receivedOn);
    const limit = t.peroxideTestIntervalMonths.unopened;
    if (held > limit && !(testAge !== null && testAge <= limit)) {
      acc.push({
        code: "TL-X01",
        severity: "warning",
        component: m.p.name,
        score: held,
        message: () => `${m.p.name} (${label}) is in an unopened container received on ${receivedOn.slice(0, 10)}, ${fmt(held, 1)} months ago, beyond the lab's ${fmt(limit, 1)}-month limit for unopened containers, with no peroxide test within that time.`,
      });
    }
  } else if (m.openedOn === undefined) {
    acc.push({
      code: "TL-X03",
      severity: "info",
      component: m.p.name,
      score: 0,
      message: () => `${m.p.name} is a ${label}; the opening date of its container is not recorded.`,
    });
  }
  if (concentrates) {
    acc.push({
      code: "TL-X02",
      severity: "warning",
      component: m.p.name,
      score: 1,
      message: () => `${m.p.name} (${label}) is concentrated or heated to dryness in this run${testCurrent ? "" : ", and there is no peroxide test on record within the lab's interval"}.`,
    });
  }
}
