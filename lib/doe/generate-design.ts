/**
 * `generateDesign`: the `design` verb (README) as a library function. Builds the
 * coded runs of the chosen design in standard order (factorial part in Yates order,
 * then axial points, then centre points; replicates repeat the whole list), assigns
 * blocks, decodes to natural units and sets a seeded random run order.
 */
import { AppError, parseOrThrow } from "../errors/app-error";
import { augmentToCentralComposite } from "./augment";
import { boxBehnkenCoded } from "./box-behnken";
import { axialPointsCoded, ccdAlpha } from "./central-composite";
import { blockOfRow, chooseBlockWords } from "./blocking";
import { designInputSchema, type DesignInput, type DesignInputRaw } from "./design-schema";
import { dOptimalPoints, type DOptimalPointsOptions, type DOptimalSummary } from "./d-optimal-design";
import { codeValue, decodeValue, factorLetter } from "./factors";
import { fullFactorialCoded } from "./factorial";
import {
  aliasStructure,
  defaultGenerators,
  fractionalFactorialCoded,
  generatorsToText,
  parseGenerators,
  romanResolution,
  wordToLetters,
  type FractionalFactorial,
} from "./fractional";
import { assignRunOrder, seededRng } from "./randomize";

/** What a run is in its design (the run field `kind`). */
export type RunKind = "factorial" | "axial" | "center" | "optimal";

/** One run of a design (the `design` verb's output). */
export interface DesignRun {
  standardOrder: number;
  runOrder: number;
  kind: RunKind;
  block: number;
  replicate: number;
  coded: Record<string, number>;
  natural: Record<string, number>;
}

export type { DOptimalSummary } from "./d-optimal-design";

/** The `design` verb's output, with added fields. */
export interface DesignOutput {
  design: DesignInput["design"];
  runs: DesignRun[];
  /** The axial distance in coded units of the factorial part (central composite), else null. */
  alpha: number | null;
  /** Resolution of the two-level fraction ("III", "IV", …), null for a full factorial or none. */
  resolution: string | null;
  /** Alias chains of main effects and two-factor interactions (letters), empty when none. */
  aliases: Record<string, string[]>;
  generators: string[];
  definingRelation: string[];
  /** The letter of each factor: { A: "temperature", … }. */
  letters: Record<string, string>;
  /** Interactions confounded with blocks (letters). */
  blockConfounding: string[];
  /** The seed used for the run order (null when not randomised). */
  seed: number | null;
  dOptimal: DOptimalSummary | null;
}

interface Point {
  coded: number[];
  kind: RunKind;
  block: number;
  /** Natural values given by the caller (augmentation), kept exactly. */
  natural?: number[];
}

function twoLevelPart(input: DesignInput, k: number): FractionalFactorial | null {
  if (input.design === "full-factorial") return null;
  if (input.design === "fractional-factorial" || (input.design === "central-composite" && (input.generators?.length || input.fraction !== undefined))) {
    if (input.generators && input.generators.length > 0) return fractionalFactorialCoded(k, parseGenerators(input.generators, k));
    let p = input.fraction ?? 1;
    if (input.runs !== undefined) {
      p = k - Math.round(Math.log2(input.runs));
      if (p < 1) throw AppError.field("runs", `a fraction of ${k} factors has fewer than ${2 ** k} runs`);
    }
    if (k - p < 2) throw AppError.field(input.fraction !== undefined ? "fraction" : "runs", "leaves fewer than two base factors");
    return fractionalFactorialCoded(k, defaultGenerators(k, p));
  }
  return null;
}

function factorialPoints(input: DesignInput, k: number, frac: FractionalFactorial | null): { rows: number[][]; blockWords: number[] } {
  const rows = frac ? frac.rows : fullFactorialCoded(k);
  const isTwoLevel = input.design === "full-factorial" || input.design === "fractional-factorial";
  const b = isTwoLevel ? Math.round(Math.log2(input.blocks)) : 0;
  if (b > 0 && 2 ** b > rows.length / 2) throw AppError.field("blocks", `${rows.length} runs cannot form ${input.blocks} blocks`);
  const blockWords = b > 0 ? chooseBlockWords(k, b, frac ? frac.definingRelation : []) : [];
  return { rows, blockWords };
}

/**
 * Generates a design (the `design` verb): full factorial 2^k (k ≤ 10), fractional
 * factorial 2^(k−p) with given or minimum-aberration generators, central composite
 * (α rotatable F^¼, spherical √k, face-centred 1 or a number; circumscribed, or
 * inscribed with the axial points at the natural limits), Box–Behnken (k = 3…7) or
 * D-optimal (modified Fedorov exchange over a constrained candidate set); with centre
 * points, replicates, blocks, a hard-to-change factor and a seeded run order.
 * Accepts raw input (validated here) or an already parsed `DesignInput`; `options.exclude`
 * removes the candidates of a d-optimal design that the caller's test blocks.
 * Throws an invalid-input AppError naming the field for bad input, and an
 * "infeasible" AppError when constraints leave too few candidates.
 * Example: generateDesign({ factors: [...], design: "full-factorial", seed: 7 })
 */
export function generateDesign(raw: unknown | DesignInputRaw, options: DOptimalPointsOptions = {}): DesignOutput {
  const input = parseOrThrow(designInputSchema, raw, "The design input is not valid.");
  const factors = input.factors;
  const k = factors.length;
  const names = factors.map((f) => f.name);
  const defaultCentre = input.design === "central-composite" || input.design === "box-behnken" ? 3 : 0;
  const nCentre = input.centerPoints ?? defaultCentre;

  let points: Point[] = [];
  let alpha: number | null = null;
  let frac: FractionalFactorial | null = null;
  let blockWords: number[] = [];
  let dSummary: DOptimalSummary | null = null;
  let nBlocks = 1;

  const centre = (count: number, blockOf: (j: number) => number) => {
    for (let j = 0; j < count; j++) points.push({ coded: new Array<number>(k).fill(0), kind: "center", block: blockOf(j) });
  };

  switch (input.design) {
    case "full-factorial":
    case "fractional-factorial": {
      frac = twoLevelPart(input, k);
      const fp = factorialPoints(input, k, frac);
      blockWords = fp.blockWords;
      nBlocks = 2 ** blockWords.length;
      for (const row of fp.rows) points.push({ coded: row, kind: "factorial", block: blockOf(row, blockWords) });
      centre(nCentre, (j) => (j % nBlocks) + 1);
      break;
    }
    case "central-composite": {
      if (input.augment) {
        // Existing runs augmented with axial and centre runs in a new block: the one
        // augmentation rule (lib/doe/augment.ts), its field paths under `augment.`.
        const given: Point[] = input.augment.runs.map((r) => ({
          coded: r.coded ? names.map((n) => r.coded![n]!) : names.map((n, j) => codeValue(factors[j]!, r.natural![n]!)),
          natural: r.natural && !r.coded ? names.map((n) => r.natural![n]!) : undefined,
          kind: "factorial",
          block: 1,
        }));
        for (const g of given) if (g.coded.every((v) => Math.abs(v) < 1e-9)) g.kind = "center";
        const aug = withPathPrefix("augment.", () =>
          augmentToCentralComposite(factors, {
            runs: given.map((g) => g.coded),
            alpha: input.alpha === "spherical" ? Math.sqrt(k) : input.alpha,
            centerPoints: nCentre,
          }),
        );
        alpha = aug.alpha;
        nBlocks = 2;
        points.push(...given);
        for (const r of aug.runs) points.push({ coded: names.map((n) => r.coded[n]!), kind: r.kind, block: 2 });
        break;
      }
      frac = twoLevelPart(input, k);
      const factorialRows = frac ? frac.rows : fullFactorialCoded(k);
      alpha = ccdAlpha(input.alpha, k, factorialRows.length);
      const scale = input.placement === "inscribed" ? 1 / alpha : 1;
      const twoBlocks = input.blocks === 2;
      nBlocks = twoBlocks ? 2 : 1;
      const axialBlock = twoBlocks ? 2 : 1;
      for (const row of factorialRows) points.push({ coded: row.map((v) => v * scale), kind: "factorial", block: 1 });
      for (const row of axialPointsCoded(k, alpha)) points.push({ coded: row.map((v) => v * scale), kind: "axial", block: axialBlock });
      centre(nCentre, (j) => (twoBlocks ? (j % 2) + 1 : 1));
      break;
    }
    case "box-behnken": {
      for (const row of boxBehnkenCoded(k)) points.push({ coded: row, kind: "factorial", block: 1 });
      centre(nCentre, () => 1);
      break;
    }
    case "d-optimal": {
      const d = dOptimalPoints(input, nCentre, options);
      points = d.coded.map((coded) => ({ coded, kind: "optimal", block: 1 }));
      dSummary = d.summary;
      centre(nCentre, () => 1);
      break;
    }
  }

  // Replicates repeat the whole list (the given runs of an augmentation are not repeated).
  const runsOut: Omit<DesignRun, "runOrder">[] = [];
  const reps = input.augment ? 1 : input.replicates;
  let so = 1;
  for (let rep = 1; rep <= reps; rep++) {
    for (const pt of points) {
      const coded: Record<string, number> = {};
      const natural: Record<string, number> = {};
      factors.forEach((f, i) => {
        const c = pt.coded[i]!;
        coded[f.name] = c === 0 ? 0 : c; // no −0
        natural[f.name] = pt.natural ? pt.natural[i]! : decodeValue(f, c);
      });
      const block = input.blockByReplicate ? (rep - 1) * nBlocks + pt.block : pt.block;
      runsOut.push({ standardOrder: so++, kind: pt.kind, block, replicate: rep, coded, natural });
    }
  }

  let seed: number | null = null;
  if (input.randomize) seed = input.seed ?? Math.floor(Math.random() * 2 ** 31);
  const htc = input.hardToChange;
  const nGiven = input.augment ? input.augment.runs.length : 0;
  const order = assignRunOrder(
    runsOut.map((r, i) => ({ block: i < nGiven ? 0 : r.block, group: htc !== undefined ? r.coded[htc] : undefined })),
    seed === null ? null : seededRng(seed),
  );
  // Runs already made (block 0 here, so first) keep the order they were given in.
  for (let i = 0; i < nGiven; i++) order[i] = i + 1;
  const runs: DesignRun[] = runsOut.map((r, i) => ({
    standardOrder: r.standardOrder,
    runOrder: order[i]!,
    kind: r.kind,
    block: r.block,
    replicate: r.replicate,
    coded: r.coded,
    natural: r.natural,
  }));

  const letters: Record<string, string> = {};
  names.forEach((n, i) => (letters[factorLetter(i)] = n));
  return {
    design: input.design,
    runs,
    alpha,
    resolution: frac ? romanResolution(frac.resolution) : null,
    aliases: frac ? aliasStructure(frac.definingRelation, k) : {},
    generators: frac ? generatorsToText(frac.generators) : [],
    definingRelation: frac ? frac.definingRelation.map((w) => `I=${w.sign < 0 ? "-" : ""}${wordToLetters(w.word)}`) : [],
    letters,
    blockConfounding: blockWords.map(wordToLetters),
    seed,
    dOptimal: dSummary,
  };
}

function blockOf(row: readonly number[], words: readonly number[]): number {
  return words.length ? blockOfRow(row, words) : 1;
}

/** Runs `fn`, putting `prefix` before the field paths of an AppError it throws. */
function withPathPrefix<T>(prefix: string, fn: () => T): T {
  try {
    return fn();
  } catch (e) {
    if (e instanceof AppError) {
      throw new AppError(e.code, e.message, e.issues.map((i) => ({ ...i, path: i.path ? `${prefix}${i.path}` : prefix.replace(/\.$/, "") })));
    }
    throw e;
  }
}
