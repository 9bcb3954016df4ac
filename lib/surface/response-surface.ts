/**
 * The `fit` verb of CONTRACT.md: the statistics engine's fit (lib/stats) followed by
 * the canonical analysis of a second-order model (Box & Wilson 1951; Myers, Montgomery
 * & Anderson-Cook, Response Surface Methodology, §6.3), the one place where the two are
 * put together.
 */
import { decodeValue } from "../doe/factors";
import { fitModelWithPredictor, type FitOutput } from "../stats/fit";
import type { FittedModel } from "../stats/fitted-model";
import { isSquareTerm } from "../stats/model-terms";
import { canonicalAnalysis, describeCanonical, type CanonicalDirection, type RidgeKind, type SurfaceKind } from "./canonical";
import { formatNatural } from "../doe/format";
import { outsideStudied, studiedRanges } from "./studied-region";

/** The canonical analysis as the `fit` output reports it (CONTRACT.md), coded and natural. */
export interface CanonicalOutput {
  stationaryPoint: { coded: Record<string, number>; natural: Record<string, number> } | null;
  /** ŷ at the stationary point on the response's own scale. */
  predicted: number | null;
  eigenvalues: number[];
  eigenvectors: Record<string, number>[];
  kind: SurfaceKind;
  /** For a ridge: stationary (its stationary point inside the studied region), rising or falling; else null. */
  ridge: RidgeKind | null;
  /** Whether the stationary point lies in the studied region (the range of the runs); null without one. */
  stationaryInside: boolean | null;
  /** The analysis in words: what kind of surface, where, and along which factors. */
  description: string;
  /** Each canonical axis in words, in the order of `eigenvalues`. */
  directions: CanonicalDirection[];
}

/** The CONTRACT.md `fit` output: the statistics engine's fit plus `canonical`. */
export interface SurfaceFitOutput extends FitOutput {
  canonical: CanonicalOutput | null;
}

/**
 * The canonical analysis of a fitted model with square terms, in coded and natural
 * units; null (with the reason) when the model has no square term or a term above
 * second order.
 * Example: canonicalOfModel(model).canonical?.kind === "maximum"
 */
export function canonicalOfModel(model: FittedModel): { canonical: CanonicalOutput | null; warning: string | null } {
  if (!model.terms.some(isSquareTerm)) return { canonical: null, warning: null };
  const names = model.factors.map((f) => f.name);
  const ca = canonicalAnalysis(model.terms, model.coefficients, names.length);
  if (!ca) return { canonical: null, warning: "Canonical analysis skipped: the model has terms above second order." };
  const toRec = (v: readonly number[]) => Object.fromEntries(names.map((nm, i) => [nm, v[i]!]));
  const back = (v: number | null) => (v === null ? null : model.transform === "ln" ? Math.exp(v) : v);
  const ranges = studiedRanges(model);
  const words = describeCanonical(
    ca,
    names,
    (x) => formatNatural(model.factors, x),
    (x) => outsideStudied(ranges, x).length === 0,
  );
  return {
    canonical: {
      stationaryPoint: ca.stationaryPoint
        ? { coded: toRec(ca.stationaryPoint), natural: toRec(ca.stationaryPoint.map((x, i) => decodeValue(model.factors[i]!, x))) }
        : null,
      predicted: back(ca.predicted),
      eigenvalues: ca.eigenvalues,
      eigenvectors: ca.eigenvectors.map(toRec),
      kind: ca.kind,
      ridge: words.ridge,
      stationaryInside: words.stationaryInside,
      description: words.description,
      directions: words.directions,
    },
    warning: null,
  };
}

/**
 * Fits a response-surface model (CONTRACT.md `fit`): `fitModelWithPredictor` of
 * lib/stats, then the canonical analysis. Throws as `fitModelWithPredictor` (an
 * invalid-input AppError naming the field).
 * Example: fitResponseSurface({ factors, runs, model: "quadratic" }).output.canonical?.kind
 */
export function fitResponseSurface(raw: unknown): { output: SurfaceFitOutput; model: FittedModel } {
  const { output, model } = fitModelWithPredictor(raw);
  const { canonical, warning } = canonicalOfModel(model);
  if (warning) output.warnings.push(warning);
  return { output: { ...output, canonical }, model };
}
