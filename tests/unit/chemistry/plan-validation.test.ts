import { readFileSync } from "node:fs";
import { spawn } from "node:child_process";
import { describe, expect, it } from "vitest";
import { AppError } from "@/lib/errors/app-error";
import { buildCautionInput } from "@/lib/chemistry/caution-input";
import { planDocumentSchema } from "@/lib/chemistry/plan-document";
import { documentPathOfCautionPath, planReport } from "@/lib/chemistry/plan-report";
import { buildRunSheet } from "@/lib/chemistry/run-sheet";

// Errors point at what the chemist typed (issue 9, item 6): every kind of bad field is
// named by its path in the plan document, by the pure function and by `cli plan` (exit 2).
// The example is the demo's 2^(5−1) Suzuki screen: factors 0 temperature 60–100 °C,
// 1 baseEquiv 1.5–3, 2 boronicEquiv 1.1–1.5, 3 pdLoading 0.5–2 mol %, 4 waterFraction 0.1–0.3.
type Doc = Record<string, unknown> & {
  recipe: Record<string, unknown> & { solvents: Array<Record<string, unknown>> };
  factors: Array<Record<string, unknown>>;
  design: Record<string, unknown>;
};
const example = (): Doc => JSON.parse(readFileSync("examples/plan-suzuki.json", "utf8")) as Doc;
const ccd = (d: Doc): Doc => ({ ...d, design: { design: "central-composite", generators: ["E=ABCD"], alpha: "rotatable", centerPoints: 1, seed: 7 } });

function paths(fn: () => unknown): string[] {
  try {
    fn();
  } catch (e) {
    if (e instanceof AppError && (e.code === "invalid_input" || e.code === "infeasible")) return e.issues.map((i) => i.path).sort();
    throw e;
  }
  throw new Error("expected an invalid-input error");
}

const cases: Array<{ what: string; doc: () => Doc; paths: string[] }> = [
  {
    what: "a unit that does not fit the binding",
    doc: () => { const d = example(); d.factors[0]!.unit = "equiv"; return d; },
    paths: ["factors.0.unit"],
  },
  {
    what: "a temperature low level below absolute zero",
    doc: () => { const d = example(); d.factors[0]!.low = -300; return d; },
    paths: ["factors.0.low"],
  },
  {
    what: "a temperature high level above what the hazard engine accepts (3000 °C)",
    doc: () => { const d = example(); d.factors[0]!.high = 3500; return d; },
    paths: ["factors.0.high"],
  },
  {
    // Rotatable α for the 16-run fraction: 16^¼ = 2 (NIST/SEMATECH e-Handbook §5.3.3.6.1).
    // Temperature −270…−200 °C: −235 − 2 × 35 = −305 °C; Pd 0.5–2 mol %: 1.25 − 2 × 0.75 = −0.25 (hand arithmetic).
    what: "axial points below absolute zero and below zero loading (the low levels themselves are fine)",
    doc: () => { const d = ccd(example()); d.factors[0]!.low = -270; d.factors[0]!.high = -200; return d; },
    paths: ["factors.0.low", "factors.3.low"],
  },
  {
    what: "equivalents not above zero at the low level",
    doc: () => { const d = example(); d.factors[1]!.low = -1; return d; },
    paths: ["factors.1.low"],
  },
  {
    what: "a solvent fraction above 1 at the high level",
    doc: () => { const d = example(); d.factors[4]!.high = 1.2; return d; },
    paths: ["factors.4.high"],
  },
  {
    // Water 0.05–0.3 with α = 2: 0.175 − 2 × 0.125 = −0.075 (hand arithmetic); Pd 1–2: 1.5 − 1 = 0.5, fine.
    what: "a solvent fraction below 0 at an axial point",
    doc: () => { const d = ccd(example()); d.factors[4]!.low = 0.05; d.factors[3]!.low = 1; return d; },
    paths: ["factors.4.low"],
  },
  {
    what: "0 K (a kelvin factor at absolute zero)",
    doc: () => { const d = example(); d.factors[0] = { ...d.factors[0]!, unit: "K", low: 0, high: 350 }; return d; },
    paths: ["factors.0.low"],
  },
  {
    what: "a recipe temperature at absolute zero when no factor drives temperature",
    doc: () => {
      const d = example();
      d.factors = d.factors.slice(1);
      d.design = { design: "fractional-factorial", generators: ["D=ABC"], seed: 7 };
      d.recipe.temperatureC = -273.15;
      return d;
    },
    paths: ["recipe.temperatureC"],
  },
  {
    what: "a date that does not exist (2026-02-30)",
    doc: () => { const d = example(); d.recipe.solvents[0]!.openedOn = "2026-02-30"; return d; },
    paths: ["recipe.solvents.0.openedOn"],
  },
  {
    what: "a given run's value below absolute zero",
    doc: () => {
      const d = example();
      d.design = { runs: [{ standardOrder: 1, natural: { temperature: -300, baseEquiv: 2, boronicEquiv: 1.3, pdLoading: 1, waterFraction: 0.2 } }] };
      return d;
    },
    paths: ["design.runs.0.natural.temperature"],
  },
  {
    what: "the old run field name pointType",
    doc: () => {
      const d = example();
      d.design = { runs: [{ standardOrder: 1, pointType: "center", coded: { temperature: 0, baseEquiv: 0, boronicEquiv: 0, pdLoading: 0, waterFraction: 0 } }] };
      return d;
    },
    paths: ["design.runs.0.pointType"],
  },
];

describe("the pure function names the document path", () => {
  for (const c of cases) {
    it(c.what, () => {
      expect(paths(() => planReport(c.doc()))).toEqual(c.paths);
      expect(paths(() => buildRunSheet(c.doc()))).toEqual(c.paths);
    });
  }
  it("says which point of the design is out of bounds", () => {
    try {
      planReport(cases[3]!.doc());
    } catch (e) {
      expect((e as AppError).issues.find((i) => i.path === "factors.0.low")?.message).toMatch(/-305 °C at the axial point coded -2 \(-305 degC\): temperature must be above absolute zero/);
    }
  });
});

function cliPlan(input: unknown): Promise<{ status: number | null; stdout: string }> {
  return new Promise((resolve, reject) => {
    const p = spawn("node_modules/.bin/tsx", ["lib/cli/main.ts", "plan"]);
    let stdout = "";
    p.stdout.on("data", (b: Buffer) => (stdout += b.toString("utf8")));
    p.on("error", reject);
    p.on("close", (status) => resolve({ status, stdout }));
    p.stdin.end(JSON.stringify(input));
  });
}

// One process per document (each starts tsx: seconds on a loaded machine), four at a time.
describe("cli plan names the document path (exit 2)", { timeout: 300_000 }, () => {
  it("for every kind of bad field", async () => {
    const results: Array<{ status: number | null; stdout: string }> = new Array(cases.length);
    let next = 0;
    const worker = async () => {
      for (let i = next++; i < cases.length; i = next++) results[i] = await cliPlan(cases[i]!.doc());
    };
    await Promise.all([worker(), worker(), worker(), worker()]);
    cases.forEach((c, i) => {
      const r = results[i]!;
      expect(r.status, c.what).toBe(2);
      const body = JSON.parse(r.stdout) as { error: { issues: Array<{ path: string }> } };
      expect(body.error.issues.map((x) => x.path).sort(), c.what).toEqual(c.paths);
    });
  });
});

describe("engine paths map back to the document", () => {
  it("runs.N.temperatureC → the temperature factor's level; a solvent's date → recipe.solvents.k", () => {
    const doc = planDocumentSchema.parse(example());
    const sheet = buildRunSheet(example());
    const input = buildCautionInput(doc, sheet);
    const hot = sheet.runs.findIndex((r) => r.temperatureC === 100);
    const cold = sheet.runs.findIndex((r) => r.temperatureC === 60);
    expect(documentPathOfCautionPath(`runs.${hot}.temperatureC`, doc, input, sheet)).toBe("factors.0.high");
    expect(documentPathOfCautionPath(`runs.${cold}.temperatureC`, doc, input, sheet)).toBe("factors.0.low");
    // Components of the caution input: the 5 recipe components, then the solvents present.
    expect(documentPathOfCautionPath("runs.0.components.1.openedOn", doc, input, sheet)).toBe("recipe.components.1.hazards.openedOn");
    expect(documentPathOfCautionPath("runs.0.components.5.openedOn", doc, input, sheet)).toBe("recipe.solvents.0.openedOn");
    expect(documentPathOfCautionPath("runs.0.solvents", doc, input, sheet)).toBe("recipe.solvents");
  });
});
