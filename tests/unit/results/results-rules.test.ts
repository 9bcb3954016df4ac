/**
 * The results domain's pure rules: reading cells (numbers only), the grid's keyboard and
 * paste rules, checking an entry against the plan, the CSV import, the default model and
 * the normal probability plot's scores. Expected values are stated in each check (the
 * rules' own specifications, or a standard normal table for Φ⁻¹).
 */
import { describe, expect, it } from "vitest";
import { parseResultsCsv } from "@/lib/results/csv-import";
import { defaultModel } from "@/lib/results/default-model";
import { flaggedRuns, normalScores } from "@/lib/results/diagnostic-plots";
import { checkEntries } from "@/lib/results/entries";
import { moveFocus, pastedBlock, placeBlock } from "@/lib/results/grid-keys";
import { readResultCell, valueWarning } from "@/lib/results/numbers";

const responses = [
  { name: "yield", unit: "%", goal: "maximize" as const },
  { name: "impurity", unit: "area %", goal: "minimize" as const },
];

describe("cells", () => {
  it("reads numbers only, with hints for decimal commas and thousands separators; % accepted for % responses", () => {
    expect(readResultCell(" 72.1 ", "%")).toEqual({ kind: "number", value: 72.1 });
    expect(readResultCell("72.1 %", "%")).toEqual({ kind: "number", value: 72.1 });
    expect(readResultCell("72.1 %", "mg").kind).toBe("error");
    expect(readResultCell("−0.5")).toEqual({ kind: "number", value: -0.5 });
    expect(readResultCell("1e-3")).toEqual({ kind: "number", value: 0.001 });
    expect(readResultCell("")).toEqual({ kind: "empty" });
    expect(readResultCell("68,4")).toMatchObject({ kind: "error", message: expect.stringContaining("decimal mark") });
    expect(readResultCell("1,234.5")).toMatchObject({ kind: "error", message: expect.stringContaining("thousands") });
    expect(readResultCell("n/a").kind).toBe("error");
    expect(readResultCell("1e999").kind).toBe("error");
    expect(valueWarning(104, "%")).toContain("outside 0–100 %");
    expect(valueWarning(-1, "area %")).toContain("outside");
    expect(valueWarning(99.9, "%")).toBeNull();
    expect(valueWarning(150, "mg")).toBeNull();
  });
});

describe("grid keys and paste", () => {
  const o = { shift: false, caretAtStart: true, caretAtEnd: true };
  it("arrows, Enter and Tab move within the grid and wrap Tab across rows", () => {
    expect(moveFocus({ row: 0, col: 0 }, "ArrowDown", o, 3, 2)).toEqual({ row: 1, col: 0 });
    expect(moveFocus({ row: 0, col: 0 }, "ArrowUp", o, 3, 2)).toEqual({ row: 0, col: 0 });
    expect(moveFocus({ row: 1, col: 0 }, "Enter", { ...o, shift: true }, 3, 2)).toEqual({ row: 0, col: 0 });
    expect(moveFocus({ row: 0, col: 1 }, "Tab", o, 3, 2)).toEqual({ row: 1, col: 0 });
    expect(moveFocus({ row: 1, col: 0 }, "Tab", { ...o, shift: true }, 3, 2)).toEqual({ row: 0, col: 1 });
    expect(moveFocus({ row: 0, col: 0 }, "ArrowRight", { ...o, caretAtEnd: false }, 3, 2)).toBeNull();
    expect(moveFocus({ row: 0, col: 0 }, "a", o, 3, 2)).toBeNull();
  });
  it("a spreadsheet block (tabs and newlines, a trailing newline) lands from the focused cell; overflow is counted", () => {
    expect(pastedBlock("1\t2\r\n3\t4\r\n")).toEqual([["1", "2"], ["3", "4"]]);
    const { placed, outside } = placeBlock([["1", "2"], ["3", "4"], ["5", "6"]], { row: 1, col: 1 }, 3, 2);
    expect(placed).toEqual([{ row: 1, col: 1, text: "1" }, { row: 2, col: 1, text: "3" }]);
    expect(outside).toBe(4);
  });
});

describe("entries", () => {
  it("names every problem at its path; null marks a failed result; a reason only with a failure", () => {
    const r = checkEntries(
      [
        { run: 1, responses: { yield: 104 } },
        { run: 2, responses: null, reason: "cracked" },
        { run: 2, responses: { yield: 1 } },
        { run: 9, responses: { yield: 1 } },
        { run: 3, responses: { Yield: 1 } },
        { run: 4, responses: { yield: 5 }, reason: "why" },
      ],
      { runNumbers: [1, 2, 3, 4], responses },
    );
    expect(r.issues.map((i) => i.path)).toEqual(["runs.2.run", "runs.3.run", "runs.4.responses.Yield", "runs.5.reason"]);
    expect(r.issues[2]!.message).toContain("did you mean yield");
    expect(r.warnings.map((w) => w.path)).toEqual(["runs.0.responses.yield"]);
    expect(r.changes.filter((c) => c.run === 2)).toEqual([
      { kind: "set", run: 2, response: "yield", value: null, failed: true, reason: "cracked" },
      { kind: "set", run: 2, response: "impurity", value: null, failed: true, reason: "cracked" },
    ]);
  });
});

describe("CSV", () => {
  const plan = { runs: [1, 2, 3].map((run) => ({ run, vial: `A${run}` })), responses };
  it("guesses the columns, maps by run, turns a reason with blanks into a failed run", () => {
    const p = parseResultsCsv("Run No.,Yield (%),Impurity,Reason\n1,70,1.1,\n2,,,vial cracked\n3,71.5,0.9,\n", plan);
    expect(p.issues).toEqual([]);
    expect(p.mapping).toEqual({ run: "Run No.", reason: "Reason", responses: { yield: "Yield (%)", impurity: "Impurity" } });
    expect(p.runs).toEqual([{ run: 1, responses: { yield: 70, impurity: 1.1 } }, { run: 2, responses: { yield: null, impurity: null }, reason: "vial cracked" }, { run: 3, responses: { yield: 71.5, impurity: 0.9 } }]);
  });
  it("maps by vial when there is no run column, and says where a vial disagrees with its run", () => {
    expect(parseResultsCsv("Vial,Yield\nA2,50\n", plan).runs).toEqual([{ run: 2, responses: { yield: 50 } }]);
    const p = parseResultsCsv("Run,Vial,Yield\n2,A3,50\n", plan);
    expect(p.issues.map((i) => [i.row, i.column])).toEqual([[1, "Vial"]]);
  });
  it("a file with no run column or no response column is refused as a whole", () => {
    expect(parseResultsCsv("Sample,Value\nx,1\n", plan).issues.map((i) => i.field)).toEqual(["run", "file"]);
    expect(parseResultsCsv("", plan).issues.map((i) => i.field)).toContain("file");
  });
});

describe("default model and plots", () => {
  it("a 2² with centre points opens with interactions; a central composite design with the quadratic", () => {
    const fact = [[-1, -1], [1, -1], [-1, 1], [1, 1], [0, 0], [0, 0]];
    expect(defaultModel(fact)).toBe("interaction");
    const ccd = [...fact, [1.414, 0], [-1.414, 0], [0, 1.414], [0, -1.414], [0, 0]];
    expect(defaultModel(ccd)).toBe("quadratic");
    expect(defaultModel([[-1, -1], [1, 1], [1, -1]])).toBe("linear");
  });
  it("normal scores are Blom's positions: the middle of 5 is 0, symmetric, and the top of 15 is Φ⁻¹(0.95902) (standard normal table)", () => {
    const s = normalScores([3, -1, 0.5, 2, -4]);
    expect(s[2]).toBeCloseTo(0, 12);
    expect(s[4]).toBeCloseTo(-s[0]!, 12);
    expect(s[4]!).toBeLessThan(s[1]!);
    const n = 15;
    const top = normalScores(Array.from({ length: n }, (_, i) => i))[n - 1]!;
    // (15 − 0.375)/15.25 = 0.95902; a standard normal table gives Φ(1.73) = 0.95818 and Φ(1.74) = 0.95907, so Φ⁻¹(0.95902) ≈ 1.7394 by linear interpolation.
    expect(Math.abs(top - 1.7394)).toBeLessThan(1e-3);
  });
  it("flags a large studentized residual, a high leverage and a large Cook's distance", () => {
    const d = (run: number, studentized: number, leverage: number, cooksDistance: number) => ({ run, index: run - 1, block: null, observed: 0, fitted: 0, residual: 0, leverage, studentized, cooksDistance });
    const f = flaggedRuns([d(1, 3.4, 0.1, 0.2), d(2, 0.5, 0.9, 0.3), d(3, 0.2, 0.1, 1.5), d(4, 0.1, 0.1, 0.1)], 1);
    expect(f.map((x) => x.run)).toEqual([1, 2, 3]);
    expect(f[1]!.reasons[0]).toContain("leverage");
  });
});
