import { describe, expect, it } from "vitest";
import Papa from "papaparse";
import { planReport } from "@/lib/chemistry/plan-report";
import { vialMap } from "@/lib/plans/vial-map";
import { dispenseWorklistCsv, WORKLIST_COLUMNS } from "@/lib/reports/worklist";
import { plan96Document, suzukiDocument } from "./fixtures";

type Row = Record<(typeof WORKLIST_COLUMNS)[number], string>;

function parse(csv: string): Row[] {
  const r = Papa.parse<Row>(csv, { header: true, skipEmptyLines: true });
  expect(r.errors).toEqual([]);
  expect(r.meta.fields).toEqual([...WORKLIST_COLUMNS]);
  return r.data;
}

describe("dispense worklist CSV", () => {
  it.each([
    ["the demo's Suzuki screen (examples/plan-suzuki.json)", suzukiDocument(), 24],
    ["an invented 96-vial plan", plan96Document(), 96],
  ])("parses back (papaparse) to exactly the run sheet's dispense list: %s", (_label, doc, positions) => {
    const report = planReport(doc);
    const map = vialMap(report.runs, { positions });
    const rows = parse(dispenseWorklistCsv(report, map));
    // One row per dispense step of every vial.
    expect(rows).toHaveLength(report.runs.reduce((a, r) => a + r.dispense.length, 0));
    // The order column counts 1…n.
    expect(rows.map((r) => Number(r.order))).toEqual(rows.map((_, i) => i + 1));
    for (const run of report.runs) {
      const mine = rows.filter((r) => Number(r.run) === run.run).sort((a, b) => Number(a.step) - Number(b.step));
      expect(mine.map((r) => Number(r.step))).toEqual(run.dispense.map((d) => d.step));
      run.dispense.forEach((d, i) => {
        const row = mine[i]!;
        expect(row.add).toBe(d.name);
        expect(row.source).toBe(d.source);
        if (d.kind === "solid") {
          expect(row.unit).toBe("mg");
          // Written to 0.001 mg (docs/reports.md): within half of that.
          expect(Math.abs(Number(row.amount) - d.massMg!)).toBeLessThanOrEqual(0.0005 + 1e-12);
        } else {
          expect(row.unit).toBe("µL");
          expect(Math.abs(Number(row.amount) - d.volumeUl!)).toBeLessThanOrEqual(0.005 + 1e-12);
        }
      });
      // Every step of a run is dispensed into the one vial the map gives the run.
      const place = map.placements.find((p) => p.run === run.run)!;
      expect(new Set(mine.map((r) => `${r.block}|${r["vial position"]}|${r.vial}`))).toEqual(new Set([`${place.block}|${place.position}|${place.vial}`]));
    }
    // Rows come in the order of addition: steps never go back.
    const steps = rows.map((r) => Number(r.step));
    expect(steps).toEqual([...steps].sort((a, b) => a - b));
    // Totals per source equal the run sheet's (e.g. every µL of stock S1).
    const total = (src: string) => rows.filter((r) => r.source === src).reduce((a, r) => a + Number(r.amount), 0);
    for (const s of report.stocks) {
      const sum = report.runs.reduce((a, r) => a + r.dispense.filter((d) => d.source === s.id).reduce((b, d) => b + (d.volumeUl ?? 0), 0), 0);
      expect(Math.abs(total(s.id) - sum)).toBeLessThanOrEqual(0.005 * rows.length);
      expect(sum).toBeCloseTo(s.neededVolumeUl, 6);
    }
  });

  it("neutralises cells that a spreadsheet would run as formulas (OWASP CSV Injection: prefix with ')", () => {
    const doc = suzukiDocument();
    const evil = '=HYPERLINK("http://example.invalid","click")';
    doc.recipe.components[1]!.name = evil; // the boronic acid, weighed as a solid into each vial
    doc.recipe.components[2]!.name = "+SUM(A1:A9)";
    doc.recipe.components[3]!.name = "@cmd";
    const report = planReport(doc);
    const csv = dispenseWorklistCsv(report, vialMap(report.runs, { positions: 24 }));
    const rows = parse(csv);
    const adds = new Set(rows.map((r) => r.add));
    expect(adds.has(`'${evil}`)).toBe(true);
    expect(adds.has("'+SUM(A1:A9)")).toBe(true);
    // No cell of the file starts a formula.
    const cells = Papa.parse<string[]>(csv, { skipEmptyLines: true }).data.flat();
    expect(cells.filter((c) => /^[=+\-@\t\r]/.test(c))).toEqual([]);
  });
});
