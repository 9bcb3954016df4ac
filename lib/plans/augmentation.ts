/**
 * The next design after a two-level factorial plan, pure: the axial and centre runs that
 * augment it to a central composite design (lib/doe `augmentToCentralComposite`: α
 * rotatable F^¼, orthogonally blocking, face-centred or a number, cut to the largest α whose
 * axial runs pass the safe envelope — lib/results/envelope.ts: no blocking caution, none of
 * the lab's limits left — and the notes that say when rotatability was given up), as a plan
 * document: the source plan's recipe, factors (the same ranges, so the coded values agree
 * with the first plan's), vessel, block and limits, with its design replaced by the new
 * block's runs (`design.runs`, block 2), in a seeded random order grouped by the temperature
 * factor (heating blocks hold one temperature, as lib/chemistry `planDesignInput` groups a
 * generated design). The two plans are analysed together through the study analysis, each
 * plan a block.
 */
import { AppError } from "../errors/app-error";
import type { ResolvedRun } from "../chemistry/design-runs";
import type { PlanDocument } from "../chemistry/plan-document";
import { augmentToCentralComposite, type AugmentAlpha, type Augmentation } from "../doe/augment";
import { assignRunOrder, seededRng } from "../doe/randomize";
import type { SafetyCheck } from "../doe/safe-envelope";

const TOL = 1e-6;

/** What an augmentation plan keeps of its derivation (`plans.derivation_details`). */
export interface AugmentationDetails {
  kind: "augmentation";
  alpha: number;
  requestedAlpha: number;
  rotatableAlpha: number;
  orthogonalAlpha: number;
  rotatable: boolean;
  orthogonallyBlocked: boolean;
  limitedBy: string[];
  notes: string[];
  /** The first plan's factorial and centre runs, and the new block's axial and centre runs. */
  factorialRuns: number;
  factorialCenterRuns: number;
  axialRuns: number;
  centerRuns: number;
  /** The seed of the new block's run order. */
  seed: number;
}

/** Whether a plan's runs are a two-level factorial (or fraction) with optional centre runs: what can be augmented. */
export function factorialRunsOf(runs: readonly ResolvedRun[], factorNames: readonly string[]): { coded: number[][] } | { reason: string } {
  if (factorNames.length < 2) return { reason: "A central composite design needs at least two factors." };
  const coded = runs.map((r) => factorNames.map((n) => r.coded[n] ?? Number.NaN));
  const corner = (x: readonly number[]) => x.every((v) => Math.abs(Math.abs(v) - 1) < TOL);
  const centre = (x: readonly number[]) => x.every((v) => Math.abs(v) < TOL);
  const other = runs.find((_r, i) => !corner(coded[i]!) && !centre(coded[i]!));
  if (other) return { reason: `Run ${other.standardOrder} (${other.kind}) is neither a corner of the factorial nor its centre: only a two-level factorial plan is augmented to a central composite design.` };
  if (coded.filter(corner).length < 2) return { reason: "The plan has fewer than two factorial runs." };
  return { coded };
}

/** The augmentation of a factorial plan: the engine's answer, the details to keep and the new plan's document. */
export interface AugmentationPlan {
  augmentation: Augmentation;
  details: AugmentationDetails;
  document: Record<string, unknown>;
}

/**
 * Augments the source plan (its stored document and runs) with axial and centre runs in a
 * second block. `safety` judges each axial run (the document with the inventory's facts).
 * Example: augmentationOf({ source, runs, alpha: "rotatable", safety, seed: 7, name }).augmentation.alpha
 * @throws AppError conflict at `design` when the plan is not a two-level factorial;
 *   invalid_input at `alpha` / `centerPoints`; infeasible at `alpha` when even face-centred
 *   axial runs would block.
 */
export function augmentationOf(opts: {
  source: PlanDocument;
  runs: readonly ResolvedRun[];
  alpha: AugmentAlpha;
  centerPoints?: number;
  safety: SafetyCheck;
  seed: number;
  name: string;
}): AugmentationPlan {
  const factors = opts.source.factors;
  const names = factors.map((f) => f.name);
  const found = factorialRunsOf(opts.runs, names);
  if ("reason" in found) throw new AppError("conflict", "This plan cannot be augmented to a central composite design.", [{ path: "design", message: found.reason }]);
  let augmentation: Augmentation;
  try {
    augmentation = augmentToCentralComposite(
      factors.map((f) => ({ name: f.name, low: f.low, high: f.high, unit: f.unit, scale: f.scale })),
      { runs: found.coded, alpha: opts.alpha, ...(opts.centerPoints !== undefined ? { centerPoints: opts.centerPoints } : {}), safety: opts.safety },
    );
  } catch (e) {
    if (e instanceof AppError && e.code === "infeasible") throw new AppError("infeasible", e.message, e.issues.map((i) => ({ path: "alpha", message: i.message })));
    throw e;
  }
  const temperature = factors.find((f) => f.binding.kind === "temperature")?.name;
  const hardToChange = typeof opts.source.design.hardToChange === "string" && names.includes(opts.source.design.hardToChange) ? opts.source.design.hardToChange : temperature;
  const order = assignRunOrder(
    augmentation.runs.map((r) => ({ block: 2, ...(hardToChange !== undefined ? { group: r.coded[hardToChange]! } : {}) })),
    seededRng(opts.seed),
  );
  const runs = augmentation.runs.map((r, i) => ({ standardOrder: i + 1, runOrder: order[i]!, kind: r.kind, block: 2, coded: { ...r.coded }, natural: { ...r.natural } }));
  const centreInFactorial = found.coded.filter((x) => x.every((v) => Math.abs(v) < TOL)).length;
  const details: AugmentationDetails = {
    kind: "augmentation",
    alpha: augmentation.alpha,
    requestedAlpha: augmentation.requestedAlpha,
    rotatableAlpha: augmentation.rotatableAlpha,
    orthogonalAlpha: augmentation.orthogonalAlpha,
    rotatable: augmentation.rotatable,
    orthogonallyBlocked: augmentation.orthogonallyBlocked,
    limitedBy: augmentation.limitedBy,
    notes: augmentation.notes,
    factorialRuns: found.coded.length - centreInFactorial,
    factorialCenterRuns: centreInFactorial,
    axialRuns: augmentation.runs.filter((r) => r.kind === "axial").length,
    centerRuns: augmentation.runs.filter((r) => r.kind === "center").length,
    seed: opts.seed,
  };
  return { augmentation, details, document: { ...opts.source, name: opts.name.slice(0, 300), design: { runs } } };
}
