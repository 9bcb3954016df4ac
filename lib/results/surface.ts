/**
 * The response surface of an analysis, pure (issue 13 "Surfaces"): the fitted model of
 * the analysis query (lib/results/analysis.ts `fitQuery`, the `fit` verb's own function)
 * evaluated over two factors in natural units with the others held where the chemist
 * sets them (lib/surface `surfaceGrid`), the axes extendable past the studied range; the
 * safe envelope evaluated at every grid point by the hazard engine
 * (lib/results/envelope.ts: blocking cautions and the lab's limits), and the regions a
 * chart shades or hatches as outlines with a label point each (lib/surface
 * `maskRegion`): the extrapolated region, the points where a blocking caution fires, and
 * the points outside the lab's limits; each caution with the share of the grid it covers.
 * The design points come with their observed result and whether they sit on the slice
 * drawn (their other factors where the sliders hold them).
 */
import { AppError, type FieldIssue } from "../errors/app-error";
import { codeValue, decodeValue } from "../doe/factors";
import type { FittedModel } from "../stats/fitted-model";
import { maskLabel, maskRegion, type MaskRegion } from "../surface/regions";
import { surfaceGrid, type SurfaceGrid } from "../surface/grid";
import { studiedRanges } from "../surface/studied-region";
import type { StudyResponse } from "../studies/schemas";
import type { AnalysisPlanSource, AnalysisRunStatus } from "./analysis-input";
import { envelopeOf, fitQuery, type EnvelopeSource } from "./analysis";
import { findingKind, findingTitle, type FindingKind } from "./envelope-codes";
import type { SurfaceQuery } from "./schemas";

/** A factor of the surface: its limits, unit and the range of the runs (natural units), for the axes and sliders. */
export interface SurfaceFactor {
  name: string;
  unit: string;
  low: number;
  high: number;
  scale: "linear" | "log";
  studied: [number, number];
}

/** A design point overlaid on the surface. */
export interface SurfacePoint {
  planId: string;
  planName: string;
  run: number;
  x: number;
  y: number;
  observed: number | null;
  status: AnalysisRunStatus;
  /** Its other factors sit where the surface holds them (within 0.05 coded units): the point lies on the slice drawn. */
  onSlice: boolean;
}

/** A finding of the envelope somewhere on the grid: a blocking caution or a limit, where to label it and how much it covers. */
export interface SurfaceFinding {
  /** Index into `grid.cautions` (and the indices in `grid.blocked`). */
  index: number;
  code: string;
  kind: FindingKind;
  title: string;
  /** The message at the first grid point where it fired. */
  message: string;
  points: number;
  /** The share of the grid it covers (0…1). */
  share: number;
  /** A point well inside its own region (natural units [x, y]). */
  label: [number, number] | null;
}

export interface SurfaceAnswer {
  response: { name: string; unit: string };
  transform: "none" | "ln";
  x: string;
  y: string;
  factors: SurfaceFactor[];
  /** The grid (lib/surface `surfaceGrid`): z[j][i] at (xNatural[i], yNatural[j]), extrapolated and blocked marks. */
  grid: SurfaceGrid;
  /** The extrapolated region (outside the range of the runs) as outlines. */
  extrapolated: MaskRegion;
  envelope: {
    /** Whether the hazard engine was asked at every grid point. */
    checked: boolean;
    /** The plan whose document the envelope uses. */
    of: { id: string; name: string } | null;
    note: string | null;
    /** Where some blocking caution fires, and where some limit of the lab is left, as outlines. */
    cautions: MaskRegion;
    limits: MaskRegion;
    findings: SurfaceFinding[];
  };
  points: SurfacePoint[];
}

/** The two factors with the largest effects (the sum of |coded estimate| over the terms that hold each), in factor order. */
export function strongestPair(model: FittedModel): [string, string] {
  const names = model.factors.map((f) => f.name);
  const weight = names.map((_, i) => model.terms.reduce((s, t, j) => s + (t.exponents[i]! > 0 ? Math.abs(model.coefficients[j]!) : 0), 0));
  const order = names.map((_, i) => i).sort((a, b) => weight[b]! - weight[a]! || a - b);
  const pair = [order[0]!, order[1]!].sort((p, q) => p - q);
  return [names[pair[0]!]!, names[pair[1]!]!];
}

/** The grid engine's paths said at the query's own parameters. */
function queryIssues(issues: readonly FieldIssue[]): FieldIssue[] {
  return issues.map((i) => ({
    path: i.path === "xFactor" ? "x" : i.path === "yFactor" ? "y" : i.path.startsWith("fixed.") ? `hold.${i.path.slice(6)}` : i.path.replace(/^(xRange|yRange)\.\d+$/, "$1"),
    message: i.message,
  }));
}

/**
 * The surface of the analysis query over the plans. `holdDefaults` gives the held value of
 * a factor the query does not hold (else its centre).
 * Example: surfaceOfSources([source], study.responses, query, { plan, document }).envelope.findings
 * @throws AppError invalid_input at the query's parameters (`x`, `y`, `xRange`, `yRange`,
 *   `hold.<factor>`, and the analysis query's own).
 */
export function surfaceOfSources(
  sources: readonly AnalysisPlanSource[],
  responses: readonly StudyResponse[],
  query: SurfaceQuery,
  envelope: EnvelopeSource,
  holdDefaults: Readonly<Record<string, number>> = {},
): SurfaceAnswer {
  const fitted = fitQuery(sources, responses, query);
  const { model } = fitted;
  const names = model.factors.map((f) => f.name);
  if (names.length < 2) throw AppError.field("x", "a surface needs two factors; the plan varies one");
  const [dx, dy] = strongestPair(model);
  const x = query.x ?? (query.y === dx ? dy : dx);
  const y = query.y ?? (x === dy ? dx : dy);
  const issues: FieldIssue[] = [];
  if (!names.includes(x)) issues.push({ path: "x", message: `is not a factor (${names.join(", ")})` });
  if (!names.includes(y)) issues.push({ path: "y", message: `is not a factor (${names.join(", ")})` });
  else if (x === y) issues.push({ path: "y", message: "must differ from x" });
  for (const k of Object.keys(query.hold)) if (!names.includes(k)) issues.push({ path: `hold.${k}`, message: `is not a factor (${names.join(", ")})` });
  if (issues.length) throw new AppError("invalid_input", "The surface request is not valid.", issues);
  const fixed: Record<string, number> = {};
  for (const n of names) {
    if (n === x || n === y) continue;
    const v = query.hold[n] ?? holdDefaults[n];
    if (v !== undefined) fixed[n] = v;
  }
  const { envelope: env, note } = envelopeOf(envelope);
  let grid: SurfaceGrid;
  try {
    grid = surfaceGrid(model, {
      xFactor: x,
      yFactor: y,
      steps: query.steps,
      ...(query.xRange ? { xRange: query.xRange } : {}),
      ...(query.yRange ? { yRange: query.yRange } : {}),
      fixed,
      ...(env ? { safety: env.check } : {}),
    });
  } catch (e) {
    if (e instanceof AppError && e.code === "invalid_input") throw new AppError("invalid_input", "The surface request is not valid.", queryIssues(e.issues));
    throw e;
  }

  const nx = grid.xNatural.length;
  const ny = grid.yNatural.length;
  const total = nx * ny;
  const maskOf = (test: (cell: readonly number[]) => boolean) => grid.blocked?.map((row) => row.map(test)) ?? null;
  const kinds = grid.cautions.map((c) => findingKind(c.code));
  const regionOf = (mask: boolean[][] | null) => (mask ? maskRegion(mask, grid.xNatural, grid.yNatural) : { rings: [], label: null, share: 0 });
  // Each finding is labelled where it is most alone (the fewest other findings fire there), so nested regions get labels apart.
  const findings: SurfaceFinding[] = grid.cautions.map((c, k) => {
    const mask = maskOf((cell) => cell.includes(k))!;
    let fewest = Infinity;
    for (const row of grid.blocked!) for (const cell of row) if (cell.includes(k)) fewest = Math.min(fewest, cell.length);
    const alone = grid.blocked!.map((row) => row.map((cell) => cell.includes(k) && cell.length === fewest));
    return { index: k, code: c.code, kind: kinds[k]!, title: findingTitle(c.code), message: c.message, points: c.points, share: c.points / total, label: maskLabel(mask, grid.xNatural, grid.yNatural, alone) };
  });
  const ranges = studiedRanges(model);
  const factors: SurfaceFactor[] = model.factors.map((f, i) => ({
    name: f.name,
    unit: f.unit ?? "",
    low: f.low,
    high: f.high,
    scale: f.scale ?? "linear",
    studied: [decodeValue(f, ranges[i]!.lo), decodeValue(f, ranges[i]!.hi)],
  }));
  const heldCoded = model.factors.map((f) => (f.name in grid.fixed ? codeValue(f, grid.fixed[f.name]!) : null));
  const natural = new Map<string, Record<string, number>>();
  for (const s of sources) for (const r of s.runs) natural.set(`${s.id}:${r.run}`, r.natural);
  const points: SurfacePoint[] = fitted.runs.map((r) => {
    const n = natural.get(`${r.planId}:${r.run}`) ?? {};
    const onSlice = model.factors.every((f, i) => heldCoded[i] === null || Math.abs(codeValue(f, n[f.name]!) - heldCoded[i]!) <= 0.05);
    return { planId: r.planId, planName: r.planName, run: r.run, x: n[x]!, y: n[y]!, observed: r.observed, status: r.status, onSlice };
  });
  return {
    response: { name: fitted.response.name, unit: fitted.response.unit ?? "" },
    transform: model.transform,
    x,
    y,
    factors,
    grid,
    // Labelled where nothing blocks, when there is such a place (the hatching would hide it).
    extrapolated: maskRegion(grid.extrapolated, grid.xNatural, grid.yNatural, grid.extrapolated.map((row, j) => row.map((e, i) => e && !grid.blocked?.[j]?.[i]?.length))),
    envelope: {
      checked: env !== null,
      of: envelope ? envelope.plan : null,
      note,
      cautions: regionOf(maskOf((cell) => cell.some((k) => kinds[k] === "caution"))),
      limits: regionOf(maskOf((cell) => cell.some((k) => kinds[k] === "limit"))),
      findings,
    },
    points,
  };
}
