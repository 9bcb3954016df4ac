import { describe, expect, it } from "vitest";
import { MF } from "mf-parser";
import { AppError } from "@/lib/errors/app-error";
import { formulaMolarMass, hillFormula, molarMass } from "@/lib/chemistry/molar-mass";
import { smilesMolarMass } from "@/lib/chemistry/smiles";

// IUPAC/CIAAW "Standard atomic weights of the elements 2021" (Prohaska et al., Pure Appl.
// Chem. 94 (2022) 573): conventional values for the interval elements (H, B, C, N, O, S,
// Cl, Br, Li), standard values otherwise. Typed here independently of the library's
// table, FROM MEMORY (not re-checked against a stored copy of the report).
const W: Record<string, number> = {
  H: 1.008,
  Li: 6.94,
  B: 10.81,
  C: 12.011,
  N: 14.007,
  O: 15.999,
  P: 30.973761998,
  S: 32.06,
  Cl: 35.45,
  K: 39.0983,
  Br: 79.904,
  Pd: 106.42,
  Cs: 132.90545196,
};
const sum = (atoms: Record<string, number>) => Object.entries(atoms).reduce((a, [el, n]) => a + W[el]! * n, 0);

describe("molar mass from a formula (IUPAC 2021 standard atomic weights)", () => {
  // Each expected value is computed in this test from the weights above (from memory).
  const cases: Array<[string, Record<string, number>]> = [
    ["C9H11Br", { C: 9, H: 11, Br: 1 }], // 1-bromo-4-isopropylbenzene: 9·12.011 + 11·1.008 + 79.904 = 199.091
    ["K3PO4", { K: 3, P: 1, O: 4 }], // 3·39.0983 + 30.973761998 + 4·15.999 = 212.264662
    ["C6H8BNO3", { C: 6, H: 8, B: 1, N: 1, O: 3 }], // 2-methoxypyridin-3-ylboronic acid
    ["(Pd(C3H5)Cl)2", { C: 6, H: 10, Cl: 2, Pd: 2 }], // allylpalladium chloride dimer: 365.886
    ["Pd(PPh3)4", { C: 72, H: 60, P: 4, Pd: 1 }], // tetrakis(triphenylphosphine)palladium, group Ph expanded
    ["C4H9Li", { C: 4, H: 9, Li: 1 }], // n-butyllithium: 64.056
    ["Cs2CO3", { Cs: 2, C: 1, O: 3 }], // caesium carbonate
    ["K3PO4.H2O", { K: 3, P: 1, O: 5, H: 2 }], // the monohydrate, hydrate written with "."
    ["Et3N", { C: 6, H: 15, N: 1 }], // triethylamine, group Et expanded
    ["C6H5SO2Cl", { C: 6, H: 5, S: 1, O: 2, Cl: 1 }], // benzenesulfonyl chloride
  ];
  for (const [formula, atoms] of cases) {
    it(`${formula}`, () => {
      const r = molarMass({ formula });
      expect(r.atoms).toEqual(atoms);
      // Agreement to 1e-9 relative: the sums differ only in floating-point order.
      expect(r.gPerMol).toBeCloseTo(sum(atoms), 9);
    });
  }

  it("gives the README's example C9H11Br → 199.09 g/mol, 198.0044 monoisotopic", () => {
    const r = molarMass({ formula: "C9H11Br" });
    expect(r.gPerMol).toBeCloseTo(199.09, 2); // the README's molar-mass example
    // Monoisotopic, computed in this test from the AME isotope masses (from memory):
    // 9·12 + 11·1.00782503223 + 78.9183376 (⁷⁹Br) = 198.00441295
    expect(r.monoisotopic).toBeCloseTo(9 * 12 + 11 * 1.00782503223 + 78.9183376, 6);
  });

  it("differs from mf-parser's abundance-derived element masses by less than 30 ppm", () => {
    // mf-parser/chemical-elements derive element masses from one isotopic composition
    // (C 12.010736, H 1.0079408): close to, but not, the IUPAC values; checked here so a
    // parser change that miscounts atoms would show up as a large difference.
    for (const f of ["C9H11Br", "C26H35O2P", "C72H60P4Pd"]) {
      const ours = molarMass(f).gPerMol;
      const theirs = new MF(f).getInfo().mass;
      expect(Math.abs(ours - theirs) / ours).toBeLessThan(30e-6);
    }
  });

  it("writes the composition in Hill order", () => {
    // Hill system (Hill, J. Am. Chem. Soc. 22 (1900) 478): C, H, then alphabetical; no C: all alphabetical.
    expect(hillFormula({ Br: 1, H: 11, C: 9 })).toBe("C9H11Br");
    expect(hillFormula({ K: 3, P: 1, O: 4 })).toBe("K3O4P");
    expect(molarMass("Pd(PPh3)4").hillFormula).toBe("C72H60P4Pd");
  });

  it("refuses bad formulas with invalid_input at path 'formula'", () => {
    for (const bad of ["", "ch4", "Xx2", "Pd(OAc)2", "[13C]H4", "Hello"]) {
      let err: unknown;
      try {
        formulaMolarMass(bad);
      } catch (e) {
        err = e;
      }
      expect(err, bad).toBeInstanceOf(AppError);
      expect((err as AppError).code).toBe("invalid_input");
      expect((err as AppError).issues[0]?.path).toBe("formula");
    }
  });

  it("the synchronous molarMass() sends SMILES to smilesMolarMass()", () => {
    try {
      molarMass({ smiles: "c1ccccc1" });
      expect.unreachable();
    } catch (e) {
      expect((e as AppError).code).toBe("invalid_input");
      expect((e as AppError).issues[0]?.path).toBe("smiles");
    }
  });
});

describe("molar mass from SMILES (openchemlib parser, IUPAC 2021 weights)", () => {
  // SMILES written by hand from the structures (OpenSMILES: implicit H by valence);
  // expected formulas counted by hand, masses computed in this test from the weights above.
  const cases: Array<[string, string, Record<string, number>]> = [
    ["CC(C)c1ccc(Br)cc1", "1-bromo-4-isopropylbenzene", { C: 9, H: 11, Br: 1 }],
    ["COc1ncccc1B(O)O", "2-methoxypyridin-3-ylboronic acid", { C: 6, H: 8, B: 1, N: 1, O: 3 }],
    ["CCCC[Li]", "n-butyllithium", { C: 4, H: 9, Li: 1 }],
    ["[K+].[K+].[K+].[O-]P([O-])([O-])=O", "tripotassium phosphate", { K: 3, P: 1, O: 4 }],
  ];
  for (const [smiles, name, atoms] of cases) {
    it(`${name}: ${smiles}`, async () => {
      const r = await smilesMolarMass(smiles);
      expect(r.atoms).toEqual(atoms);
      expect(r.gPerMol).toBeCloseTo(sum(atoms), 9);
    });
  }

  it("refuses a SMILES that does not parse, at path 'smiles'", async () => {
    await expect(smilesMolarMass("C1CC((")).rejects.toMatchObject({ code: "invalid_input", issues: [{ path: "smiles" }] });
    await expect(smilesMolarMass("  ")).rejects.toMatchObject({ code: "invalid_input" });
    await expect(smilesMolarMass("xyz")).rejects.toMatchObject({ code: "invalid_input", issues: [{ path: "smiles" }] });
    // An unclosed branch, which the parser itself would accept.
    await expect(smilesMolarMass("CC(C")).rejects.toMatchObject({ code: "invalid_input", issues: [{ path: "smiles" }] });
  });
});
