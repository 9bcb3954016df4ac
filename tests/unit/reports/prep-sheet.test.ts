import { beforeAll, describe, expect, it } from "vitest";
import { planReport, type PlanReport } from "@/lib/chemistry/plan-report";
import { PLANNING_NOTICE } from "@/lib/hazards/caution-rules";
import { DEFAULT_EQUIPMENT, DEFAULT_LAB_THRESHOLDS } from "@/lib/hazards/thresholds";
import { planChemicalHazards } from "@/lib/reports/plan-hazards";
import { prepSheetDefinition, renderPrepSheet, type PrepSheetInput } from "@/lib/reports/prep-sheet";
import { escapeRegExp, flat, pdfPageCount, pdfPagePng, pdfText } from "./pdf-tools";
import { plan96Document, suzukiDocument } from "./fixtures";

const HASH = "3f9a1c0e7b2d4c6a8e0f1a2b3c4d5e6f7a8b9c0d1e2f3a4b5c6d7e8f9a0b1c2d";

function input(report: PlanReport, document: unknown, positions: number, over: Partial<PrepSheetInput> = {}): PrepSheetInput {
  return {
    plan: { name: report.name ?? "plan", studyName: "Study A — biaryl by Suzuki–Miyaura coupling", authorName: "Demo Chemist", state: "approved", version: 4, contentHash: HASH, labName: "Kestrel Bay Process Chemistry" },
    signature: { signerName: "Demo Safety Officer", signedAt: "2026-12-01T09:30:00Z", meaning: "approved for execution as planned", contentHash: HASH, valid: true },
    runSheet: report,
    cautions: report,
    blockPositions: positions,
    chemicals: planChemicalHazards(document),
    settings: { thresholds: DEFAULT_LAB_THRESHOLDS, equipment: DEFAULT_EQUIPMENT },
    issuedAt: "2026-12-01T10:00:00Z",
    ...over,
  };
}

/** The sheet's amount format (docs/reports.md): 2 decimals below 10, 1 below 100, none from 100. */
function amountText(v: number, unit: string): string {
  return `${v < 10 ? v.toFixed(2) : v < 100 ? v.toFixed(1) : v.toFixed(0)} ${unit}`;
}

/**
 * The run that the vial map's rule (lib/plans/vial-map.ts, stated in its comment) puts in
 * block 1 at A1: the earliest in run order among the runs at the lowest set temperature.
 */
function firstVialRun(report: PlanReport) {
  const coldest = Math.min(...report.runs.map((r) => r.temperatureC));
  return report.runs.filter((r) => r.temperatureC === coldest).sort((a, b) => a.runOrder - b.runOrder)[0]!;
}

describe("prep sheet PDF: the demo's Suzuki–Miyaura screen (examples/plan-suzuki.json through planReport)", () => {
  let report: PlanReport;
  let pdf: Buffer;
  let text: string;
  beforeAll(async () => {
    const doc = suzukiDocument();
    report = planReport(doc);
    pdf = await renderPrepSheet(input(report, doc, 24));
    text = pdfText(pdf);
  }, 60_000);

  it("is a PDF (ISO 32000-1 §7.5.2: the file starts with %PDF-1.x and ends with %%EOF)", () => {
    expect(pdf.subarray(0, 8).toString("latin1")).toMatch(/^%PDF-1\.\d/);
    expect(pdf.subarray(-6).toString("latin1")).toContain("%%EOF");
  });

  it("holds the plan name, the study, the author, the signer and the content hash", () => {
    const t = flat(text);
    expect(t).toContain(report.name!);
    expect(t).toContain("Study A — biaryl by Suzuki–Miyaura coupling");
    expect(t).toContain("Demo Chemist");
    expect(t).toContain("Demo Safety Officer");
    expect(t).toContain("approved for execution as planned");
    expect(text).toContain(HASH);
  });

  it("holds the first dispense row of the first vial: position, run, what, amount and unit", () => {
    const run = firstVialRun(report);
    const d = run.dispense[0]!;
    const amount = d.kind === "solid" ? amountText(d.massMg!, "mg") : amountText(d.volumeUl!, "µL");
    // Three temperatures → three blocks: the first vial is 1:A1. The step's heading names what is added.
    expect(flat(text)).toContain(`Step ${d.step} ${d.name}`);
    expect(text).toMatch(new RegExp(`\\n\\s*1:A1\\s+${run.run}\\s+${escapeRegExp(amount)}\\s*\\n`));
  });

  it("lists every dispense step of every vial once", () => {
    const expected = report.runs.reduce((a, r) => a + r.dispense.length, 0);
    const rows = text.split("\n").filter((l) => /^\s*\d+:[A-D]\d\s+\d+\s+[\d.]+ (mg|µL)\s*$/.test(l));
    expect(rows).toHaveLength(expected);
  });

  it("prints each stock's weighed mass with its unit (the run sheet's stocks)", () => {
    const s1 = report.stocks[0]!;
    const m = s1.members[0]!;
    expect(flat(text)).toContain(amountText(m.weighMg!, "mg"));
    expect(flat(text)).toContain(`Make up to ${amountText(s1.finalVolumeUl, "µL")}`);
  });

  it("carries the safety notice and the cautions with the runs they touch", () => {
    expect(flat(text)).toContain(PLANNING_NOTICE);
    for (const c of report.cautions) expect(flat(text)).toContain(c.code);
  });

  it("numbers every page 'page N of M' (M from pdfinfo)", () => {
    const pages = pdfPageCount(pdf);
    expect(pages).toBeGreaterThan(1);
    for (let k = 1; k <= pages; k++) expect(text).toContain(`page ${k} of ${pages}`);
  });

  it("draws the GHS pictograms of the chemicals as vectors (K3PO4: H318 → corrosion; 1,4-dioxane: H225 → flame)", () => {
    const def = JSON.stringify(prepSheetDefinition(input(report, suzukiDocument(), 24)).content);
    expect(def).toContain("<title>GHS05 Corrosion</title>");
    expect(def).toContain("<title>GHS02 Flame</title>");
  });

  it("renders page 1 to a PNG artifact (test-results/reports/prep-sheet-suzuki-page1.png)", () => {
    const png = pdfPagePng(pdf, "prep-sheet-suzuki-page1");
    expect(png.subarray(1, 4).toString("latin1")).toBe("PNG");
    expect(png.length).toBeGreaterThan(20_000);
  });
});

describe("prep sheet PDF: an invented 96-vial plan on 96-position blocks", () => {
  let report: PlanReport;
  let pdf: Buffer;
  let text: string;
  beforeAll(async () => {
    const doc = plan96Document();
    report = planReport(doc);
    pdf = await renderPrepSheet(input(report, doc, 96, { signature: null }));
    text = pdfText(pdf);
  }, 60_000);

  it("places 48 runs per temperature in two blocks and lists all 96 × steps dispense rows", () => {
    expect(report.runs).toHaveLength(96);
    const expected = report.runs.reduce((a, r) => a + r.dispense.length, 0);
    const rows = text.split("\n").filter((l) => /^\s*[12]:[A-H]\d{1,2}\s+\d+\s+[\d.]+ (mg|µL)\s*$/.test(l));
    expect(rows).toHaveLength(expected);
    // 48 runs fill rows A–D of 12 columns: the last vial of each block is D12, and nothing sits in E–H.
    expect(text).toMatch(/\s2:D12\s/);
    expect(text).not.toMatch(/\s[12]:E\d/);
  });

  it("says the plan is not signed, and carries the hash, the notice and page numbers", () => {
    expect(flat(text)).toMatch(/Not signed/);
    expect(text).toContain(HASH);
    expect(flat(text)).toContain(PLANNING_NOTICE);
    const pages = pdfPageCount(pdf);
    expect(text).toContain(`page ${pages} of ${pages}`);
  });

  it("renders the vial-map page to a PNG artifact", () => {
    const pages = pdfPageCount(pdf);
    // The vial map starts a page: find it in the text page by page (form feeds separate pages).
    const page = text.split("\f").findIndex((p) => p.includes("Vial map")) + 1;
    expect(page).toBeGreaterThan(0);
    expect(page).toBeLessThanOrEqual(pages);
    const png = pdfPagePng(pdf, "prep-sheet-96-vial-map", page);
    expect(png.subarray(1, 4).toString("latin1")).toBe("PNG");
  });
});

describe("prep sheet PDF: a signature that no longer matches the content", () => {
  it("marks the signature void", async () => {
    const doc = suzukiDocument();
    const report = planReport(doc);
    const stale = { signerName: "Demo Safety Officer", signedAt: "2026-11-30T09:30:00Z", meaning: "approved for execution as planned", contentHash: "0".repeat(64), valid: false };
    const text = flat(pdfText(await renderPrepSheet(input(report, doc, 24, { signature: stale }))));
    expect(text).toContain("Signature VOID");
    expect(text).toContain("0".repeat(64));
  }, 60_000);
});
