/**
 * The next design after a two-level factorial: augmenting it to a central composite
 * design (Box & Wilson 1951; Montgomery, Design and Analysis of Experiments, §11.4 on
 * the CCD and blocking in response surface designs) — 2k axial runs at ±α and centre
 * runs in a new block, α chosen within the factor limits and the safe envelope.
 *
 * α is rotatable, α = F^¼ (F factorial points; NIST/SEMATECH e-Handbook §5.3.3.6.1), or
 * blocks orthogonally in two blocks,
 *   α = √( F·(2k + n_ca) / (2·(F + n_cf)) )
 * with n_cf centre runs in the factorial block and n_ca in the axial block (Box &
 * Hunter, "Multi-factor experimental designs for exploring response surfaces", Ann.
 * Math. Statist. 28, 1957; as given in Montgomery §11.4; from memory), or face-centred
 * (α = 1), or a number. When an axial point at the chosen α would pass a factor's
 * limit or fire a blocking caution, α is reduced to the largest value that keeps all
 * 2k axial points settable and safe (one α for all factors, so the design stays a CCD),
 * and the result says what was given up.
 */
import { AppError } from "../errors/app-error";
import { axialPointsCoded } from "./central-composite";
import { codeValue, decodeValue, type Factor } from "./factors";
import { formatNatural, formatNumber as fmt } from "./format";
import { blockingAt, type BlockingCaution, type FactorLimit, type SafetyCheck } from "./safe-envelope";

export type AugmentAlpha = "rotatable" | "orthogonal" | "face-centered" | number;

export interface AugmentOptions {
  /** The existing runs in coded units (factor order): factorial points (±1) and centre points. */
  runs: readonly (readonly number[])[];
  /** The block of the existing runs (default 1); the new runs go in the next one. */
  block?: number;
  alpha?: AugmentAlpha;
  /** Centre runs in the new block (default: as many as the factorial block has, at least 2). */
  centerPoints?: number;
  /** Natural limits of the factors, by name. */
  limits?: Record<string, FactorLimit>;
  safety?: SafetyCheck;
}

/** A run of the augmentation (`kind` as in the design output). */
export interface AugmentRun {
  kind: "axial" | "center";
  block: number;
  coded: Record<string, number>;
  natural: Record<string, number>;
}

export interface Augmentation {
  runs: AugmentRun[];
  /** The α used. */
  alpha: number;
  /** The α asked for, before limits and the envelope. */
  requestedAlpha: number;
  rotatableAlpha: number;
  orthogonalAlpha: number;
  rotatable: boolean;
  orthogonallyBlocked: boolean;
  /** What limited α (factor limits, blocking cautions), in words; empty when nothing did. */
  limitedBy: string[];
  notes: string[];
}

const TOL = 1e-9;

/** α of a CCD in two blocks that blocks orthogonally (Box & Hunter 1957): √(F(2k + n_ca) / (2(F + n_cf))). */
export function orthogonalBlockingAlpha(k: number, factorialPoints: number, centreInFactorialBlock: number, centreInAxialBlock: number): number {
  const F = factorialPoints;
  return Math.sqrt((F * (2 * k + centreInAxialBlock)) / (2 * (F + centreInFactorialBlock)));
}

/**
 * Augments a two-level factorial (or fraction) with axial and centre runs in a new
 * block. Throws an invalid-input AppError when a run is neither a factorial (±1) nor a
 * centre point (path `runs.<i>`), when there are fewer than two factorial points, for a
 * bad α or centre count; and an "infeasible" AppError when even face-centred axial
 * points (α = 1) pass a limit or are blocked.
 * Example: augmentToCentralComposite(factors, { runs: factorial.map((r) => r.codedArray), alpha: "rotatable" })
 */
export function augmentToCentralComposite(factors: readonly Factor[], options: AugmentOptions): Augmentation {
  const k = factors.length;
  if (k < 2) throw AppError.field("factors", "a central composite design needs at least two factors");
  let F = 0;
  let nCf = 0;
  options.runs.forEach((r, i) => {
    if (r.length !== k) throw AppError.field(`runs.${i}`, `needs a value for each of the ${k} factors`);
    if (r.every((v) => Math.abs(v) < TOL)) nCf++;
    else if (r.every((v) => Math.abs(Math.abs(v) - 1) < 1e-6)) F++;
    else throw AppError.field(`runs.${i}`, "is neither a two-level factorial point (±1) nor a centre point");
  });
  if (F < 2) throw AppError.field("runs", "needs at least two factorial points");
  const nCa = options.centerPoints ?? Math.max(2, nCf);
  if (!(Number.isInteger(nCa) && nCa >= 0 && nCa <= 100)) throw AppError.field("centerPoints", "must be a whole number from 0 to 100");
  const rotatableAlpha = Math.pow(F, 0.25);
  const orthogonalAlpha = orthogonalBlockingAlpha(k, F, nCf, nCa);
  const choice = options.alpha ?? "rotatable";
  let requested: number;
  if (typeof choice === "number") {
    if (!(Number.isFinite(choice) && choice >= 1)) throw AppError.field("alpha", "must be at least 1 (the face-centred design)");
    requested = choice;
  } else requested = choice === "rotatable" ? rotatableAlpha : choice === "orthogonal" ? orthogonalAlpha : 1;

  // Factor limits: the largest α whose axial points stay within them.
  const limitedBy: string[] = [];
  let alpha = requested;
  factors.forEach((f) => {
    const lim = options.limits?.[f.name];
    if (!lim) return;
    const sides: [number | undefined, number, string][] = [
      [lim.max, 1, "above its upper limit"],
      [lim.min, -1, "below its lower limit"],
    ];
    for (const [bound, sign, words] of sides) {
      if (bound === undefined) continue;
      if (f.scale === "log" && !(bound > 0)) continue;
      const reach = sign * codeValue(f, bound);
      if (reach < alpha - TOL) {
        limitedBy.push(`${f.name} at ${sign > 0 ? "+" : "−"}α would be ${fmt(decodeValue(f, sign * alpha))}${unit(f)}, ${words} of ${fmt(bound)}${unit(f)}`);
        alpha = reach;
      }
    }
  });
  if (alpha < 1 - TOL) {
    throw new AppError("infeasible", "Even face-centred axial points would pass a factor's limit.", [{ path: "limits", message: limitedBy.join("; ") }]);
  }

  // The safe envelope: the largest α (to 0.001) at which no axial point is blocked, assuming
  // each axis is blocked from some distance on (bisection between 1 and α).
  const axialBlocked = (a: number): { point: number[]; blocking: BlockingCaution[] } | null => {
    for (const p of axialPointsCoded(k, a)) {
      const b = blockingAt(options.safety, factors, p);
      if (b.length) return { point: p, blocking: b };
    }
    return null;
  };
  const atAlpha = options.safety ? axialBlocked(alpha) : null;
  if (atAlpha) {
    if (axialBlocked(1)) {
      const b = axialBlocked(1)!;
      throw new AppError("infeasible", "Even face-centred axial points fire a blocking caution.", [
        { path: "safety", message: `${describePoint(factors, b.point)}: ${b.blocking.map((c) => `${c.code} (${c.message})`).join("; ")}` },
      ]);
    }
    let lo = 1;
    let hi = alpha;
    while (hi - lo > 1e-7) {
      const mid = (lo + hi) / 2;
      if (axialBlocked(mid)) hi = mid;
      else lo = mid;
    }
    // α to three decimals, never past the safe side.
    let safeAlpha = Math.round(lo * 1000) / 1000;
    if (safeAlpha > lo && axialBlocked(safeAlpha)) safeAlpha -= 0.001;
    limitedBy.push(`at α = ${fmt(alpha)} the axial point ${describePoint(factors, atAlpha.point)} is blocked: ${atAlpha.blocking.map((c) => `${c.code} (${c.message})`).join("; ")}`);
    alpha = Math.max(1, safeAlpha);
  }

  const rotatable = Math.abs(alpha - rotatableAlpha) < 1e-6;
  const orthogonallyBlocked = Math.abs(alpha - orthogonalAlpha) < 1e-6;
  const notes: string[] = [];
  if (alpha < requested - 1e-9) {
    notes.push(`α reduced from ${fmt(requested)} to ${fmt(alpha)}: ${limitedBy.join("; ")}.`);
    if (choice === "rotatable" || Math.abs(requested - rotatableAlpha) < 1e-9) notes.push(`Rotatability given up: the rotatable α for ${F} factorial points is ${fmt(rotatableAlpha)}; the prediction variance is no longer the same in every direction.`);
    if (choice === "orthogonal") notes.push(`Orthogonal blocking given up: it needs α = ${fmt(orthogonalAlpha)}; the block effect is no longer independent of the quadratic terms.`);
  } else if (!rotatable && choice !== "orthogonal") notes.push(`Not rotatable: the rotatable α for ${F} factorial points is ${fmt(rotatableAlpha)}.`);
  if (!orthogonallyBlocked) notes.push(`The two blocks are not orthogonal (that needs α = ${fmt(orthogonalAlpha)} with ${nCf} and ${nCa} centre runs): the analysis estimates the block effect together with the model.`);

  const block = (options.block ?? 1) + 1;
  const toRun = (kind: AugmentRun["kind"], coded: number[]): AugmentRun => ({
    kind,
    block,
    coded: Object.fromEntries(factors.map((f, i) => [f.name, coded[i] === 0 ? 0 : coded[i]!])),
    natural: Object.fromEntries(factors.map((f, i) => [f.name, naturalAt(f, coded[i]!, options.limits?.[f.name])])),
  });
  const runs = [...axialPointsCoded(k, alpha).map((p) => toRun("axial", p)), ...Array.from({ length: nCa }, () => toRun("center", new Array<number>(k).fill(0)))];
  return { runs, alpha, requestedAlpha: requested, rotatableAlpha, orthogonalAlpha, rotatable, orthogonallyBlocked, limitedBy, notes };
}

/** The natural value at a coded value, exactly the limit when α was cut to it. */
function naturalAt(f: Factor, coded: number, lim: FactorLimit | undefined): number {
  const v = decodeValue(f, coded);
  if (lim?.max !== undefined && Math.abs(v - lim.max) < 1e-9 * (1 + Math.abs(lim.max))) return lim.max;
  if (lim?.min !== undefined && Math.abs(v - lim.min) < 1e-9 * (1 + Math.abs(lim.min))) return lim.min;
  return v;
}

const unit = (f: Factor) => (f.unit ? ` ${f.unit}` : "");
const describePoint = formatNatural;
