/**
 * Safe-design alternatives (issue 10, "Safe design"): when runs of a design are blocked
 * (a blocking caution, a physical limit), the alternatives a chemist would consider,
 * side by side, each with its run count, the runs that still block, and its
 * D-efficiency relative to the original design for the chosen model:
 *
 * - face-centred (α = 1) and inscribed (axial runs at the factor limits) central
 *   composite designs;
 * - a smaller α: the largest α ≥ 1 for which no axial run is blocked;
 * - a narrower factor range: the offending factor's range shrunk, from the side its
 *   blocked runs are on, until no run blocks;
 * - a D-optimal design (same run count) over the candidate set — the 3^k grid of the
 *   factor box plus the original design's own points — with every blocked candidate
 *   removed.
 *
 * The module is pure and knows nothing of chemistry: the caller passes
 * `blocked(natural)` (false when the point is allowed; true or a reason when it is
 * not; or the hazard engine's `SafetyCheck` itself, blocking when it returns a blocking
 * caution). Every alternative is judged by
 * generating it from its own `input` and calling `blocked` on every run, so an
 * alternative that says nothing blocks can be applied by generating `input` again.
 * D-efficiencies code both designs with the original factor ranges
 * (`relativeDEfficiencyOfRuns`), so a narrower range shows the information it loses.
 */
import { AppError, parseOrThrow } from "../errors/app-error";
import type { ModelSpec } from "../stats/model-terms";
import { axialPointsCoded } from "./central-composite";
import { designInputSchema, type DesignInput, type DesignInputRaw } from "./design-schema";
import { D_OPTIMAL_LIMITS, gridCandidates } from "./d-optimal";
import { removalReason, type PointVerdict } from "./d-optimal-design";
import { relativeDEfficiencyOfRuns } from "./d-efficiency";
import { codeValue, type Factor } from "./factors";
import { generateDesign, type DesignOutput } from "./generate-design";
import { naturalRecord } from "./safe-envelope";

/** The alternatives offered, in the order they are shown. */
export const ALTERNATIVE_KINDS = ["face-centered", "inscribed", "smaller-alpha", "narrower-range", "d-optimal"] as const;
export type AlternativeKind = (typeof ALTERNATIVE_KINDS)[number];

/** A run that the caller's test blocks. */
export interface BlockedRun {
  standardOrder: number;
  natural: Record<string, number>;
  reason: string;
}

/** A design judged against the caller's test. */
export interface JudgedDesign {
  /** The design input that generates it: applying the alternative means using this input. */
  input: DesignInputRaw;
  design: DesignOutput;
  runCount: number;
  blockedRuns: BlockedRun[];
  nothingBlocks: boolean;
  /** D-efficiency relative to the original design for the model (1 for the original); null when the original cannot estimate the model. */
  dEfficiency: number | null;
}

/** One alternative: judged, or not available with the reason. */
export type DesignAlternative =
  | ({ kind: AlternativeKind; available: true; summary: string; changedFactors: Factor[] } & JudgedDesign)
  | { kind: AlternativeKind; available: false; summary: string };

export interface SafeAlternatives {
  /** The model the efficiencies are for (term names as in `fit`). */
  model: ModelSpec;
  original: JudgedDesign;
  alternatives: DesignAlternative[];
}

/** Options of `safeDesignAlternatives`. */
export interface SafeAlternativesOptions {
  /** The model for the D-efficiencies (default: the input's model for central composite, Box–Behnken and d-optimal designs, `interaction` for a full factorial, `linear` for a fraction). */
  model?: ModelSpec;
  /**
   * The alternatives to compute (default: all of ALTERNATIVE_KINDS); the others are left
   * out of the result. The D-optimal search is the slow one (seconds for six factors), so an
   * editor can ask for the others first and for "d-optimal" on its own.
   */
  kinds?: readonly AlternativeKind[];
}

type Verdict = (natural: Record<string, number>) => string | null;

function verdictOf(blocked: PointVerdict): Verdict {
  return (natural) => removalReason(blocked(natural));
}

function judge(input: DesignInputRaw, verdict: Verdict, original: { factors: readonly Factor[]; model: ModelSpec; design: DesignOutput } | null): JudgedDesign {
  const design = generateDesign(input);
  const blockedRuns: BlockedRun[] = [];
  for (const r of design.runs) {
    const reason = verdict(r.natural);
    if (reason !== null) blockedRuns.push({ standardOrder: r.standardOrder, natural: r.natural, reason });
  }
  let dEfficiency: number | null = 1;
  if (original) {
    try {
      dEfficiency = relativeDEfficiencyOfRuns(original.factors, original.model, design.runs, original.design.runs);
    } catch (e) {
      // A natural value a log-scale factor of the original coding cannot take.
      if (!(e instanceof AppError)) throw e;
      dEfficiency = null;
    }
  }
  return { input, design, runCount: design.runs.length, blockedRuns, nothingBlocks: blockedRuns.length === 0, dEfficiency };
}

function unavailable(kind: AlternativeKind, summary: string): DesignAlternative {
  return { kind, available: false, summary };
}

function defaultModel(input: DesignInput): ModelSpec {
  if (input.design === "full-factorial") return "interaction";
  if (input.design === "fractional-factorial") return "linear";
  return input.model;
}

/** The largest x in [lo, hi] with ok(x), scanning down from hi in `steps` and refining by bisection; null when none. */
function largestOk(lo: number, hi: number, ok: (x: number) => boolean, steps = 32): number | null {
  if (ok(hi)) return hi;
  let bad = hi;
  for (let s = 1; s <= steps; s++) {
    const x = hi - ((hi - lo) * s) / steps;
    if (ok(x)) {
      let good = x;
      // To a relative 1e-7: finer than the rounding applied to the result (α to 1e-4, a limit to 1/1000 of the range).
      for (let it = 0; it < 40 && bad - good > 1e-7 * (1 + Math.abs(hi)); it++) {
        const mid = (good + bad) / 2;
        if (ok(mid)) good = mid;
        else bad = mid;
      }
      return good;
    }
    bad = x;
  }
  return null;
}

/**
 * The safe-design alternatives of a design input (the `design` verb's input) against the
 * caller's `blocked(natural)` test, with the original design judged the same way.
 * Throws the design engine's invalid-input AppError for a bad input.
 * Example: safeDesignAlternatives({ factors, design: "central-composite", seed: 7 }, (x) => (x.temperatureC > 130 ? "above the vial's rating" : false))
 */
export function safeDesignAlternatives(raw: unknown, blocked: PointVerdict, options: SafeAlternativesOptions = {}): SafeAlternatives {
  const input = parseOrThrow(designInputSchema, raw, "The design input is not valid.");
  const factors = input.factors;
  const verdict = verdictOf(blocked);
  const model = options.model ?? defaultModel(input);
  const base: DesignInputRaw = { ...input };
  // Keep the run order reproducible when an alternative is applied: fix the seed drawn.
  if (input.randomize && input.seed === undefined) base.seed = generateDesign(base).seed ?? undefined;
  const judged = judge(base, verdict, null);
  const originalDesign = judged.design;
  const ref = { factors, model, design: originalDesign };
  const original: JudgedDesign = { ...judged, dEfficiency: relativeDEfficiencyOfRuns(factors, model, originalDesign.runs, originalDesign.runs) };

  const alternatives: DesignAlternative[] = [];
  const make: Make = (kind, summary, alt, changedFactors = []) => ({ kind, available: true, summary, changedFactors, ...judge(alt, verdict, ref) });
  const offer = (kind: AlternativeKind, summary: string, alt: DesignInputRaw) => alternatives.push(make(kind, summary, alt));

  const wanted = new Set<AlternativeKind>(options.kinds ?? ALTERNATIVE_KINDS);
  const isCcd = input.design === "central-composite";
  const ccdOnly = "applies to central composite designs";
  const alpha0 = originalDesign.alpha ?? 1;

  // Face-centred and inscribed.
  if (!wanted.has("face-centered") && !wanted.has("inscribed")) {
    // Not asked for.
  } else if (!isCcd) alternatives.push(unavailable("face-centered", ccdOnly), unavailable("inscribed", ccdOnly));
  else if (input.augment) {
    alternatives.push(unavailable("face-centered", "an augmentation keeps the runs already made"), unavailable("inscribed", "an augmentation keeps the runs already made"));
  } else {
    if (alpha0 === 1 && input.placement === "circumscribed") alternatives.push(unavailable("face-centered", "the design is face-centred already"));
    else offer("face-centered", "axial runs on the faces of the factor box (α = 1)", { ...base, alpha: "face-centered", placement: "circumscribed" });
    if (input.placement === "inscribed") alternatives.push(unavailable("inscribed", "the design is inscribed already"));
    else if (alpha0 === 1) alternatives.push(unavailable("inscribed", "with α = 1 the inscribed design is the face-centred one"));
    else offer("inscribed", `axial runs at the factor limits, factorial runs at ±1/α = ±${(1 / alpha0).toPrecision(4)} (coded)`, { ...base, placement: "inscribed" });
  }

  // Smaller α: the largest α ≥ 1 that keeps every axial run unblocked.
  if (!wanted.has("smaller-alpha")) {
    // Not asked for.
  } else if (!isCcd) alternatives.push(unavailable("smaller-alpha", ccdOnly));
  else if (input.augment || input.placement === "inscribed") {
    alternatives.push(unavailable("smaller-alpha", input.augment ? "an augmentation keeps the runs already made" : "the axial runs of an inscribed design sit at the factor limits"));
  } else {
    const axialClear = (a: number) => axialPointsCoded(factors.length, a).every((x) => verdict(naturalRecord(factors, x)) === null);
    if (axialClear(alpha0)) alternatives.push(unavailable("smaller-alpha", "no axial run is blocked"));
    else {
      const found = alpha0 > 1 ? largestOk(1, alpha0, axialClear) : null;
      if (found === null) alternatives.push(unavailable("smaller-alpha", "every α ≥ 1 leaves an axial run blocked"));
      else {
        const rounded = Math.floor(found * 1e4) / 1e4;
        const a = rounded >= 1 && axialClear(rounded) ? rounded : found;
        offer("smaller-alpha", `α = ${a.toPrecision(5)} instead of ${alpha0.toPrecision(5)}, the largest that keeps every axial run unblocked`, { ...base, alpha: a });
      }
    }
  }

  // Narrower range of the offending factor.
  if (wanted.has("narrower-range")) alternatives.push(narrowerRange(input, base, original, verdict, make));

  // D-optimal over the candidate set without the blocked candidates.
  if (wanted.has("d-optimal")) alternatives.push(dOptimalAlternative(input, base, originalDesign, model, verdict, make));

  // Face-centred and inscribed are decided together above; keep only what was asked for.
  return { model, original, alternatives: alternatives.filter((a) => wanted.has(a.kind)) };
}

/** Generates and judges an alternative from its input. */
type Make = (kind: AlternativeKind, summary: string, alt: DesignInputRaw, changedFactors?: Factor[]) => DesignAlternative;

function narrowerRange(input: DesignInput, base: DesignInputRaw, original: JudgedDesign, verdict: Verdict, make: Make): DesignAlternative {
  const kind: AlternativeKind = "narrower-range";
  if (input.design === "d-optimal") return unavailable(kind, "a d-optimal design avoids blocked points directly (the d-optimal alternative)");
  if (input.augment) return unavailable(kind, "an augmentation keeps the runs already made");
  if (original.nothingBlocks) return unavailable(kind, "no run is blocked");
  const factors = input.factors;
  const codedOf = (r: BlockedRun, f: Factor) => codeValue(f, r.natural[f.name]!);
  // Offending factors: those away from their centre in blocked runs, most often first.
  const counts = factors.map((f) => original.blockedRuns.filter((r) => Math.abs(codedOf(r, f)) > 1e-9).length);
  const order = factors.map((_, i) => i).filter((i) => counts[i]! > 0).sort((a, b) => counts[b]! - counts[a]! || a - b);
  let best: { s: number; factor: Factor; index: number } | null = null;
  for (const i of order) {
    const f = factors[i]!;
    const signs = original.blockedRuns.map((r) => Math.sign(codedOf(r, f))).filter((s) => s !== 0);
    const side = signs.every((s) => s > 0) ? "high" : signs.every((s) => s < 0) ? "low" : "both";
    const narrowed = (s: number): Factor => {
      const w = f.high - f.low;
      if (side === "high") return { ...f, high: f.high - s * w };
      if (side === "low") return { ...f, low: f.low + s * w };
      return { ...f, low: f.low + (s * w) / 2, high: f.high - (s * w) / 2 };
    };
    const withFactor = (g: Factor): DesignInputRaw => ({ ...base, factors: factors.map((h, j) => (j === i ? g : h)) });
    const clear = (g: Factor) => {
      const d = generateDesign(withFactor(g));
      return d.runs.every((r) => verdict(r.natural) === null);
    };
    // Keep at least 2 % of the range; find the least shrink that clears every run.
    const keep = largestOk(0.02, 1, (t) => clear(narrowed(1 - t)));
    if (keep === null) continue;
    let g = narrowed(1 - keep);
    // Round the moved limit(s) inward to a power of ten near 1/1000 of the range, if that still clears.
    const digits = Math.max(0, -Math.floor(Math.log10((f.high - f.low) / 1000)));
    const inward = (x: number, up: boolean) => {
      const q = Math.pow(10, digits);
      return Number(((up ? Math.ceil(x * q - 1e-6) : Math.floor(x * q + 1e-6)) / q).toFixed(digits));
    };
    const r = { ...g, low: side === "high" ? g.low : inward(g.low, true), high: side === "low" ? g.high : inward(g.high, false) };
    if (r.low < r.high && clear(r)) g = r;
    const s = 1 - (g.high - g.low) / (f.high - f.low);
    if (!best || s < best.s) best = { s, factor: g, index: i };
  }
  if (!best) return unavailable(kind, "no single factor's range, narrowed, clears every blocked run");
  const f = factors[best.index]!;
  const g = best.factor;
  const unit = f.unit ? ` ${f.unit}` : "";
  const index = best.index;
  return make(
    kind,
    `${f.name} from ${g.low} to ${g.high}${unit} instead of ${f.low} to ${f.high}${unit} (${(100 * best.s).toFixed(1)} % of its range removed)`,
    { ...base, factors: factors.map((h, j) => (j === index ? g : h)) },
    [g],
  );
}

function dOptimalAlternative(input: DesignInput, base: DesignInputRaw, originalDesign: DesignOutput, model: ModelSpec, verdict: Verdict, make: Make): DesignAlternative {
  const kind: AlternativeKind = "d-optimal";
  const factors = input.factors;
  const k = factors.length;
  const key = (x: readonly number[]) => x.map((v) => Math.round(v * 1e9)).join(",");
  // The original design's own points (its axial runs, say), then the grid of the box.
  const own = new Map<string, number[]>();
  for (const r of originalDesign.runs) {
    const x = factors.map((f) => codeValue(f, r.natural[f.name]!));
    own.set(key(x), x);
  }
  const room = D_OPTIMAL_LIMITS.candidates - own.size;
  let grid: number[][];
  try {
    grid = input.design === "d-optimal" && input.candidates ? [] : gridCandidates(k, input.levels ?? 3, room);
  } catch (e) {
    if (!(e instanceof AppError)) throw e;
    return unavailable(kind, "too many factors for a candidate grid");
  }
  const all = new Map<string, number[]>(own);
  for (const x of grid) all.set(key(x), x);
  if (input.design === "d-optimal" && input.candidates) for (const c of input.candidates) all.set(key(factors.map((f) => codeValue(f, c[f.name]!))), factors.map((f) => codeValue(f, c[f.name]!)));
  const candidates: Record<string, number>[] = [];
  let removed = 0;
  for (const x of all.values()) {
    const natural = naturalRecord(factors, x);
    if (verdict(natural) === null) candidates.push(natural);
    else removed++;
  }
  const n = originalDesign.runs.length;
  const centreFree = verdict(naturalRecord(factors, new Array<number>(k).fill(0))) === null;
  const nCentre = centreFree ? Math.min(originalDesign.runs.filter((r) => Object.values(r.coded).every((v) => v === 0)).length, n - 1) : 0;
  if (candidates.length === 0) return unavailable(kind, "every candidate point is blocked");
  const alt: DesignInputRaw = {
    factors: [...factors],
    design: "d-optimal",
    runs: n - nCentre,
    centerPoints: nCentre,
    model,
    candidates,
    constraints: input.constraints,
    randomize: input.randomize,
    seed: base.seed,
  };
  try {
    return make(kind, `${n} runs chosen for the ${typeof model === "string" ? model : "given"} model from ${candidates.length} unblocked candidate points (${removed} blocked removed)`, alt);
  } catch (e) {
    if (!(e instanceof AppError)) throw e;
    if (e.code === "infeasible") return unavailable(kind, `the unblocked candidates cannot support the model (${e.message})`);
    return unavailable(kind, `beyond the bounds of the D-optimal search (${e.message})`);
  }
}
