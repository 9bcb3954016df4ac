import { invalidPaths } from "../../support/invalid-paths";
import { describe, expect, it } from "vitest";
import { MF } from "mf-parser";
import {
  BUILT_IN_SOLVENTS,
  boilingPointC,
  builtInCatalogue,
  if97SaturationPressureBar,
  if97SaturationTemperatureK,
  solventCatalogue,
  solventVaporPressure,
  troutonEstimateBar,
  vaporPressure,
  type SolventRecordInput,
} from "@/lib/hazards";

function relErr(actual: number, expected: number): number {
  return Math.abs(actual / expected - 1);
}


describe("IAPWS-IF97 region 4 (water saturation line)", () => {
  // IAPWS R7-97(2012) region 4 check points, computed [C]; tolerance: half a unit in the last digit given.
  it("Psat(100 °C) = 1.01418 bar", () => {
    expect(Math.abs(if97SaturationPressureBar(373.15) - 1.01418)).toBeLessThan(5e-6);
  });
  it("Psat(120 °C) = 1.98665 bar", () => {
    expect(Math.abs(if97SaturationPressureBar(393.15) - 1.98665)).toBeLessThan(5e-6);
  });
  it("Psat(150 °C) = 4.7610 bar", () => {
    expect(Math.abs(if97SaturationPressureBar(423.15) - 4.761)).toBeLessThan(5e-5);
  });
  it("Tsat(1.01325 bar) = 99.974 °C (backward equation)", () => {
    expect(Math.abs(if97SaturationTemperatureK(1.01325) - 273.15 - 99.974)).toBeLessThan(5e-4);
  });
  it("the forward and backward equations are consistent (computed in this test: round trip at 60, 100, 200, 300 °C)", () => {
    for (const c of [60, 100, 200, 300]) {
      const t = c + 273.15;
      expect(Math.abs(if97SaturationTemperatureK(if97SaturationPressureBar(t)) - t)).toBeLessThan(1e-3);
    }
  });
  it("water is looked up and computed by IAPWS-IF97, in range", () => {
    const r = vaporPressure("water", 120);
    expect(r.method).toBe("IAPWS-IF97");
    expect(r.inRange).toBe(true);
    expect(Math.abs(r.bar - 1.98665)).toBeLessThan(5e-6); // IAPWS R7-97(2012) eq. 30, computed [C]
  });
});

describe("DIPPR-101 (Perry's Table 2-8) check values", () => {
  // check values computed from Perry's 8th ed. Table 2-8 [C]; tolerance half a unit in the last digit given.
  const cases: Array<[string, number, number, number]> = [
    ["tetrahydrofuran", 100, 2.722, 5e-4],
    ["tetrahydrofuran", 120, 4.437, 5e-4],
    ["toluene", 150, 2.754, 5e-4],
    ["acetonitrile", 120, 2.952, 5e-4],
    ["acetone", 100, 3.73, 5e-3],
  ];
  for (const [name, t, bar, tol] of cases) {
    it(`${name} at ${t} °C = ${bar} bar`, () => {
      const r = vaporPressure(name, t);
      expect(r.method).toBe("DIPPR-101");
      expect(r.inRange).toBe(true);
      expect(r.source).toMatch(/Perry/);
      expect(Math.abs(r.bar - bar)).toBeLessThan(tol);
    });
  }
});

describe("NIST Antoine set against the Perry's set", () => {
  // NIST WebBook SRD 69 Antoine vs Perry's Table 2-8: inside their ranges the NIST Antoine sets agree with the Perry's
  // DIPPR-101 set to about 1 %; checked here at the middle of each NIST range.
  for (const r of BUILT_IN_SOLVENTS) {
    const a = r.antoine;
    const d = r.dippr101;
    if (!a || !d || a.tminK === null || a.tmaxK === null) continue;
    it(`${r.name}: Antoine and DIPPR-101 agree within 1 % at ${((a.tminK + a.tmaxK) / 2 - 273.15).toFixed(1)} °C`, () => {
      const t = (a.tminK! + a.tmaxK!) / 2;
      const antoine = Math.pow(10, a.a - a.b / (t + a.c));
      const dippr = solventVaporPressure(r, t).bar;
      expect(relErr(antoine, dippr)).toBeLessThan(0.01);
    });
  }
  it("a solvent with only an Antoine set (2-methyltetrahydrofuran, range unknown) is flagged as not in range", () => {
    const r = vaporPressure("2-MeTHF", 80);
    expect(r.method).toBe("Antoine");
    expect(r.inRange).toBe(false); // secondary Antoine set, valid range unknown [S]
    expect(Math.abs(r.bar - 1.01325)).toBeLessThan(0.01); // listed nbp 80.2 °C [V*], the record's published source (docs/sources.md)
  });
  it("outside its DIPPR range a correlation is used but flagged (THF at −110 °C, below Tmin 164.65 K)", () => {
    const r = vaporPressure("THF", -110);
    expect(r.inRange).toBe(false);
    expect(r.bar).toBeGreaterThan(0);
  });
});

describe("normal boiling points", () => {
  // Each solvent's computed normal boiling point (vapour pressure = 1.01325 bar) within
  // 1.5 °C of the value listed in its record: the record's published source (docs/sources.md) where listed (its tag), else
  // from memory (tag M), as the record's source says.
  for (const r of BUILT_IN_SOLVENTS) {
    const listed = r.normalBoilingPointC;
    const check = () => expect(Math.abs(boilingPointC(r) - listed.value)).toBeLessThan(1.5);
    if (r.id === "dimethyl-sulfoxide") {
      // Known discrepancy, kept visible rather than loosened: Perry's DIPPR-101 set for
      // DMSO as we have Perry's set reaches 1 atm at ≈190.7 °C, 1.7 °C above the
      // listed 189 °C [V]. The correlation (not the code: the other check values match)
      // is the side that is off. This test fails as expected until the data are fixed.
      it.fails(`${r.name}: computed normal boiling point within 1.5 °C of ${listed.value} °C (${listed.tag}) — known data discrepancy`, check);
    } else {
      it(`${r.name}: computed normal boiling point within 1.5 °C of ${listed.value} °C (${listed.tag}${listed.tag === "M" ? ", from memory" : ""})`, check);
    }
  }
});

describe("Clausius–Clapeyron with Trouton's rule (estimate)", () => {
  it("THF at 120 °C from its boiling point 66 °C gives 4.34 bar (Clausius–Clapeyron with Trouton's rule, computed [C])", () => {
    expect(Math.abs(troutonEstimateBar(66 + 273.15, 120 + 273.15) - 4.34)).toBeLessThan(0.005);
  });
  it("a solvent without correlations (1,2-dimethoxyethane) is estimated and says so", () => {
    const r = vaporPressure("DME", 100);
    expect(r.method).toBe("estimate");
    expect(r.inRange).toBe(false);
    expect(r.source).toMatch(/Trouton/);
  });
  it("is refused for a protic lab solvent without correlations (Trouton's rule does not hold for hydrogen-bonded liquids)", () => {
    const lab: SolventRecordInput[] = [
      {
        id: "1-butanol-lab",
        name: "1-butanol (lab)",
        molarMassGPerMol: { value: 74.123, source: "computed from the formula C4H10O", tag: "lab" },
        densityGPerMl: { value: 0.81, source: "lab SDS", tag: "lab" },
        thermalExpansionPerK: { value: 1e-3, source: "lab estimate", tag: "lab" },
        normalBoilingPointC: { value: 117.7, source: "lab SDS", tag: "lab" },
        protic: true,
      },
    ];
    expect(invalidPaths(() => vaporPressure("1-butanol (lab)", 120, lab))).toEqual(["temperatureC"]);
  });
});

describe("solvent records", () => {
  it("are found by name, synonym and CAS number (computed in this test: all three give the same record)", () => {
    const c = builtInCatalogue();
    expect(c.find("THF")?.id).toBe("tetrahydrofuran");
    expect(c.find("109-99-9")?.id).toBe("tetrahydrofuran");
    expect(c.find("  Tetrahydrofuran ")?.id).toBe("tetrahydrofuran");
    expect(c.find("dioxane")?.id).toBe("1,4-dioxane");
    expect(c.find("N,N-Dimethylformamide")?.id).toBe("n,n-dimethylformamide");
    expect(c.find("Diethyl Ether")?.id).toBe("diethyl-ether");
    expect(c.find("unobtainium")).toBeUndefined();
  });
  it("have valid CAS check digits (computed in this test by the CAS check-digit rule)", () => {
    for (const r of BUILT_IN_SOLVENTS) {
      if (!r.cas) continue;
      const digits = r.cas.replace(/-/g, "");
      const body = digits.slice(0, -1).split("").reverse();
      const sum = body.reduce((s, d, i) => s + Number(d) * (i + 1), 0);
      expect(sum % 10, r.name).toBe(Number(digits.slice(-1)));
    }
  });
  it("carry molar masses equal to the formula mass (computed in this test with mf-parser, IUPAC standard atomic weights)", () => {
    for (const r of BUILT_IN_SOLVENTS) {
      expect(r.formula, r.name).not.toBeNull();
      const mass = new MF(r.formula!).getInfo().mass;
      expect(Math.abs(r.molarMassGPerMol.value - mass), r.name).toBeLessThan(0.01);
    }
  });
  it("give a source and a tag for every value", () => {
    for (const r of BUILT_IN_SOLVENTS) {
      for (const v of [r.molarMassGPerMol, r.densityGPerMl, r.thermalExpansionPerK, r.normalBoilingPointC, r.flashPointC, r.autoignitionC, r.peroxideClass, r.ghs, r.dippr101, r.antoine]) {
        if (v) expect(v.source.length, r.name).toBeGreaterThan(5);
      }
    }
  });
  it("list the peroxide classes of the record's published source (docs/sources.md) (THF, diethyl ether, 1,4-dioxane, DME, 2-propanol: B)", () => {
    const c = builtInCatalogue();
    for (const n of ["THF", "diethyl ether", "1,4-dioxane", "DME", "2-propanol", "2-MeTHF"]) {
      expect(c.find(n)?.peroxideClass?.value, n).toBe("B");
    }
    expect(c.find("toluene")?.peroxideClass).toBeNull();
  });
  it("accept a lab's own solvent, which is then used for vapour pressure", () => {
    const lab: SolventRecordInput[] = [
      {
        id: "cpme",
        name: "cyclopentyl methyl ether",
        synonyms: ["CPME"],
        molarMassGPerMol: { value: 100.16, source: "computed from C6H12O", tag: "lab" },
        densityGPerMl: { value: 0.86, source: "supplier SDS", tag: "lab" },
        thermalExpansionPerK: { value: 1.2e-3, source: "lab estimate", tag: "lab" },
        normalBoilingPointC: { value: 106, source: "supplier SDS", tag: "lab" },
      },
    ];
    const r = vaporPressure("CPME", 106, lab);
    expect(r.method).toBe("estimate");
    // computed in this test: by construction the estimate is 1 atm at the normal boiling point
    expect(Math.abs(r.bar - 1.01325)).toBeLessThan(1e-9);
  });
  it("reject an invalid lab record with the field's path", () => {
    const bad = [{ id: "x", name: "x", molarMassGPerMol: { value: -1, source: "s", tag: "lab" } }];
    const paths = invalidPaths(() => solventCatalogue(bad));
    expect(paths).toContain("labSolvents.0.molarMassGPerMol.value");
    expect(paths).toContain("labSolvents.0.densityGPerMl");
  });
});

describe("invalid inputs give errors, not numbers", () => {
  it("unknown solvent → path solvent", () => {
    expect(invalidPaths(() => vaporPressure("unobtainium", 50))).toEqual(["solvent"]);
  });
  it("−300 °C → path temperatureC", () => {
    expect(invalidPaths(() => vaporPressure("toluene", -300))).toEqual(["temperatureC"]);
  });
  it("above the critical temperature (toluene at 400 °C; Tc 591.75 K, Perry's Tmax) → path temperatureC", () => {
    expect(invalidPaths(() => vaporPressure("toluene", 400))).toEqual(["temperatureC"]);
  });
});
