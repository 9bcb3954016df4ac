import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { buildCautionInput } from "@/lib/chemistry/caution-input";
import { planDocumentSchema } from "@/lib/chemistry/plan-document";
import { planReport } from "@/lib/chemistry/plan-report";
import { buildRunSheet } from "@/lib/chemistry/run-sheet";

// The plan verb's output joins the run sheet with the hazard engine's cautions
// (docs/chemistry.md): the recipe's hazard flags must reach evaluatePlanCautions.
describe("plan report: run sheet + cautions", () => {
  it("passes a pyrophoric reagent and an aqueous co-solvent to the hazard rules (blocks release, needs sign-off)", () => {
    // n-BuLi: H225, H250, H261, H314 (typical statements, from memory); the product's caution rules:
    // a pyrophoric or water-reactive reagent with an aqueous solvent in the same vial blocks release.
    const r = planReport({
      recipe: {
        limitingReagent: "arBr",
        scaleMmol: 0.5,
        concentrationM: 0.5,
        temperatureC: -78,
        components: [
          { id: "arBr", name: "aryl bromide", role: "reagent", formula: "C9H11Br", form: { state: "liquid", densityGPerMl: 1.29 } },
          {
            id: "buli",
            name: "n-butyllithium 2.5 M in hexanes",
            role: "reagent",
            formula: "C4H9Li",
            equivalents: 1.1,
            form: { state: "solution", molarityM: 2.5 },
            hazards: { ghs: ["H225", "H250", "H261", "H314"] },
          },
        ],
        solvents: [
          { name: "tetrahydrofuran", volumeFraction: 0.9 },
          { name: "water", volumeFraction: 0.1 },
        ],
      },
      design: { runs: [{ standardOrder: 1 }, { standardOrder: 2 }] },
      vessel: "vial-4ml-screw-septum",
    });
    const blocking = r.cautions.filter((c) => c.severity === "blocking");
    expect(blocking.some((c) => c.component === "n-butyllithium 2.5 M in hexanes" && c.runs.join(",") === "1,2")).toBe(true);
    expect(r.releasable).toBe(false);
    expect(r.signOffRequired).toBe(true);
    expect(r.notice).toMatch(/planning aids, not a risk assessment/);
    // The run sheet is still there: 1.1 × 0.5 mmol at 2.5 M = 220 µL per vial (computed here).
    expect(r.runs[0]!.components.find((c) => c.id === "buli")!.volumeUl).toBeCloseTo(220, 9);
  });

  it("groups the generated runs by temperature (a heating block per temperature, the product's design step)", () => {
    const r = planReport(JSON.parse(readFileSync("examples/plan-suzuki.json", "utf8")));
    const inRunOrder = [...r.runs].sort((a, b) => a.runOrder - b.runOrder).map((x) => x.temperatureC);
    // Each temperature appears as one contiguous stretch of the run order.
    const stretches = inRunOrder.filter((t, i) => i === 0 || t !== inRunOrder[i - 1]);
    expect(new Set(stretches).size).toBe(stretches.length);
    expect(stretches.sort((a, b) => a - b)).toEqual([60, 80, 100]);
  });

  it("counts the carrier solvent of a supplied solution in the vial's solvents", () => {
    // 1.1 equiv × 0.5 mmol of 2.5 M n-BuLi in hexane = 220 µL; final volume 1000 µL; the
    // aryl bromide goes into a THF stock, so THF is 1000 − 220 = 780 µL (computed here):
    // fractions THF 0.78, n-hexane 0.22.
    const doc = planDocumentSchema.parse({
      recipe: {
        limitingReagent: "arBr",
        scaleMmol: 0.5,
        concentrationM: 0.5,
        temperatureC: -78,
        components: [
          { id: "arBr", name: "aryl bromide", role: "reagent", formula: "C9H11Br", form: { state: "liquid", densityGPerMl: 1.29 } },
          {
            id: "buli",
            name: "n-butyllithium 2.5 M in hexane",
            role: "reagent",
            formula: "C4H9Li",
            equivalents: 1.1,
            form: { state: "solution", molarityM: 2.5, solvent: "n-hexane" },
            hazards: { ghs: ["H225", "H250", "H261", "H314"] },
          },
        ],
        solvents: [{ name: "tetrahydrofuran", volumeFraction: 1 }],
      },
      design: { runs: [{ standardOrder: 1 }] },
      vessel: "vial-4ml-screw-septum",
    });
    const input = buildCautionInput(doc, buildRunSheet(doc));
    const solvents = Object.fromEntries(input.runs[0]!.solvents.map((s) => [s.name, s.volumeFraction]));
    expect(solvents["tetrahydrofuran"]).toBeCloseTo(0.78, 9);
    expect(solvents["n-hexane"]).toBeCloseTo(0.22, 9);
    expect(input.runs[0]!.liquidVolumeMl).toBeCloseTo(1, 12);
    // The pyrophoric reagent's own dispensed volume reaches the second-person rule.
    expect(input.runs[0]!.components.find((c) => c.name.startsWith("n-butyllithium"))!.volumeUl).toBeCloseTo(220, 9);
  });

  it("gives one pressure estimate per run of the example plan", () => {
    const r = planReport(JSON.parse(readFileSync("examples/plan-suzuki.json", "utf8")));
    expect(r.perRun.map((p) => p.run).sort((a, b) => a - b)).toEqual(r.runs.map((x) => x.run).sort((a, b) => a - b));
    // Hotter runs, higher pressure (vapour pressure rises with temperature — Clausius–Clapeyron).
    const byRun = new Map(r.perRun.map((p) => [p.run, p.totalBar ?? NaN]));
    const hot = r.runs.filter((x) => x.temperatureC === 100).map((x) => byRun.get(x.run)!);
    const cold = r.runs.filter((x) => x.temperatureC === 60).map((x) => byRun.get(x.run)!);
    expect(Math.min(...hot)).toBeGreaterThan(Math.max(...cold));
  });
});
