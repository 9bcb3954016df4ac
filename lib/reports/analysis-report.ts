import "server-only";
/**
 * The analysis report PDF (issue 13 item 5): the model fitted, its coefficient and
 * ANOVA tables with lack of fit, the fit statistics, the canonical analysis in words,
 * the diagnostics per run, the contour plot with the unsafe region hatched
 * (lib/reports/contour-svg.ts), the optimum and the confirmation, and the safety
 * notice; every page numbered "page N of M".
 *
 * Takes plain data: the `fit` output (lib/surface `fitResponseSurface(...).output`), a
 * surface grid (lib/surface `surfaceGrid`), the `optimize` output and a confirmation
 * plan (lib/surface `planConfirmation`), each optional except the fit.
 */
import type { Content, TableCell, TDocumentDefinitions } from "pdfmake/interfaces";
import { PLANNING_NOTICE } from "../hazards/caution-rules";
import type { AnovaRow } from "../stats/fit";
import type { ConfirmationPlan, ConfirmationVerdict, OptimizeOutput, SurfaceFitOutput, SurfaceGrid } from "../surface";
import { contourSvg } from "./contour-svg";
import { displayUnit, fixed, significant, utcMinute, withUnit } from "./format";
import { renderPdf } from "./pdf";
import { SEVERITY_STYLE, sheetStyles, SHEET_PAGE, tableLayout } from "./sheet-style";

export interface AnalysisReportInput {
  title: string;
  studyName: string;
  /** The plans whose results were fitted. */
  planNames: string[];
  authorName?: string | null;
  response: { name: string; unit?: string | null };
  /** The factors with their units (as in the fit input). */
  factors: ReadonlyArray<{ name: string; unit?: string | null; low: number; high: number }>;
  /** The model as asked for ("quadratic", or the term list) and the pruning, in words. */
  modelLabel: string;
  fit: SurfaceFitOutput;
  grid?: SurfaceGrid | null;
  /** Design points to overlay on the contour plot (natural values by factor name). */
  designPoints?: ReadonlyArray<Record<string, number>>;
  optimum?: OptimizeOutput | null;
  /**
   * The envelope's findings on the grid (lib/results/surface.ts), by the grid's caution
   * index: blocking cautions and the lab's limits, with a label point each. Without it every
   * blocked cell is a blocking caution, unlabelled on the plot.
   */
  envelopeFindings?: ReadonlyArray<{ code: string; kind: "caution" | "limit"; title: string; message: string; share: number; label: [number, number] | null }> | null;
  /** The plan whose recipe, vessel and scale the envelope is for. */
  envelopeOf?: string | null;
  /** Several responses optimised together: each one's goal and bounds. */
  desirability?: ReadonlyArray<{ name: string; unit: string | null; goal: string; low: number; high: number; target: number | null; bounds: "study" | "observed" }> | null;
  /** Why there is no optimum, or a remark on it. */
  optimumNote?: string | null;
  confirmation?: (ConfirmationPlan & { observed?: number[] | null; verdict?: ConfirmationVerdict | null }) | null;
  issuedAt?: string;
}

/** Estimates and their intervals to 4 decimals (the published worked examples print that many). */
const est = (v: number | null | undefined) => (v === null || v === undefined ? "—" : fixed(v, 4));
const pval = (p: number | null | undefined) => (p === null || p === undefined ? "—" : p < 0.0001 ? "< 0.0001" : fixed(p, 4));
const num = (v: number | null | undefined, d = 4) => (v === null || v === undefined ? "—" : significant(v, d));

function coefficientTable(fit: SurfaceFitOutput): Content {
  const body: TableCell[][] = [
    ["Term", "Estimate (coded)", "Std. error", "t", "p", "95 % interval"].map((h, i): TableCell => ({ text: h, style: "th", alignment: i === 0 ? "left" : "right" })),
  ];
  for (const t of fit.terms) {
    body.push([
      t.term,
      { text: est(t.estimate), alignment: "right" },
      { text: est(t.stdError), alignment: "right" },
      { text: t.t === null ? "—" : fixed(t.t, 2), alignment: "right" },
      { text: pval(t.p), alignment: "right" },
      { text: t.ci95 ? `${est(t.ci95[0])} to ${est(t.ci95[1])}` : "—", alignment: "right" },
    ]);
  }
  return { table: { headerRows: 1, widths: ["*", 70, 60, 40, 50, 110], body }, layout: tableLayout("rows") };
}

function anovaTable(fit: SurfaceFitOutput): Content {
  const a = fit.anova;
  const rows: Array<[string, AnovaRow | { df: number; ss: number } | null]> = [
    ["Blocks", a.blocks],
    ["Model", a.model],
    ["Residual", a.residual],
    ["  Lack of fit", a.lackOfFit],
    ["  Pure error", a.pureError],
    ["Total", a.total],
  ];
  const body: TableCell[][] = [["Source", "df", "Sum of squares", "Mean square", "F", "p"].map((h, i): TableCell => ({ text: h, style: "th", alignment: i === 0 ? "left" : "right" }))];
  for (const [label, r] of rows) {
    if (!r) continue;
    const row = r as Partial<AnovaRow> & { df: number; ss: number };
    body.push([
      { text: label, preserveLeadingSpaces: true },
      { text: String(row.df), alignment: "right" },
      { text: fixed(row.ss, 4), alignment: "right" },
      { text: row.ms === undefined ? "" : row.ms === null ? "—" : fixed(row.ms, 4), alignment: "right" },
      { text: row.f === undefined || row.f === null ? "" : fixed(row.f, 2), alignment: "right" },
      { text: row.p === undefined || row.p === null ? "" : pval(row.p), alignment: "right" },
    ]);
  }
  return { table: { headerRows: 1, widths: ["*", 30, 80, 80, 50, 60], body }, layout: tableLayout("rows") };
}

function statsTable(fit: SurfaceFitOutput): Content {
  const s = fit.stats;
  const cells: Array<[string, string]> = [
    ["Runs fitted", String(s.n)],
    ["Terms", String(s.p)],
    ["Residual df", String(s.dfResidual)],
    ["R²", s.r2 === null ? "—" : fixed(s.r2, 4)],
    ["Adjusted R²", s.adjR2 === null ? "—" : fixed(s.adjR2, 4)],
    ["Predicted R² (PRESS)", s.predR2 === null ? "—" : fixed(s.predR2, 4)],
    ["RMSE", num(s.rmse)],
    ["Response transform", fit.transform === "ln" ? "ln y" : "none"],
  ];
  return { table: { widths: [130, "*"], body: cells.map(([k, v]) => [{ text: k, style: "label" }, v]) }, layout: "noBorders" };
}

function diagnosticsTable(fit: SurfaceFitOutput): Content {
  const body: TableCell[][] = [
    ["Run", "Observed", "Fitted", "Residual", "Leverage", "Studentized", "Cook's D"].map((h, i): TableCell => ({ text: h, style: "th", alignment: i === 0 ? "left" : "right" })),
  ];
  for (const d of fit.diagnostics) {
    const flag = d.studentized !== null && Math.abs(d.studentized) > 3;
    body.push([
      String(d.run),
      { text: num(d.observed), alignment: "right" },
      { text: num(d.fitted), alignment: "right" },
      { text: num(d.residual, 3), alignment: "right" },
      { text: fixed(d.leverage, 3), alignment: "right" },
      { text: d.studentized === null ? "—" : fixed(d.studentized, 2), alignment: "right", color: flag ? SEVERITY_STYLE.blocking.fg : undefined, bold: flag },
      { text: d.cooksDistance === null ? "—" : fixed(d.cooksDistance, 3), alignment: "right" },
    ]);
  }
  return { table: { headerRows: 1, widths: [30, "*", "*", "*", "*", "*", "*"], body }, layout: tableLayout("zebra"), fontSize: 7.5 };
}

function contourSection(input: AnalysisReportInput): Content[] {
  const g = input.grid;
  if (!g) return [];
  const unit = (name: string) => input.factors.find((f) => f.name === name)?.unit ?? undefined;
  const svg = contourSvg(g, {
    width: 500,
    height: 360,
    xUnit: unit(g.xFactor),
    yUnit: unit(g.yFactor),
    responseName: input.response.name,
    responseUnit: input.response.unit ?? undefined,
    points: input.designPoints,
    optimum: input.optimum?.natural ?? null,
    font: "Sans",
    ...(input.envelopeFindings ? { cautionKinds: input.envelopeFindings.map((f) => f.kind), labels: input.envelopeFindings.filter((f) => f.label).map((f) => ({ at: f.label!, text: f.code, kind: f.kind })) } : {}),
  });
  const held = Object.entries(g.fixed).map(([k, v]) => withUnit(v, unit(k)));
  const legend: Content[] = [
    {
      text: `Contours of predicted ${input.response.name}${input.response.unit ? ` (${displayUnit(input.response.unit)})` : ""} over ${g.xFactor} and ${g.yFactor}${held.length > 0 ? `, the other factors held at ${Object.keys(g.fixed).map((k, i) => `${k} ${held[i]}`).join(", ")}` : ""}. Dots: design points; cross: the optimum; dotted grey: extrapolated beyond the runs.`,
      style: "small",
    },
  ];
  const findings = input.envelopeFindings ?? g.cautions.map((c) => ({ code: c.code, kind: "caution" as const, title: c.code, message: c.message, share: c.points / (g.xNatural.length * g.yNatural.length), label: null }));
  const pct = (v: number) => `${significant(v * 100, 3)} % of the plot`;
  const cautions = findings.filter((f) => f.kind === "caution");
  const limits = findings.filter((f) => f.kind === "limit");
  if (cautions.length > 0) {
    legend.push({
      stack: [
        { text: "Hatched red: a blocking caution fires there", bold: true, color: SEVERITY_STYLE.blocking.fg },
        { ul: cautions.map((c) => ({ text: [{ text: `${c.code} `, bold: true }, `${c.title === c.code ? "" : `${c.title} (${pct(c.share)}). `}e.g. ${c.message}`] })) },
      ],
      style: "small",
      margin: [0, 3, 0, 0],
    });
  }
  if (limits.length > 0) {
    legend.push({
      stack: [{ text: "Hatched grey the other way, dashed edge: outside the lab's limits", bold: true }, { ul: limits.map((c) => ({ text: [{ text: `${c.code} `, bold: true }, `${c.title} (${pct(c.share)}). e.g. ${c.message}`] })) }],
      style: "small",
      margin: [0, 3, 0, 0],
    });
  }
  if (findings.length === 0 && g.blocked) {
    legend.push({ text: "No blocking caution fires anywhere on this grid.", style: "small", margin: [0, 2, 0, 0] });
  }
  if (g.blocked && input.envelopeOf) legend.push({ text: `The envelope is the hazard engine's verdict at every grid point for the recipe, solvent, vessel and scale of ${input.envelopeOf}.`, style: "small", margin: [0, 2, 0, 0] });
  return [{ stack: [{ text: "Contour plot and safe envelope", style: "h2" }, { svg, width: 500 }, ...legend], unbreakable: true }];
}

function optimumSection(input: AnalysisReportInput): Content[] {
  const o = input.optimum;
  if (!o) return input.optimumNote ? [{ text: "Optimum", style: "h2" }, { text: input.optimumNote }] : [];
  const unitOf = (name: string) => input.factors.find((f) => f.name === name)?.unit ?? undefined;
  const ru = input.response.unit ?? undefined;
  const rows: Array<[string, string]> = Object.entries(o.natural).map(([k, v]) => [k, withUnit(v, unitOf(k))]);
  if (o.responses && o.responses.length > 0) {
    for (const r of o.responses) {
      const u = input.desirability?.find((d) => d.name === r.name)?.unit ?? undefined;
      rows.push([`Predicted ${r.name}`, `${withUnit(r.predicted, u)}${r.ci95 ? `; 95 % confidence ${withUnit(r.ci95[0], u)} to ${withUnit(r.ci95[1], u)}` : ""}${r.pi95 ? `; 95 % prediction ${withUnit(r.pi95[0], u)} to ${withUnit(r.pi95[1], u)}` : ""}; d = ${fixed(r.desirability, 3)}`]);
    }
    if (o.desirability !== null) rows.push(["Overall desirability", fixed(o.desirability, 3)]);
    for (const d of input.desirability ?? []) {
      const u = d.unit ?? undefined;
      rows.push([`Goal of ${d.name}`, `${d.goal === "target" ? `target ${withUnit(d.target ?? NaN, u)}, acceptable ${withUnit(d.low, u)} to ${withUnit(d.high, u)}` : `${d.goal}, scaled from ${withUnit(d.low, u)} to ${withUnit(d.high, u)}`}${d.bounds === "observed" ? " (the lowest and highest result)" : ""}`]);
    }
  } else {
    rows.push([`Predicted ${input.response.name}`, withUnit(o.predicted, ru)]);
    if (o.ci95) rows.push(["95 % confidence interval", `${withUnit(o.ci95[0], ru)} to ${withUnit(o.ci95[1], ru)}`]);
    if (o.pi95) rows.push(["95 % prediction interval", `${withUnit(o.pi95[0], ru)} to ${withUnit(o.pi95[1], ru)}`]);
  }
  rows.push(["Region", `${o.region === "cube" ? "the cube of the factor ranges" : `the design's sphere (radius ${significant(o.radius ?? NaN, 4)} coded)`}${o.safety.checked ? ", inside the safe envelope and the lab's limits" : ""}`]);
  if (o.onBoundary.length > 0) rows.push(["On the edge of the region", o.onBoundary.join(", ")]);
  const out: Content[] = [
    { text: "Optimum", style: "h2" },
    { table: { widths: [150, "*"], body: rows.map(([k, v]) => [{ text: k, style: "label" }, v]) }, layout: tableLayout("list") },
  ];
  if (o.safety.blockedWithoutEnvelope.length > 0) {
    out.push({
      text: `Without the safe envelope the best point would trip ${o.safety.blockedWithoutEnvelope.map((c) => c.code).join(", ")}: the optimum shown is the best point inside it.`,
      color: SEVERITY_STYLE.warning.fg,
      margin: [0, 3, 0, 0],
    });
  }
  for (const w of o.warnings) out.push({ text: `Warning: ${w}`, color: SEVERITY_STYLE.warning.fg, margin: [0, 2, 0, 0] });
  return out;
}

function confirmationSection(input: AnalysisReportInput): Content[] {
  const c = input.confirmation;
  if (!c) return [];
  const unitOf = (name: string) => input.factors.find((f) => f.name === name)?.unit ?? undefined;
  const ru = input.response.unit ?? undefined;
  const rows: Array<[string, string]> = [
    ["Settings", Object.entries(c.natural).map(([k, v]) => `${k} ${withUnit(v, unitOf(k))}`).join(", ")],
    ["Replicate runs", String(c.runs.length)],
    ["Predicted (one run)", `${withUnit(c.predicted, ru)}${c.pi95 ? `, 95 % prediction interval ${withUnit(c.pi95[0], ru)} to ${withUnit(c.pi95[1], ru)}` : ""}`],
    ["Mean of the replicates", c.mean.interval95 ? `95 % interval ${withUnit(c.mean.interval95[0], ru)} to ${withUnit(c.mean.interval95[1], ru)}` : "—"],
  ];
  if (c.moved) rows.push(["Moved after rounding", c.movedBecause.join("; ")]);
  if (c.observed && c.observed.length > 0) rows.push(["Observed", c.observed.map((v) => withUnit(v, ru)).join(", ")]);
  const out: Content[] = [
    { text: "Confirmation", style: "h2" },
    { table: { widths: [150, "*"], body: rows.map(([k, v]) => [{ text: k, style: "label" }, v]) }, layout: tableLayout("list") },
  ];
  if (c.verdict && c.verdict.holds === null) out.push({ text: c.verdict.message, margin: [0, 3, 0, 0] });
  else if (c.verdict) {
    const holds = c.verdict.holds;
    out.push({ text: holds ? "The confirmation holds: the observed mean lies inside the interval." : "The confirmation does not hold: the observed mean lies outside the interval.", bold: true, color: holds ? SEVERITY_STYLE.ok.fg : SEVERITY_STYLE.blocking.fg, margin: [0, 3, 0, 0] });
  }
  for (const w of c.warnings) out.push({ text: `Warning: ${w}`, color: SEVERITY_STYLE.warning.fg, margin: [0, 2, 0, 0] });
  return out;
}

/** The pdfmake document of an analysis report (exported for tests that inspect the layout). */
export function analysisReportDefinition(input: AnalysisReportInput): TDocumentDefinitions {
  const fit = input.fit;
  const issuedAt = input.issuedAt ?? new Date().toISOString();
  const factorLine = input.factors.map((f) => `${f.name} ${significant(f.low)} to ${withUnit(f.high, f.unit)}`).join("; ");
  const content: Content[] = [
    { text: "Analysis report", style: "kicker" },
    { text: input.title, style: "title" },
    {
      table: {
        widths: [70, "*"],
        body: [
          [{ text: "Study", style: "label" }, input.studyName],
          [{ text: input.planNames.length === 1 ? "Plan" : "Plans", style: "label" }, input.planNames.join(", ")],
          [{ text: "Response", style: "label" }, `${input.response.name}${input.response.unit ? ` (${displayUnit(input.response.unit)})` : ""}`],
          [{ text: "Factors", style: "label" }, factorLine],
          [{ text: "Model", style: "label" }, input.modelLabel],
          ...(input.authorName ? [[{ text: "Author", style: "label" }, input.authorName] as TableCell[]] : []),
          [{ text: "Issued", style: "label" }, utcMinute(issuedAt)],
        ],
      },
      layout: "noBorders",
      margin: [0, 4, 0, 4],
    },
    { text: PLANNING_NOTICE, style: "notice", margin: [0, 4, 0, 0] },
    { text: "Coefficients (coded units)", style: "h2" },
    coefficientTable(fit),
  ];
  if (fit.dropped.length > 0) content.push({ text: `Dropped by backward elimination: ${fit.dropped.join(", ")}.`, style: "small", margin: [0, 2, 0, 0] });
  if (fit.aliased.length > 0) content.push({ text: `Aliased (not estimable from these runs): ${fit.aliased.join(", ")}.`, style: "small", color: SEVERITY_STYLE.warning.fg, margin: [0, 2, 0, 0] });
  content.push({ text: "Analysis of variance", style: "h2" }, anovaTable(fit), { text: "Fit", style: "h2" }, statsTable(fit));
  if (fit.curvature) {
    content.push({ text: `Curvature check (centre points against the factorial mean): F = ${fit.curvature.f === null ? "—" : fixed(fit.curvature.f, 2)}, p = ${pval(fit.curvature.p)}.`, margin: [0, 3, 0, 0] });
  }
  if (fit.canonical) content.push({ text: "Canonical analysis", style: "h2" }, { text: fit.canonical.description });
  for (const w of fit.warnings) content.push({ text: `Warning: ${w}`, color: SEVERITY_STYLE.warning.fg, margin: [0, 2, 0, 0] });
  content.push(...contourSection(input), ...optimumSection(input), ...confirmationSection(input));
  content.push({ text: "Diagnostics per run", style: "h2", pageBreak: "before" }, diagnosticsTable(fit));
  content.push({ text: PLANNING_NOTICE, style: "notice", margin: [0, 10, 0, 0] });
  return {
    ...SHEET_PAGE,
    info: { title: `Analysis — ${input.title}`, subject: input.studyName, creator: "Tareline", producer: "Tareline" },
    footer: (currentPage: number, pageCount: number): Content => ({
      columns: [
        { text: `${input.title} · ${input.response.name}`, style: "footer" },
        { text: `page ${currentPage} of ${pageCount}`, style: "footer", alignment: "right", width: 80 },
      ],
      margin: [SHEET_PAGE.pageMargins[0], 10, SHEET_PAGE.pageMargins[2], 0],
    }),
    content,
    styles: sheetStyles,
  };
}

/**
 * Renders the analysis report to a PDF.
 * Example: const { output, model } = fitResponseSurface(fitInput);
 *   await renderAnalysisReport({ title, studyName, planNames, response: { name: "yield", unit: "%" }, factors, modelLabel: "quadratic",
 *     fit: output, grid: surfaceGrid(model, { xFactor, yFactor, steps: 61, safety }), optimum, confirmation })
 */
export async function renderAnalysisReport(input: AnalysisReportInput): Promise<Buffer> {
  return renderPdf(analysisReportDefinition(input));
}
