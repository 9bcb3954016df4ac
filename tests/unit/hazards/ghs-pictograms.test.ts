import { describe, expect, it } from "vitest";
import { GHS_PICTOGRAMS, GHS_PICTOGRAM_STEMS, ghsPictograms } from "@/lib/hazards/ghs-pictograms";

// Source: UN GHS Rev. 10 (2023), Annex 1 (the symbol of each hazard category) and Annex 3
// section 1 (the statement codes); precedence UN GHS §1.4.10.5.3.1 / EU CLP Art. 26(1)
// (from memory). The label examples below are from memory of suppliers' labels.
describe("GHS statements → pictograms", () => {
  it("maps single statements of each class to its symbol (UN GHS Annex 1)", () => {
    expect(ghsPictograms(["H201"])).toEqual(["GHS01"]); // explosive div. 1.1
    expect(ghsPictograms(["H241"])).toEqual(["GHS01", "GHS02"]); // self-reactive / organic peroxide type B: bomb and flame
    expect(ghsPictograms(["H250"])).toEqual(["GHS02"]); // pyrophoric
    expect(ghsPictograms(["H261"])).toEqual(["GHS02"]); // water-reactive
    expect(ghsPictograms(["H271"])).toEqual(["GHS03"]); // oxidising cat. 1
    expect(ghsPictograms(["H280"])).toEqual(["GHS04"]); // gas under pressure
    expect(ghsPictograms(["H314"])).toEqual(["GHS05"]); // skin corrosion
    expect(ghsPictograms(["H330"])).toEqual(["GHS06"]); // acute tox. inhalation cat. 1–2
    expect(ghsPictograms(["H302"])).toEqual(["GHS07"]); // acute tox. oral cat. 4
    expect(ghsPictograms(["H350"])).toEqual(["GHS08"]); // carcinogenicity
    expect(ghsPictograms(["H410"])).toEqual(["GHS09"]); // aquatic chronic 1
  });

  it("gives no symbol to categories the GHS labels without one", () => {
    for (const code of ["H221", "H227", "H229", "H303", "H305", "H313", "H316", "H320", "H333", "H362", "H401", "H402", "H412", "H413", "EUH014", "EUH019", "P210"]) {
      expect(ghsPictograms([code]), code).toEqual([]);
    }
  });

  it("matches statements with suffixes by their stem and splits combined statements", () => {
    expect(ghsPictograms(["H350i"])).toEqual(["GHS08"]);
    expect(ghsPictograms(["H360FD"])).toEqual(["GHS08"]);
    expect(ghsPictograms(["h225"])).toEqual(["GHS02"]);
    expect(ghsPictograms(["H300+H310+H330"])).toEqual(["GHS06"]);
  });

  it("drops the exclamation mark where the skull, corrosion (for irritation) or respiratory sensitisation applies (GHS §1.4.10.5.3.1)", () => {
    expect(ghsPictograms(["H301", "H315", "H335"])).toEqual(["GHS06"]);
    expect(ghsPictograms(["H314", "H315", "H319"])).toEqual(["GHS05"]);
    expect(ghsPictograms(["H318", "H315", "H335"])).toEqual(["GHS05", "GHS07"]); // H335 is not irritation of skin or eye: the mark stays
    expect(ghsPictograms(["H334", "H317"])).toEqual(["GHS08"]);
    expect(ghsPictograms(["H334", "H302"])).toEqual(["GHS07", "GHS08"]);
  });

  it("gives the pictograms of typical reagents' labels (from memory of suppliers' labels)", () => {
    // n-Butyllithium in hexanes: H225 H250 H261 H304 H314 H336 H361f H373 H411.
    expect(ghsPictograms(["H225", "H250", "H261", "H304", "H314", "H336", "H361f", "H373", "H411"])).toEqual(["GHS02", "GHS05", "GHS07", "GHS08", "GHS09"]);
    // Methanol: H225 H301 H311 H331 H370.
    expect(ghsPictograms(["H225", "H301", "H311", "H331", "H370"])).toEqual(["GHS02", "GHS06", "GHS08"]);
    // 1,4-Dioxane: H225 H319 H335 H351 EUH019 EUH066.
    expect(ghsPictograms(["H225", "H319", "H335", "H351", "EUH019", "EUH066"])).toEqual(["GHS02", "GHS07", "GHS08"]);
    // Sodium hydroxide: H290 H314.
    expect(ghsPictograms(["H290", "H314"])).toEqual(["GHS05"]);
  });

  it("lists each statement stem under one pictogram only, except the bomb-and-flame H241", () => {
    const owners = new Map<string, string[]>();
    for (const p of GHS_PICTOGRAMS) for (const s of GHS_PICTOGRAM_STEMS[p]) owners.set(s, [...(owners.get(s) ?? []), p]);
    const multi = [...owners].filter(([, ps]) => ps.length > 1);
    expect(multi).toEqual([["H241", ["GHS01", "GHS02"]]]);
  });
});
