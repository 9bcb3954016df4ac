import { beforeAll, describe, expect, it } from "vitest";
import { PLANNING_NOTICE } from "@/lib/hazards/caution-rules";
import { analysisReportDefinition, renderAnalysisReport } from "@/lib/reports/analysis-report";
import { contourSvg } from "@/lib/reports/contour-svg";
import { findOptimum, fitResponseSurface, planConfirmation, surfaceGrid } from "@/lib/surface";
import { flat, pdfPageCount, pdfPagePng, pdfText } from "./pdf-tools";

// Montgomery, Design and Analysis of Experiments, Example 11.2: a central composite
// design, k = 2, α = √2, 5 centre points. Published fit (REFERENCE.md §6):
// ŷ = 79.940 + 0.9950 x1 + 0.5152 x2 − 1.3763 x1² − 1.0013 x2² + 0.2500 x1x2.
const a = Math.SQRT2;
const RUNS: Array<[number, number, number]> = [
  [-1, -1, 76.5], [-1, 1, 77.0], [1, -1, 78.0], [1, 1, 79.5],
  [0, 0, 79.9], [0, 0, 80.3], [0, 0, 80.0], [0, 0, 79.7], [0, 0, 79.8],
  [a, 0, 78.4], [-a, 0, 75.6], [0, a, 78.5], [0, -a, 77.0],
];
const factors = [
  { name: "x1", low: -1, high: 1 },
  { name: "x2", low: -1, high: 1 },
];

describe("analysis report PDF (Montgomery Example 11.2)", () => {
  let pdf: Buffer;
  let text: string;
  let svg: string;
  beforeAll(async () => {
    const { output, model } = fitResponseSurface({ factors, model: "quadratic", runs: RUNS.map(([x1, x2, y]) => ({ coded: { x1, x2 }, response: y })) });
    // An invented unsafe region for the plot: x1 above 1.2 "blocks" (a stand-in for the hazard engine).
    const safety = (n: Record<string, number>) => ({ blocking: (n.x1 ?? 0) > 1.2 ? [{ code: "TL-V02", message: "estimated pressure over the lab's limit (test region)" }] : [] });
    const grid = surfaceGrid(model, { xFactor: "x1", yFactor: "x2", xRange: [-1.5, 1.5], yRange: [-1.5, 1.5], steps: 41, safety });
    const optimum = findOptimum({ kind: "response", model, goal: "maximize" }, { region: "cube" });
    const confirmation = planConfirmation(model, optimum.natural, { replicates: 3, steps: { x1: 0.05, x2: 0.05 } });
    const input = {
      title: "Example 11.2 — yield over time and temperature (coded)",
      studyName: "Test study",
      planNames: ["CCD, 13 runs"],
      response: { name: "yield", unit: "%" },
      factors,
      modelLabel: "full quadratic, no pruning",
      fit: output,
      grid,
      designPoints: RUNS.map(([x1, x2]) => ({ x1, x2 })),
      optimum,
      confirmation,
      issuedAt: "2026-12-01T12:00:00Z",
    };
    svg = contourSvg(grid, { points: input.designPoints, optimum: optimum.natural });
    pdf = await renderAnalysisReport(input);
    text = pdfText(pdf);
    expect(JSON.stringify(analysisReportDefinition(input).content)).toContain("<svg");
  }, 60_000);

  it("is a PDF whose text holds the published coefficients to 4 decimals (Montgomery Ex. 11.2)", () => {
    expect(pdf.subarray(0, 5).toString("latin1")).toBe("%PDF-");
    const t = flat(text);
    for (const [term, value] of [
      ["intercept", "79.9400"],
      ["x1", "0.9950"],
      ["x2", "0.5152"],
      ["x1\\^2", "−1.3763"],
      ["x2\\^2", "−1.0013"],
      ["x1\\*x2", "0.2500"],
    ]) {
      expect(t).toMatch(new RegExp(`${term} ${value}`));
    }
  });

  it("holds the ANOVA with lack of fit and pure error (published: SS 0.2833 on 3 df, 0.2120 on 4 df)", () => {
    const t = flat(text);
    expect(t).toMatch(/Lack of fit 3 0\.2833/);
    expect(t).toMatch(/Pure error 4 0\.2120/);
    // R² 0.9828 (REFERENCE.md §6, computed from the published data).
    expect(t).toContain("R² 0.9828");
  });

  it("names the stationary point's kind, the optimum and the confirmation, the unsafe region and the notice", () => {
    const t = flat(text);
    expect(t).toMatch(/maximum/i);
    expect(t).toContain("Optimum");
    expect(t).toContain("Confirmation");
    expect(t).toContain("TL-V02");
    expect(t).toContain(PLANNING_NOTICE);
    const pages = pdfPageCount(pdf);
    expect(t).toContain(`page ${pages} of ${pages}`);
  });

  it("draws contour lines, the hatched unsafe region, 13 design points and the optimum", () => {
    expect(svg).toContain('fill="url(#hatch)"');
    expect((svg.match(/stroke="#2b5c9e"/g) ?? []).length).toBeGreaterThanOrEqual(5);
    // 13 design points (centre points drawn on top of each other) inside the plotted ±1.5 range.
    expect((svg.match(/<circle [^>]*r="2.6"/g) ?? []).length).toBe(13);
  });

  it("renders page 1 to a PNG artifact (test-results/reports/analysis-report-page1.png)", () => {
    const png = pdfPagePng(pdf, "analysis-report-page1");
    expect(png.subarray(1, 4).toString("latin1")).toBe("PNG");
    // The page with the contour plot, to look at.
    const page = text.split("\f").findIndex((p) => p.includes("Contour plot and safe envelope")) + 1;
    expect(page).toBeGreaterThan(0);
    pdfPagePng(pdf, "analysis-report-contour", page);
  });
});
