import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { AppError } from "@/lib/errors/app-error";
import { planDocumentSchema } from "@/lib/chemistry/plan-document";
import { buildRunSheet } from "@/lib/chemistry/run-sheet";
import { screeningPlan, suzukiPlan } from "./fixtures";
import { deliveredMmol, expectNoBadNumbers, expectStockInvariants } from "./invariants";

// Stock and master-mix planning (issue 4; common practice (docs/sources.md) for the liquid-handling
// practice: minimum pipettable volume, overage, minimum weighing mass — common practice).

function smallScreen() {
  // 0.1 mmol at 0.1 M (1000 µL) so that the K3PO4 stock fits into the water share.
  const doc = screeningPlan();
  doc.recipe.scaleMmol = 0.1;
  doc.recipe.concentrationM = 0.1;
  return doc;
}

describe("stock planning invariants", () => {
  it("hold for a 2^(4−1) screen with explicit runs (base, Pd loading and water fraction varied)", () => {
    const doc = planDocumentSchema.parse(smallScreen());
    const sheet = buildRunSheet(doc);
    expect(sheet.runs).toHaveLength(10);
    // The varying base is in a water stock here, not per vial.
    expect(sheet.components.find((c) => c.id === "base")!.dispensedAs).toBe("stock");
    expectStockInvariants(doc, sheet);
  });

  it("hold for the example plan (examples/plan-suzuki.json) with runs from the design engine", () => {
    const raw: unknown = JSON.parse(readFileSync("examples/plan-suzuki.json", "utf8"));
    const doc = planDocumentSchema.parse(raw);
    const sheet = buildRunSheet(doc);
    // 2^(5−1) + 2 centre points (generateDesign, lib/doe)
    expect(sheet.runs).toHaveLength(18);
    expectStockInvariants(doc, sheet);
  });

  it("hold when the concentration is a factor (final volumes then follow the concentration)", () => {
    const doc = planDocumentSchema.parse(
      suzukiPlan({
        factors: [{ name: "conc", low: 0.15, high: 0.25, unit: "M", binding: { kind: "concentration" } }],
        design: { runs: [1, 2, 3].map((i) => ({ standardOrder: i, coded: { conc: i - 2 } })) },
      }),
    );
    const sheet = buildRunSheet(doc);
    // V = 1000 × 0.25 mmol / c: 1666.67, 1250, 1000 µL
    expect(sheet.runs.map((r) => r.finalVolumeUl)).toEqual([1000 * 0.25 / 0.15, 1000 * 0.25 / 0.2, 1000 * 0.25 / 0.25].map((v) => expect.closeTo(v, 9)));
    expectStockInvariants(doc, sheet);
  });

  it("hold when stocks are kept as concentrated as allowed (smallest dispense = the minimum volume)", () => {
    // stockFillFraction 0.01: no dilution, so each stock sits at its highest allowed
    // concentration and its smallest dispense is the minimum pipettable volume, 25 µL here.
    const plan = smallScreen();
    plan.dispensing = { ...plan.dispensing, minPipetteVolumeUl: 25, stockFillFraction: 0.01 };
    plan.recipe.components[5]!.dispense = "auto"; // TBAF: 10 µL as supplied is below 25 µL, so diluted into a stock
    const doc = planDocumentSchema.parse(plan);
    const sheet = buildRunSheet(doc);
    expect(sheet.components.find((c) => c.id === "additive")!.dispensedAs).not.toBe("neat");
    expect(sheet.notes.filter((n) => n.code.includes("min_pipette"))).toEqual([]);
    // A stock made from the supplied 1.0 M solution is measured by volume: V = 1000 × n / M.
    const tbaf = sheet.stocks.flatMap((x) => x.members).find((m) => m.id === "additive")!;
    expect(tbaf.measureUl!).toBeCloseTo((1000 * tbaf.mmol) / 1.0, 9);
    expect(tbaf.weighMg).toBeNull();
    expect(tbaf.concentrationM).toBeLessThanOrEqual(1.0);
    expectStockInvariants(doc, sheet);
    const pd = sheet.stocks.find((s) => s.members.some((m) => m.id === "pd"))!;
    const smallest = Math.min(...sheet.runs.map((r) => r.dispense.find((d) => d.source === pd.id)!.volumeUl!));
    // Rounding the concentration down to two figures may raise it by at most 25 % (1.2 → 1.5 is the widest step).
    expect(smallest).toBeGreaterThanOrEqual(25);
    expect(smallest).toBeLessThanOrEqual(25 * 1.25 + 1e-9);
  });

  it("hold for a central composite design from the design engine with a log-scale loading", () => {
    // CCD, k = 2, rotatable α = 2^(2/4) = 1.414 (NIST/SEMATECH §5.3.3.6.1), 3 centre points:
    // 4 + 4 + 3 = 11 runs. On a log scale the axial loadings stay positive:
    // exp(ln √(0.25·4) ± 1.414 · ln 4) = 1 × 4^(±1.414) ≈ 0.141 and 7.1 mol % (computed here).
    const plan = smallScreen();
    plan.factors = [
      { name: "pdLoading", low: 0.25, high: 4, unit: "mol%", scale: "log", binding: { kind: "loading", component: "pd" } },
      { name: "baseEquiv", low: 1.5, high: 2.5, unit: "equiv", binding: { kind: "equivalents", component: "base" } },
    ];
    plan.design = { design: "central-composite", alpha: "rotatable", centerPoints: 3, seed: 11 };
    const doc = planDocumentSchema.parse(plan);
    const sheet = buildRunSheet(doc);
    expect(sheet.runs).toHaveLength(11);
    const loadings = sheet.runs.map((r) => r.natural.pdLoading!);
    expect(Math.min(...loadings)).toBeCloseTo(Math.pow(4, -Math.SQRT2), 6);
    expect(Math.max(...loadings)).toBeCloseTo(Math.pow(4, Math.SQRT2), 6);
    expectStockInvariants(doc, sheet);
  });

  it("prepared amounts are the needed volume plus overage and dead volume (rounded up to 2 figures)", () => {
    const doc = planDocumentSchema.parse(smallScreen());
    const sheet = buildRunSheet(doc);
    for (const s of sheet.stocks) {
      const base = s.neededVolumeUl * 1.1 + 50; // +10 % overage, 50 µL dead volume (the plan's settings)
      expect(s.finalVolumeUl).toBeGreaterThanOrEqual(base);
      // Two significant figures above the minimum, unless raised for the minimum weighing mass.
      if (s.notes.length === 0) expect(s.finalVolumeUl).toBeLessThan(base * 1.1 + 1e-9);
    }
  });
});

describe("master mixes and premixes", () => {
  it("puts the components common to all runs into one master mix per solvent", () => {
    const doc = planDocumentSchema.parse(
      suzukiPlan({
        factors: [{ name: "temperature", low: 60, high: 100, unit: "degC", binding: { kind: "temperature" } }],
        design: { runs: [1, 2, 3].map((i) => ({ standardOrder: i, coded: { temperature: i - 2 } })) },
      }),
    );
    const sheet = buildRunSheet(doc);
    const mm = sheet.stocks.filter((s) => s.kind === "master-mix");
    expect(mm).toHaveLength(1);
    expect(mm[0]!.members.map((m) => m.id).sort()).toEqual(["arBr", "boronicAcid"]);
    expect(mm[0]!.solvent).toBe("1,4-dioxane");
    // Marked "add separately": own stocks, never in the mix.
    for (const id of ["pd", "ligand"]) {
      const s = sheet.stocks.find((x) => x.members.some((m) => m.id === id))!;
      expect(s.members).toHaveLength(1);
    }
    // The same master-mix volume goes into every vial.
    const vols = sheet.runs.map((r) => r.dispense.find((d) => d.source === mm[0]!.id)!.volumeUl);
    expect(new Set(vols).size).toBe(1);
    expect(vols[0]).toBe(mm[0]!.dispenseVolumeUl);
    expectStockInvariants(doc, sheet);
  });

  it("premixes catalyst and ligand when their amounts stay in proportion", () => {
    const plan = smallScreen();
    for (const c of plan.recipe.components) c.addSeparately = false;
    const doc = planDocumentSchema.parse(plan);
    const sheet = buildRunSheet(doc);
    const premix = sheet.stocks.find((s) => s.members.some((m) => m.id === "pd"))!;
    expect(premix.members.map((m) => m.id).sort()).toEqual(["ligand", "pd"]);
    // ligand : Pd(metal) = 2, i.e. 4 ligand per dimer, in the stock itself
    const cPd = premix.members.find((m) => m.id === "pd")!.concentrationM;
    const cL = premix.members.find((m) => m.id === "ligand")!.concentrationM;
    expect(cL / cPd).toBeCloseTo(4, 9);
    expectStockInvariants(doc, sheet);
  });
});

describe("incompatible components", () => {
  // n-BuLi: H225, H250, H261, H314 (typical statements, from memory); methanol is protic.
  function buliPlan(dispense: "auto" | "stock" = "auto") {
    return {
      recipe: {
        limitingReagent: "arBr",
        scaleMmol: 0.5,
        concentrationM: 0.5,
        temperatureC: -78,
        components: [
          { id: "arBr", name: "aryl bromide", role: "reagent" as const, formula: "C9H11Br", form: { state: "liquid" as const, densityGPerMl: 1.29 } },
          {
            id: "buli",
            name: "n-butyllithium 2.5 M in hexanes",
            role: "reagent" as const,
            formula: "C4H9Li",
            equivalents: 1.1,
            form: { state: "solution" as const, molarityM: 2.5, solvent: "hexanes" },
            dispense,
            stockSolvent: dispense === "stock" ? "methanol" : undefined,
            hazards: { ghs: ["H225", "H250", "H261", "H314"] },
          },
          { id: "meoh", name: "methanol additive", role: "additive" as const, formula: "CH4O", equivalents: 2, form: { state: "liquid" as const, densityGPerMl: 0.792 }, hazards: { ghs: ["H225"], protic: true } },
        ],
        solvents: [
          { name: "tetrahydrofuran", volumeFraction: 0.9 },
          { name: "methanol", volumeFraction: 0.1 },
        ],
      },
      design: { runs: [{ standardOrder: 1 }, { standardOrder: 2 }] },
      vessel: "vial-4ml-screw-septum",
    };
  }

  it("never premixes a pyrophoric reagent: dispensed as supplied, alone", () => {
    const sheet = buildRunSheet(buliPlan());
    const buli = sheet.components.find((c) => c.id === "buli")!;
    expect(buli.dispensedAs).toBe("neat");
    expect(sheet.stocks.some((s) => s.members.some((m) => m.id === "buli"))).toBe(false);
    // 1.1 × 0.5 mmol at 2.5 M = 1000 × 0.55 / 2.5 = 220 µL, added last
    const steps = sheet.runs[0]!.dispense;
    expect(steps[steps.length - 1]!.source).toBe("buli");
    expect(steps[steps.length - 1]!.volumeUl).toBeCloseTo(220, 9);
    expect(sheet.notes.some((n) => n.code === "reactive_added_separately" && n.component === "buli")).toBe(true);
  });

  it("refuses a stock of a pyrophoric reagent in a protic solvent", () => {
    try {
      buildRunSheet(buliPlan("stock"));
      expect.unreachable();
    } catch (e) {
      expect((e as AppError).code).toBe("invalid_input");
      expect((e as AppError).issues[0]?.path).toBe("recipe.components.1.stockSolvent");
    }
  });
});

describe("weighing and pipetting limits", () => {
  it("raises a stock's volume so the weighed mass reaches the minimum weighing mass, or says it cannot", () => {
    const plan = smallScreen();
    plan.dispensing = { ...plan.dispensing, minWeighMassMg: 82 }; // 4-place balance, USP ⟨41⟩ (from memory)
    const doc = planDocumentSchema.parse(plan);
    const sheet = buildRunSheet(doc);
    for (const s of sheet.stocks) {
      for (const m of s.members) {
        const solid = doc.recipe.components.find((c) => c.id === m.id)!.form.state === "solid";
        if (!solid) continue;
        const flagged = sheet.notes.some((n) => n.code === "stock_below_min_weighing_mass" && n.component === m.id);
        expect(m.weighMg! >= 82 || flagged, `${s.id} ${m.id}: ${m.weighMg} mg`).toBe(true);
      }
    }
    // The Pd stock (≈0.1 mg per vial) cannot reach 82 mg within 25 mL: flagged with the remedy.
    const pdNote = sheet.notes.find((n) => n.code === "stock_below_min_weighing_mass" && n.component === "pd")!;
    expect(pdNote.remedy).toMatch(/serial dilution/);
    expectStockInvariants(doc, sheet);
  });

  it("flags per-vial solids below the minimum weighing mass, with the remedy (a stock solution)", () => {
    const plan = smallScreen();
    plan.recipe.components[3]!.dispense = "solid"; // Pd dimer weighed per vial: 0.02–0.09 mg
    const sheet = buildRunSheet(plan);
    const note = sheet.notes.find((n) => n.code === "below_min_weighing_mass" && n.component === "pd")!;
    expect(note.runs.sort((a, b) => a - b)).toEqual([1, 2, 3, 4, 5, 6, 7, 8, 9, 10]);
    expect(note.remedy).toMatch(/stock solution/);
  });

  it("falls back to weighing a solid per vial when its solubility leaves no room, and says so", () => {
    // K3PO4 up to 3 equiv × 0.25 mmol = 0.75 mmol = 159 mg: at 900 mg/mL it needs 177 µL of
    // water, but 10 vol % of 975 µL is 97.5 µL: weighed per vial instead (computed here).
    const doc = planDocumentSchema.parse(screeningPlan());
    const sheet = buildRunSheet(doc);
    expect(sheet.components.find((c) => c.id === "base")!.dispensedAs).toBe("solid");
    const note = sheet.notes.find((n) => n.code === "solid_per_vial_solubility" && n.component === "base")!;
    expect(note.runs.length).toBeGreaterThan(0);
    expectStockInvariants(doc, sheet);
    const got = deliveredMmol(doc, sheet, 0);
    expect(got.base! / got.arBr!).toBeCloseTo(1.5, 9); // run 1: base at its low level
  });

  it("flags a liquid dispensed as supplied below the minimum pipettable volume", () => {
    // TBAF 1.0 M, 0.1 equiv × 0.1 mmol = 0.01 mmol → 1000 × 0.01 / 1.0 = 10 µL, below 25 µL
    const plan = smallScreen();
    plan.dispensing = { ...plan.dispensing, minPipetteVolumeUl: 25 };
    const sheet = buildRunSheet(plan);
    const note = sheet.notes.find((n) => n.code === "below_min_pipette_volume" && n.component === "additive")!;
    expect(note.runs).toHaveLength(10);
    expect(sheet.runs[0]!.dispense.find((d) => d.source === "additive")!.volumeUl).toBeCloseTo(10, 9);
  });

  it("never gives NaN or negative amounts", () => {
    expectNoBadNumbers(buildRunSheet(smallScreen()));
  });
});
