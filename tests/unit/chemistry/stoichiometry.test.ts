import { describe, expect, it } from "vitest";
import { buildRunSheet } from "@/lib/chemistry/run-sheet";
import { suzukiPlan } from "./fixtures";

// A worked per-vial example, its arithmetic written out by hand. Molar masses from the
// IUPAC 2021 standard (conventional) atomic weights, from memory: C 12.011, H 1.008,
// B 10.81, N 14.007, O 15.999, F 18.998403162, P 30.973761998, Cl 35.45, K 39.0983,
// Br 79.904, Pd 106.42. Definitions: the usual ones of synthetic chemistry (mmol × g/mol
// = mg; mass as supplied = pure mass / purity; µL = mg ÷ (g/mL); µL = 1000 × mmol ÷ M).
describe("per-vial stoichiometry: worked example (computed in this test by hand)", () => {
  const sheet = buildRunSheet(suzukiPlan());
  const run = sheet.runs[0]!;
  const c = (id: string) => run.components.find((x) => x.id === id)!;

  it("limiting reagent 0.25 mmol at 0.25 M gives 1000 µL final volume", () => {
    // V = 1000 × n / c = 1000 × 0.25 mmol / 0.25 M = 1000 µL
    expect(run.finalVolumeUl).toBeCloseTo(1000, 9);
    expect(run.limitingMmol).toBe(0.25);
  });

  it("aryl bromide (neat liquid): mmol → mg with purity → µL by density", () => {
    // M(C9H11Br) = 9 × 12.011 + 11 × 1.008 + 79.904 = 108.099 + 11.088 + 79.904 = 199.091 g/mol
    // pure mass = 0.25 mmol × 199.091 = 49.77275 mg
    // as supplied (98 %) = 49.77275 / 0.98 = 50.7885204 mg
    // volume = 50.7885204 mg / 1.29 g/mL = 39.370946 µL
    const a = c("arBr");
    expect(a.mmol).toBeCloseTo(0.25, 12);
    expect(a.pureMassMg).toBeCloseTo(49.77275, 9);
    expect(a.massMg!).toBeCloseTo(49.77275 / 0.98, 9);
    expect(a.volumeUl!).toBeCloseTo(49.77275 / 0.98 / 1.29, 9);
    expect(a.volumeUl!).toBeCloseTo(39.370946, 5);
  });

  it("boronic acid (solid, 1.5 equiv, 97 %)", () => {
    // n = 1.5 × 0.25 = 0.375 mmol
    // M(C6H8BNO3) = 72.066 + 8.064 + 10.81 + 14.007 + 47.997 = 152.944 g/mol
    // pure = 0.375 × 152.944 = 57.354 mg; as supplied = 57.354 / 0.97 = 59.127835 mg; no volume
    const a = c("boronicAcid");
    expect(a.mmol).toBeCloseTo(0.375, 12);
    expect(a.pureMassMg).toBeCloseTo(57.354, 9);
    expect(a.massMg!).toBeCloseTo(59.127835, 5);
    expect(a.volumeUl).toBeNull();
  });

  it("K3PO4 (2 equiv, 98 %)", () => {
    // M(K3PO4) = 3 × 39.0983 + 30.973761998 + 4 × 15.999 = 117.2949 + 30.973761998 + 63.996 = 212.264661998
    // n = 0.5 mmol; pure = 106.132331 mg; as supplied = 106.132331 / 0.98 = 108.298297 mg
    const a = c("base");
    expect(a.pureMassMg).toBeCloseTo(106.132331, 5);
    expect(a.massMg!).toBeCloseTo(108.298297, 5);
  });

  it("dimeric precatalyst: 1 mol % of metal is 0.5 mol % of the complex", () => {
    // n(Pd) = 1 % × 0.25 mmol = 0.0025 mmol; 2 Pd per formula unit → n(complex) = 0.00125 mmol
    // = 0.5 mol % of the limiting reagent
    // M((Pd(C3H5)Cl)2) = 6 × 12.011 + 10 × 1.008 + 2 × 35.45 + 2 × 106.42 = 72.066 + 10.08 + 70.9 + 212.84 = 365.886
    // pure = 0.00125 × 365.886 = 0.45735750 mg; as supplied (98 %) = 0.46669133 mg
    const a = c("pd");
    expect(a.mmol).toBeCloseTo(0.00125, 12);
    expect((a.mmol / 0.25) * 100).toBeCloseTo(0.5, 10);
    expect(a.loadingMolPercent).toBe(1);
    expect(a.pureMassMg).toBeCloseTo(0.4573575, 9);
    expect(a.massMg!).toBeCloseTo(0.4573575 / 0.98, 9);
  });

  it("ligand at 2 : 1 to metal (not to the complex)", () => {
    // n(L) = 2 × n(Pd) = 2 × 0.0025 = 0.005 mmol (= 4 × n(complex))
    // M(C26H35O2P) = 312.286 + 35.28 + 31.998 + 30.973761998 = 410.537761998; mass = 2.05268881 mg
    const a = c("ligand");
    expect(a.mmol).toBeCloseTo(0.005, 12);
    expect(a.mmol / c("pd").mmol).toBeCloseTo(4, 10);
    expect(a.pureMassMg).toBeCloseTo(0.005 * 410.537761998, 9);
  });

  it("additive solution (1.0 M): µL from molarity", () => {
    // n = 0.1 × 0.25 = 0.025 mmol; V = 1000 × 0.025 / 1.0 = 25 µL; no density given → mass as supplied unknown
    const a = c("additive");
    expect(a.volumeUl!).toBeCloseTo(25, 9);
    expect(a.massMg).toBeNull();
    // M(C16H36FN) = 192.176 + 36.288 + 18.998403162 + 14.007 = 261.469403162
    expect(a.pureMassMg).toBeCloseTo(0.025 * 261.469403162, 9);
  });

  it("solution given in wt % with density: mass of solution, then volume", () => {
    // A 25 wt % solution of the boronic acid, density 1.05 g/mL (invented):
    // n = 0.375 mmol; pure = 57.354 mg; solution = 57.354 / 0.25 = 229.416 mg; V = 229.416 / 1.05 = 218.491429 µL
    const doc = suzukiPlan();
    doc.recipe.components[1] = {
      ...doc.recipe.components[1]!,
      form: { state: "solution", wtPercent: 25, densityGPerMl: 1.05 },
      solubilityMgPerMl: undefined,
    };
    const a = buildRunSheet(doc).runs[0]!.components.find((x) => x.id === "boronicAcid")!;
    expect(a.massMg!).toBeCloseTo(229.416, 9);
    expect(a.volumeUl!).toBeCloseTo(218.491429, 5);
  });

  it("a concentration factor held at constant volume changes the scale, not the volume", () => {
    // hold "volume": V = 1000 µL from the recipe (0.25 mmol at 0.25 M); at 0.5 M the scale is 0.5 M × 1 mL = 0.5 mmol
    const doc = suzukiPlan({
      factors: [{ name: "conc", low: 0.2, high: 0.5, unit: "M", binding: { kind: "concentration", hold: "volume" } }],
      design: { runs: [{ standardOrder: 1, natural: { conc: 0.5 } }] },
    });
    const r = buildRunSheet(doc).runs[0]!;
    expect(r.finalVolumeUl).toBeCloseTo(1000, 9);
    expect(r.limitingMmol).toBeCloseTo(0.5, 12);
    expect(r.components.find((x) => x.id === "boronicAcid")!.mmol).toBeCloseTo(0.75, 12);
  });

  it("factor units are converted: 90 min is 1.5 h, 353.15 K is 80 °C, 250 mM is 0.25 M", () => {
    // convert-units definitions: 1 h = 60 min; T(°C) = T(K) − 273.15
    const doc = suzukiPlan({
      factors: [
        { name: "time", low: 30, high: 120, unit: "min", binding: { kind: "time" } },
        { name: "T", low: 333.15, high: 373.15, unit: "K", binding: { kind: "temperature" } },
        { name: "conc", low: 100, high: 300, unit: "mM", binding: { kind: "concentration" } },
      ],
      design: { runs: [{ standardOrder: 1, natural: { time: 90, T: 353.15, conc: 250 } }] },
    });
    const r = buildRunSheet(doc).runs[0]!;
    expect(r.timeH).toBeCloseTo(1.5, 12);
    expect(r.temperatureC).toBeCloseTo(80, 9);
    expect(r.concentrationM).toBeCloseTo(0.25, 12);
    expect(r.finalVolumeUl).toBeCloseTo(1000, 9);
  });
});
