import { describe, expect, it } from "vitest";
import seedrandom from "seedrandom";
import { AppError } from "@/lib/errors/app-error";
import { planDocumentSchema } from "@/lib/chemistry/plan-document";
import { buildRunSheet } from "@/lib/chemistry/run-sheet";
import { screeningPlan } from "./fixtures";
import { expectStockInvariants } from "./invariants";

// Property check (issue 4: "never negative or NaN amounts"): seeded random variations of
// the screening plan either give a run sheet that satisfies every stock-planning
// invariant, or a clear infeasible / invalid-input AppError — never an internal error.
describe("random plans (seeded)", () => {
  // About 1 s alone; allow for a loaded machine.
  it("are planned correctly or refused clearly, 60 cases", { timeout: 60_000 }, () => {
    const rng = seedrandom("tareline-chemistry-7");
    const u = (lo: number, hi: number) => lo + (hi - lo) * rng();
    let planned = 0;
    let refused = 0;
    for (let k = 0; k < 60; k++) {
      const plan = screeningPlan();
      plan.recipe.scaleMmol = u(0.02, 0.5);
      plan.recipe.concentrationM = u(0.05, 0.6);
      const comps = plan.recipe.components;
      comps[1]!.solubilityMgPerMl = u(20, 400);
      comps[2]!.solubilityMgPerMl = u(100, 1200);
      comps[3]!.solubilityMgPerMl = u(2, 40);
      comps[3]!.addSeparately = rng() < 0.5;
      comps[4]!.addSeparately = rng() < 0.5;
      comps[5]!.dispense = rng() < 0.5 ? "auto" : "neat";
      plan.dispensing = { minPipetteVolumeUl: u(2, 30), overagePercent: u(0, 25), deadVolumeUl: u(0, 200), minWeighMassMg: u(0, 100), maxStockVolumeMl: u(5, 50), stockFillFraction: u(0.3, 1) };
      const runs = plan.design.runs as Array<{ standardOrder: number; coded?: Record<string, number> }>;
      for (const r of runs) for (const name of Object.keys(r.coded!)) r.coded![name] = u(-1.6, 1.6);
      try {
        const doc = planDocumentSchema.parse(plan);
        const sheet = buildRunSheet(doc);
        expectStockInvariants(doc, sheet);
        planned++;
      } catch (e) {
        if (!(e instanceof AppError)) throw e;
        expect(["infeasible", "invalid_input"], e.message).toContain(e.code);
        expect(e.message.length).toBeGreaterThan(20);
        refused++;
      }
    }
    // Both outcomes occur, so the check exercises both paths.
    expect(planned).toBeGreaterThan(10);
    expect(refused).toBeGreaterThan(0);
  });
});
