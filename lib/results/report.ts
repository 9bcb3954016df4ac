/**
 * The analysis report's input, pure (issue 13 "The analysis report"): the analysis of the
 * query (lib/results/analysis.ts — the `fit` verb's output, the optimum in the region and the
 * safe envelope), the contour of the surface through the best conditions (lib/results/surface.ts;
 * the two strongest factors unless the query names them, the other factors held at the
 * optimum unless it holds them), the design points, and an optional confirmation, as
 * lib/reports/analysis-report.ts takes them.
 */
import type { AnalysisReportInput } from "../reports/analysis-report";
import { analyzeSources, analyzeSourcesWithModel, type AnalysisAnswer, type EnvelopeSource } from "./analysis";
import { confirmationChecks, type ConfirmationCheck, type ConfirmationSource } from "./confirmation-check";
import type { AnalysisPlanSource } from "./analysis-input";
import type { StudyResponse } from "../studies/schemas";
import type { SurfaceQuery } from "./schemas";
import { surfaceOfSources } from "./surface";

/** A confirmation to print (the next-design stream's confirmation plan and its results), as the report takes it. */
export type ReportConfirmation = NonNullable<AnalysisReportInput["confirmation"]>;

/** The model asked for and the pruning, in words ("full quadratic, backward elimination at α = 0.05 keeping hierarchy"). */
export function modelWords(a: AnalysisAnswer): string {
  const m = a.analysis.model;
  const named = { linear: "first-order (linear)", interaction: "first-order with two-factor interactions", quadratic: "full quadratic" } as const;
  const model = typeof m === "string" ? named[m] : `terms ${m.join(", ")}`;
  const prune = a.analysis.alpha === null ? "no pruning" : `backward elimination at α = ${a.analysis.alpha}${a.analysis.hierarchy ? " keeping hierarchy" : ""}`;
  const blocks = a.analysis.plans.length > 1 ? `, a block per plan (${a.analysis.plans.length} plans)` : "";
  return `${model}, ${prune}${a.transform === "ln" ? ", ln of the response" : ""}${blocks}; coded units`;
}

/**
 * Everything the report prints, from the plans' data and the query.
 * Example: reportInput({ sources, responses, envelope, query, title: plan.name, studyName }).optimum?.natural
 * @throws AppError invalid_input at the query's parameters, as the analysis and the surface.
 */
export function reportInput(opts: {
  sources: readonly AnalysisPlanSource[];
  responses: readonly StudyResponse[];
  envelope: EnvelopeSource;
  query: SurfaceQuery;
  title: string;
  studyName: string;
  authorName?: string | null;
  confirmation?: ReportConfirmation | null;
  issuedAt?: string;
}): AnalysisReportInput {
  const a = analyzeSources(opts.sources, opts.responses, opts.query, opts.envelope);
  const s = opts.sources[0]!.factors.length >= 2 ? surfaceOfSources(opts.sources, opts.responses, opts.query, opts.envelope, a.optimum?.natural ?? {}) : null;
  const { optimum, analysis, ...fit } = a;
  const natural = new Map<string, Record<string, number>>();
  for (const src of opts.sources) for (const r of src.runs) natural.set(`${src.id}:${r.run}`, r.natural);
  return {
    title: opts.title,
    studyName: opts.studyName,
    planNames: analysis.plans.map((p) => p.name),
    authorName: opts.authorName ?? null,
    response: { name: analysis.response.name, unit: analysis.response.unit || null },
    factors: opts.sources[0]!.factors.map((f) => ({ name: f.name, unit: f.unit ?? null, low: f.low, high: f.high })),
    modelLabel: modelWords(a),
    fit,
    grid: s?.grid ?? null,
    designPoints: analysis.runs.filter((r) => r.status === "used").map((r) => natural.get(`${r.planId}:${r.run}`) ?? {}),
    optimum,
    envelopeFindings: s ? s.envelope.findings : null,
    envelopeOf: analysis.envelopeOf?.name ?? null,
    desirability: analysis.desirability,
    optimumNote: analysis.optimumNote,
    confirmation: opts.confirmation ?? null,
    ...(opts.issuedAt ? { issuedAt: opts.issuedAt } : {}),
  };
}

/**
 * The confirmation a plan's report prints: of the confirmation plans derived from it, judged
 * against the model of the report's query (lib/results/confirmation-check.ts, as the analysis
 * page judges them), the latest with a verdict, else the latest; null when there is none or it
 * cannot be judged against this model (a factor missing).
 * Example: reportConfirmation({ sources, responses, envelope, query, confirmations })?.verdict?.holds
 */
export function reportConfirmation(opts: {
  sources: readonly AnalysisPlanSource[];
  responses: readonly StudyResponse[];
  envelope: EnvelopeSource;
  query: SurfaceQuery;
  confirmations: readonly ConfirmationSource[];
}): ReportConfirmation | null {
  if (opts.confirmations.length === 0) return null;
  const { answer, model } = analyzeSourcesWithModel(opts.sources, opts.responses, opts.query, opts.envelope);
  const checks = confirmationChecks(model, answer.analysis.response.name, opts.query, opts.confirmations);
  const chosen = checks.filter((c) => c.verdict).at(-1) ?? checks.at(-1);
  return chosen ? confirmationForReport(chosen) : null;
}

/** A judged confirmation plan in the shape the report prints (its runs at one settable point). */
export function confirmationForReport(c: ConfirmationCheck): ReportConfirmation | null {
  if (c.predicted === null) return null;
  const observed = c.runs.filter((r) => r.observed !== null).map((r) => r.observed!);
  return {
    natural: c.point.natural,
    coded: c.point.coded,
    steps: {},
    moved: false,
    movedBecause: [],
    runs: c.runs.map((r, i) => ({ kind: "confirmation", replicate: i + 1, natural: c.point.natural, coded: c.point.coded })),
    predicted: c.predicted,
    pi95: c.pi95,
    mean: { predicted: c.predicted, replicates: c.runs.length, interval95: c.meanInterval95 },
    warnings: [`Confirmation plan “${c.plan.name}” (${c.plan.state.replace(/_/g, " ")}).`, ...(c.note ? [c.note] : [])],
    observed,
    verdict: c.verdict,
  };
}
