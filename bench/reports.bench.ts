/**
 * Report benchmarks (issue 11 item 8): the prep sheet PDF of a 96-vial plan (target
 * ≤ 1.5 s) and, for scale, the dispense worklist CSV of the same plan. Timed work: the
 * vial map, the dispense rows and the whole pdfmake render to a Buffer (layout, the SVG
 * vial map and GHS pictograms, font subsetting, compression); the run sheet and cautions
 * (`planReport`) are computed once in setup, as the plan page already holds them.
 *
 * The prep sheet module begins with `import "server-only"`, so `npm run bench` runs under
 * Node's react-server condition (as the job worker does).
 */
import type { AsyncBenchCase, BenchCase } from "./harness";
import { planReport, type PlanReport } from "../lib/chemistry/plan-report";
import { vialMap } from "../lib/plans/vial-map";
import { planChemicalHazards, type ChemicalStatements } from "../lib/reports/plan-hazards";
import { renderPrepSheet } from "../lib/reports/prep-sheet";
import { dispenseWorklistCsv } from "../lib/reports/worklist";
import { DEFAULT_EQUIPMENT, DEFAULT_LAB_THRESHOLDS } from "../lib/hazards/thresholds";
import { plan96Document } from "../tests/unit/reports/fixtures";

interface State {
  report: PlanReport;
  chemicals: ChemicalStatements[];
}

function setup(): State {
  const doc = plan96Document();
  return { report: planReport(doc), chemicals: planChemicalHazards(doc) };
}

export const cases: Array<BenchCase | AsyncBenchCase> = [
  {
    name: "prep sheet PDF: 96 vials (2 blocks × 48), 6 dispense steps, pdfmake",
    targetMs: 1500,
    repeat: 9,
    warmup: 2,
    setup,
    runAsync: async (s) => {
      const { report, chemicals } = s as State;
      return renderPrepSheet({
        plan: { name: report.name ?? "bench", studyName: "Study A", authorName: "Demo Chemist", state: "approved", version: 1, contentHash: "ab".repeat(32) },
        signature: null,
        runSheet: report,
        cautions: report,
        blockPositions: 96,
        chemicals,
        settings: { thresholds: DEFAULT_LAB_THRESHOLDS, equipment: DEFAULT_EQUIPMENT },
        issuedAt: "2026-12-01T10:00:00Z",
      });
    },
    note: (_r, s) => [`${(s as State).report.runs.reduce((a, r) => a + r.dispense.length, 0)} dispense rows`],
  },
  {
    name: "dispense worklist CSV: 96 vials",
    targetMs: 50,
    setup,
    run: (s) => {
      const { report } = s as State;
      return dispenseWorklistCsv(report, vialMap(report.runs, { positions: 96 }));
    },
  },
];
