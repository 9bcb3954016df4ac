import { invalidPaths } from "../../support/invalid-paths";
import { describe, expect, it } from "vitest";
import { R_L_BAR_PER_MOL_K, builtInCatalogue, estimateSealedVessel, vaporPressure, vesselPressure } from "@/lib/hazards";

const cat = builtInCatalogue();
const part = (name: string, volumeFraction: number) => ({ record: cat.resolve(name, "x"), volumeFraction });


describe("sealed-vessel pressure (ideal-gas + Raoult model, docs/hazards.md)", () => {
  it("THF sealed at 1 atm and 25 °C, half full, heated to 120 °C: ≈ 5.6 bar absolute within 10 % (worked example computed from the model [C], docs/sources.md)", () => {
    const est = estimateSealedVessel({
      parts: [part("THF", 1)],
      temperatureC: 120,
      sealTemperatureC: 25,
      sealPressureBar: 1.01325,
      vesselVolumeMl: 4,
      liquidVolumeMl: 2,
      gasReleasedMmol: 0,
    });
    expect(est.totalBar).not.toBeNull();
    expect(Math.abs(est.totalBar! / 5.6 - 1)).toBeLessThan(0.1);
  });

  it("1,4-dioxane/water 80:20 (v/v) at 110 °C lies between the pure components and follows Raoult's law (computed in this test)", () => {
    const r = vesselPressure({
      solvents: [
        { name: "1,4-dioxane", volumeFraction: 0.8 },
        { name: "water", volumeFraction: 0.2 },
      ],
      temperatureC: 110,
      vesselVolumeMl: 4,
      liquidVolumeMl: 2,
    });
    const pDiox = vaporPressure("1,4-dioxane", 110).bar;
    const pWater = vaporPressure("water", 110).bar;
    expect(r.vaporBar).toBeGreaterThan(Math.min(pDiox, pWater));
    expect(r.vaporBar).toBeLessThan(Math.max(pDiox, pWater));
    // Raoult's law computed here: moles per volume from density/molar mass of each record.
    const d = cat.resolve("1,4-dioxane", "x");
    const w = cat.resolve("water", "x");
    const nD = (0.8 * d.densityGPerMl.value) / d.molarMassGPerMol.value;
    const nW = (0.2 * w.densityGPerMl.value) / w.molarMassGPerMol.value;
    const raoult = (nD * pDiox + nW * pWater) / (nD + nW);
    expect(Math.abs(r.vaporBar - raoult)).toBeLessThan(1e-12);
  });

  it("at the seal temperature the total equals the seal pressure (computed in this test: air + vapour = P_seal by construction)", () => {
    const est = estimateSealedVessel({
      parts: [part("toluene", 0.5), part("methanol", 0.5)],
      temperatureC: 25,
      sealTemperatureC: 25,
      sealPressureBar: 1.01325,
      vesselVolumeMl: 4,
      liquidVolumeMl: 1,
      gasReleasedMmol: 0,
    });
    expect(Math.abs(est.totalBar! - 1.01325)).toBeLessThan(1e-12);
  });

  it("declared gas adds n·R·T/V_head: 1 mmol in 1 mL at 100 °C ≈ 31 bar (n·R·T/V with R = 0.0831446 L·bar/(mol·K), CODATA 2018)", () => {
    const est = estimateSealedVessel({
      parts: [part("DMSO", 1)],
      temperatureC: 100,
      sealTemperatureC: 25,
      sealPressureBar: 1.01325,
      vesselVolumeMl: 4,
      liquidVolumeMl: 2,
      gasReleasedMmol: 1,
    });
    // Scaled to a 1 mL headspace: gasBar · V_head(hot) is the pressure 1 mmol would give in 1 mL.
    const perMl = est.gasBar! * est.headspaceHotMl;
    expect(Math.abs(perMl - 31)).toBeLessThan(0.05); // n·R·T/V computed by hand: 1e-3 mol × 0.0831446 × 373.15 K / 1e-3 L = 31.03 bar
    expect(Math.abs(perMl - R_L_BAR_PER_MOL_K * 373.15)).toBeLessThan(1e-9); // computed in this test from n·R·T/V
  });

  it("headspace air follows (T/T_seal)·(V_head,seal/V_head,T) with the liquid's expansion (computed in this test)", () => {
    const est = estimateSealedVessel({
      parts: [part("DMSO", 1)],
      temperatureC: 85,
      sealTemperatureC: 25,
      sealPressureBar: 1.01325,
      vesselVolumeMl: 10,
      liquidVolumeMl: 5,
      gasReleasedMmol: 0,
    });
    const beta = cat.resolve("DMSO", "x").thermalExpansionPerK.value;
    const pv25 = vaporPressure("DMSO", 25).bar;
    const headHot = 10 - 5 * (1 + beta * 60);
    const expected = (1.01325 - pv25) * (358.15 / 298.15) * (5 / headHot);
    expect(Math.abs(est.airBar! - expected)).toBeLessThan(1e-12);
    expect(est.fillFractionHot).toBeGreaterThan(0.5);
  });

  it("a liquid that expands to fill the vessel gives no pressure number and a blocking fill caution", () => {
    const r = vesselPressure({ solvents: [{ name: "toluene", volumeFraction: 1 }], temperatureC: 150, vesselVolumeMl: 4, liquidVolumeMl: 3.6 });
    expect(r.totalBar).toBeNull();
    expect(r.cautions.find((c) => c.code === "TL-V03")?.severity).toBe("blocking");
  });
});

describe("vessel-pressure input errors", () => {
  const base = { solvents: [{ name: "toluene", volumeFraction: 1 }], temperatureC: 100, vesselVolumeMl: 4, liquidVolumeMl: 2 };
  it("unknown solvent → solvents.0.name", () => {
    expect(invalidPaths(() => vesselPressure({ ...base, solvents: [{ name: "unobtainium", volumeFraction: 1 }] }))).toEqual(["solvents.0.name"]);
  });
  it("−300 °C → temperatureC", () => {
    expect(invalidPaths(() => vesselPressure({ ...base, temperatureC: -300 }))).toEqual(["temperatureC"]);
  });
  it("fractions not summing to 1 → solvents", () => {
    const solvents = [
      { name: "toluene", volumeFraction: 0.5 },
      { name: "water", volumeFraction: 0.4 },
    ];
    expect(invalidPaths(() => vesselPressure({ ...base, solvents }))).toEqual(["solvents"]);
  });
  it("the same solvent twice (by synonym) → solvents.1.name", () => {
    const solvents = [
      { name: "THF", volumeFraction: 0.5 },
      { name: "tetrahydrofuran", volumeFraction: 0.5 },
    ];
    expect(invalidPaths(() => vesselPressure({ ...base, solvents }))).toEqual(["solvents.1.name"]);
  });
  it("liquid volume not below the vessel volume → liquidVolumeMl", () => {
    expect(invalidPaths(() => vesselPressure({ ...base, liquidVolumeMl: 4 }))).toEqual(["liquidVolumeMl"]);
  });
});
