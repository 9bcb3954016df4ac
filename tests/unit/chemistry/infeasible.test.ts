import { describe, expect, it } from "vitest";
import { AppError } from "@/lib/errors/app-error";
import { buildRunSheet } from "@/lib/chemistry/run-sheet";
import { screeningPlan, suzukiPlan } from "./fixtures";

// Impossible plans (issue 4): a clear AppError naming the component and the runs, never
// negative or NaN amounts.

function errorOf(fn: () => unknown): AppError {
  try {
    fn();
  } catch (e) {
    if (e instanceof AppError) return e;
    throw e;
  }
  throw new Error("expected an AppError");
}

describe("impossible plans", () => {
  it("a stock that cannot fit within its solubility names the component and the runs", () => {
    // K3PO4 forced into a water stock at 100 mg/mL: 1.5–3 equiv × 0.25 mmol × 212.26 g/mol
    // = 79.6–159 mg needs 796–1592 µL of water; water is 10–30 vol % of 975 µL (computed here).
    const plan = screeningPlan();
    plan.recipe.components[2] = { ...plan.recipe.components[2]!, dispense: "stock", solubilityMgPerMl: 100 };
    const e = errorOf(() => buildRunSheet(plan));
    expect(e.code).toBe("infeasible");
    expect(e.message).toMatch(/K3PO4/);
    expect(e.message).toMatch(/water/);
    expect(e.message).toMatch(/runs affected: 1, 2, 3, 4, 5, 6, 7, 8, 9, 10/);
    expect(e.issues.some((i) => i.path === "recipe.components.2" && /base/.test(i.message))).toBe(true);
  });

  it("a final volume above the vessel's working volume names the runs", () => {
    // 1 mmol at 0.25 M = 4000 µL > 2 mL working maximum of the 4 mL vial (lib/hazards DEFAULT_VESSELS)
    const plan = suzukiPlan({ design: { runs: [{ standardOrder: 1 }, { standardOrder: 2 }] } });
    plan.recipe.scaleMmol = 1;
    const e = errorOf(() => buildRunSheet(plan));
    expect(e.code).toBe("infeasible");
    expect(e.message).toMatch(/runs 1, 2 need up to 4000 µL/);
    expect(e.issues[0]?.path).toBe("recipe.scaleMmol");
  });

  it("a given run whose coded value makes a loading negative is refused at that run's field", () => {
    // pdLoading 0.5–2 mol %: u0 = 1.25, Δu = 0.75; coded −2 → 1.25 − 1.5 = −0.25 mol % (computed here)
    const plan = screeningPlan();
    const runs = plan.design.runs as Array<{ standardOrder: number; coded?: Record<string, number> }>;
    runs.push({ standardOrder: 11, coded: { temperature: 0, baseEquiv: 0, pdLoading: -2, waterFraction: 0 } });
    const e = errorOf(() => buildRunSheet(plan));
    expect(e.code).toBe("invalid_input");
    expect(e.issues.map((i) => i.path)).toEqual(["design.runs.10.coded.pdLoading"]);
    expect(e.issues[0]?.message).toMatch(/factor "pdLoading" gives a pd loading \(mol % metal\) of −0.25 \(not positive\)/);
    expect(e.issues[0]?.message).toMatch(/\(run 11\)$/);
  });

  it("a co-solvent fraction above 1 in a given run is refused at that run's field", () => {
    const plan = screeningPlan();
    const runs = plan.design.runs as Array<{ standardOrder: number; natural?: Record<string, number> }>;
    runs.push({ standardOrder: 12, natural: { temperature: 80, baseEquiv: 2, pdLoading: 1, waterFraction: 120 } });
    const e = errorOf(() => buildRunSheet(plan));
    expect(e.code).toBe("invalid_input");
    expect(e.issues.map((i) => i.path)).toEqual(["design.runs.10.natural.waterFraction"]);
    expect(e.issues[0]?.message).toMatch(/water volume fraction of 1.2 \(outside 0–1\)/);
  });

  it("neat liquids that exceed the final volume name the components and runs", () => {
    // 5 equiv of TBAF 1.0 M at 0.25 mmol: 1000 × 1.25 mmol / 1.0 M = 1250 µL > 1000 µL final volume.
    const plan = suzukiPlan();
    plan.recipe.components[5] = { ...plan.recipe.components[5]!, equivalents: 5 };
    const e = errorOf(() => buildRunSheet(plan));
    expect(e.code).toBe("infeasible");
    expect(e.message).toMatch(/TBAF 1.0 M in THF/);
    expect(e.message).toMatch(/runs 1/);
  });
});

describe("invalid plan documents", () => {
  it("report dotted paths", () => {
    const plan = suzukiPlan({
      factors: [{ name: "x", low: 1, high: 2, binding: { kind: "equivalents", component: "nope" } }],
    });
    plan.recipe.components[0] = { ...plan.recipe.components[0]!, form: { state: "liquid" } as never };
    const e = errorOf(() => buildRunSheet(plan));
    expect(e.code).toBe("invalid_input");
    const paths = e.issues.map((i) => i.path);
    expect(paths).toContain("recipe.components.0.form.densityGPerMl");
  });

  it("a binding to an unknown component points at it", () => {
    const plan = suzukiPlan({
      factors: [{ name: "x", low: 1, high: 2, binding: { kind: "equivalents", component: "nope" } }],
    });
    const e = errorOf(() => buildRunSheet(plan));
    expect(e.issues.map((i) => i.path)).toContain("factors.0.binding.component");
  });

  it("a run missing a factor value points at the run", () => {
    const plan = suzukiPlan({
      factors: [{ name: "temperature", low: 60, high: 100, unit: "degC", binding: { kind: "temperature" } }],
      design: { runs: [{ standardOrder: 1, natural: {} }] },
    });
    const e = errorOf(() => buildRunSheet(plan));
    expect(e.issues[0]?.path).toBe("design.runs.0.natural.temperature");
  });

  it("a bad vessel type and a bad design run are reported at their own fields", () => {
    const plan = suzukiPlan({
      design: { runs: [{ standardOrder: 0 }] },
      vessel: { id: "v", name: "vial", totalVolumeMl: 4, workingMinMl: 0.5, workingMaxMl: 2, ratedBar: -3, maxFillFraction: 0.6, sealed: true, confirmWithSupplier: false },
    });
    const paths = errorOf(() => buildRunSheet(plan)).issues.map((i) => i.path);
    expect(paths).toContain("vessel.ratedBar");
    expect(paths).toContain("design.runs.0.standardOrder");
  });

  it("a unit that does not fit the binding is refused", () => {
    const plan = suzukiPlan({
      factors: [{ name: "temperature", low: 60, high: 100, unit: "bar", binding: { kind: "temperature" } }],
      design: { runs: [{ standardOrder: 1, natural: { temperature: 80 } }] },
    });
    const e = errorOf(() => buildRunSheet(plan));
    expect(e.issues[0]?.path).toBe("factors.0.unit");
  });
});
