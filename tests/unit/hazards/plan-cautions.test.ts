import { invalidPaths } from "../../support/invalid-paths";
import { describe, expect, it } from "vitest";
import {
  DEFAULT_EQUIPMENT,
  DEFAULT_LAB_THRESHOLDS,
  DEFAULT_VESSELS,
  PLANNING_NOTICE,
  boilingPointC,
  builtInCatalogue,
  evaluatePlanCautions,
  type PlanCautionInput,
  type VesselType,
} from "@/lib/hazards";

// A confirmed 20 bar microwave vial (from memory [M]) and DMSO at 25 °C: no rule fires.
const vial: VesselType = { ...DEFAULT_VESSELS.find((v) => v.id.includes("microwave"))!, confirmWithSupplier: false };
const flask: VesselType = { ...DEFAULT_VESSELS.find((v) => !v.sealed)!, confirmWithSupplier: false };

type Run = PlanCautionInput["runs"][number];
type Component = NonNullable<Run["components"]>[number];

function run(over: Partial<Run> = {}): Run {
  return { run: 1, temperatureC: 25, liquidVolumeMl: 2, solvents: [{ name: "DMSO", volumeFraction: 1 }], components: [], ...over };
}

function plan(runs: Run[], over: Partial<PlanCautionInput> = {}) {
  return evaluatePlanCautions({
    vessel: vial,
    thresholds: DEFAULT_LAB_THRESHOLDS,
    equipment: DEFAULT_EQUIPMENT,
    now: "2026-12-01",
    runs,
    ...over,
  });
}

const codes = (r: ReturnType<typeof plan>) => r.cautions.map((c) => c.code);
const one = (over: Partial<Run> = {}, planOver: Partial<PlanCautionInput> = {}) => plan([run(over)], planOver);

const nBuLi: Component = { name: "n-butyllithium 2.5 M in hexanes", ghs: ["H225", "H250", "H261", "H314"], volumeUl: 100 }; // typical statements, from memory [M]


describe("baseline", () => {
  it("a confirmed vial of DMSO at 25 °C gives no caution, is releasable and needs no sign-off", () => {
    const r = one();
    expect(r.cautions).toEqual([]);
    expect(r.releasable).toBe(true);
    expect(r.signOffRequired).toBe(false);
    expect(r.notice).toBe(PLANNING_NOTICE);
    expect(r.notice).toMatch(/planning aids, not a risk assessment/);
    expect(r.perRun[0]?.totalBar).toBeCloseTo(1.01325, 10); // computed: at the seal temperature P = P_seal
  });
});

describe("TL-V01 sealed vessel above the boiling point", () => {
  // Threshold computed in this test: THF's own normal boiling point from its record's correlation.
  const tb = boilingPointC(builtInCatalogue().resolve("THF", "x"));
  const thf = [{ name: "THF", volumeFraction: 1 }];
  it("fires 0.2 °C above and needs sign-off (TL-S03)", () => {
    const r = one({ temperatureC: tb + 0.2, solvents: thf });
    expect(codes(r)).toContain("TL-V01");
    expect(r.signOffReasons.some((s) => s.startsWith("TL-S03"))).toBe(true);
  });
  it("is silent 0.2 °C below", () => {
    const r = one({ temperatureC: tb - 0.2, solvents: thf });
    expect(codes(r)).not.toContain("TL-V01");
    expect(r.signOffRequired).toBe(false);
  });
  it("does not apply to a vented vessel", () => {
    expect(codes(one({ temperatureC: tb + 5, solvents: thf }, { vessel: flask }))).not.toContain("TL-V01");
  });
});

describe("TL-V02 pressure over rating × safety factor (blocking)", () => {
  const conditions = { temperatureC: 120, solvents: [{ name: "THF", volumeFraction: 1 }] };
  const total = one(conditions).perRun[0]!.totalBar!;
  it("fires when the limit is just below the estimate, and blocks release", () => {
    const r = one(conditions, { vessel: { ...vial, ratedBar: (total / 0.5) * 0.999 } });
    expect(r.cautions.find((c) => c.code === "TL-V02")?.severity).toBe("blocking");
    expect(r.releasable).toBe(false);
  });
  it("is silent when the limit is just above", () => {
    const r = one(conditions, { vessel: { ...vial, ratedBar: (total / 0.5) * 1.001 } });
    expect(codes(r)).not.toContain("TL-V02");
  });
  it("uses the lab's safety factor", () => {
    const r = one(conditions, { vessel: { ...vial, ratedBar: total * 1.5 }, thresholds: { ...DEFAULT_LAB_THRESHOLDS, safetyFactor: 0.8 } });
    expect(codes(r)).not.toContain("TL-V02");
  });
});

describe("TL-V03 fill above the maximum (blocking)", () => {
  const max = vial.maxFillFraction * vial.totalVolumeMl;
  it("fires just above the maximum fill", () => {
    const r = one({ liquidVolumeMl: max * 1.01 });
    expect(r.cautions.find((c) => c.code === "TL-V03")?.severity).toBe("blocking");
    expect(r.releasable).toBe(false);
  });
  it("is silent just below", () => {
    expect(codes(one({ liquidVolumeMl: max * 0.99 }))).not.toContain("TL-V03");
  });
});

describe("TL-V04 vapour pressure outside the correlation's range (info)", () => {
  // THF's Perry's range starts at 164.65 K = −108.5 °C (Perry's 8th ed. Table 2-8 Tmin).
  const thf = [{ name: "THF", volumeFraction: 1 }];
  it("fires below Tmin", () => {
    const r = one({ temperatureC: -109, solvents: thf });
    expect(r.cautions.find((c) => c.code === "TL-V04")?.severity).toBe("info");
  });
  it("is silent inside the range", () => {
    expect(codes(one({ temperatureC: -108, solvents: thf }))).not.toContain("TL-V04");
  });
});

describe("TL-V05 pressure cannot be estimated", () => {
  it("fires (blocking in a sealed vessel) for a solvent with no record", () => {
    const r = one({ solvents: [{ name: "unobtainium", volumeFraction: 1 }] });
    expect(r.cautions.find((c) => c.code === "TL-V05")?.severity).toBe("blocking");
    expect(r.perRun[0]?.totalBar).toBeNull();
  });
  it("fires above the critical temperature (toluene at 330 °C; Tc 318.6 °C, Perry's Tmax)", () => {
    const r = one({ temperatureC: 330, solvents: [{ name: "toluene", volumeFraction: 1 }] });
    expect(codes(r)).toContain("TL-V05");
  });
  it("is silent for a known solvent", () => {
    expect(codes(one())).not.toContain("TL-V05");
  });
});

describe("TL-V06 vessel rating not confirmed (info)", () => {
  it("fires for a default vessel flagged 'confirm with your supplier'", () => {
    expect(codes(one({}, { vessel: { ...vial, confirmWithSupplier: true } }))).toContain("TL-V06");
  });
  it("is silent once the lab has confirmed it", () => {
    expect(codes(one())).not.toContain("TL-V06");
  });
});

describe("TL-F01 above the flash point", () => {
  // Toluene flash point 4 °C [V], the record's published source (docs/sources.md).
  const tol = [{ name: "toluene", volumeFraction: 1 }];
  it("fires at 4.5 °C", () => {
    const r = one({ temperatureC: 4.5, solvents: tol });
    expect(r.cautions.find((c) => c.code === "TL-F01")?.component).toBe("toluene");
  });
  it("is silent at 3.5 °C", () => {
    expect(codes(one({ temperatureC: 3.5, solvents: tol }))).not.toContain("TL-F01");
  });
});

describe("TL-F02 within the autoignition margin (blocking)", () => {
  // Diethyl ether autoignition 160 °C [V], the record's published source (docs/sources.md); default margin 50 °C (lab threshold).
  const ether = [{ name: "diethyl ether", volumeFraction: 1 }];
  it("fires at 110 °C", () => {
    const r = one({ temperatureC: 110, solvents: ether }, { vessel: flask });
    expect(r.cautions.find((c) => c.code === "TL-F02")?.severity).toBe("blocking");
    expect(r.releasable).toBe(false);
  });
  it("is silent at 109 °C", () => {
    const r = one({ temperatureC: 109, solvents: ether }, { vessel: flask });
    expect(codes(r)).not.toContain("TL-F02");
    expect(r.releasable).toBe(true);
  });
});

describe("TL-T01 / TL-T02 equipment limits", () => {
  it("fires above the block maximum (150 °C default) and is silent at it", () => {
    expect(codes(one({ temperatureC: 151 }))).toContain("TL-T01");
    expect(codes(one({ temperatureC: 150 }))).not.toContain("TL-T01");
  });
  it("fires below the cooling minimum (−78 °C default) and is silent at it", () => {
    const thf = [{ name: "THF", volumeFraction: 1 }];
    expect(codes(one({ temperatureC: -79, solvents: thf }))).toContain("TL-T02");
    expect(codes(one({ temperatureC: -78, solvents: thf }))).not.toContain("TL-T02");
  });
});

describe("TL-R01 / TL-R02 / TL-R03 / TL-R04 reactive reagents", () => {
  const thf = [{ name: "THF", volumeFraction: 1 }];
  it("a pyrophoric reagent (H250) gets handling notes and always needs sign-off (TL-S02)", () => {
    const r = one({ temperatureC: -78, solvents: thf, components: [nBuLi] });
    const c = r.cautions.find((x) => x.code === "TL-R01");
    expect(c?.component).toBe(nBuLi.name);
    expect(c?.remedy).toMatch(/never work alone/);
    expect(r.signOffReasons.some((s) => s.startsWith("TL-S02"))).toBe(true);
    expect(r.releasable).toBe(true);
  });
  it("a reagent without H250 or the flag is not treated as pyrophoric", () => {
    const r = one({ solvents: thf, components: [{ name: "bromobenzene", ghs: ["H226", "H315"] }] });
    expect(codes(r)).not.toContain("TL-R01");
    expect(r.signOffRequired).toBe(false);
  });
  it("the pyrophoric flag alone is enough", () => {
    expect(codes(one({ solvents: thf, components: [{ name: "reagent X", ghs: [], pyrophoric: true }] }))).toContain("TL-R01");
  });
  it("a water-reactive reagent (H261) fires TL-R02; one without H260/H261 does not", () => {
    expect(codes(one({ solvents: thf, components: [{ name: "LiHMDS 1 M in THF", ghs: ["H225", "H261", "H314"] }] }))).toContain("TL-R02");
    expect(codes(one({ solvents: thf, components: [{ name: "K3PO4", ghs: ["H315"] }] }))).not.toContain("TL-R02");
  });
  it("second-person rule: fires above the lab's volume threshold summed over the plan, silent at it", () => {
    const ml = DEFAULT_LAB_THRESHOLDS.pyrophoricSecondPersonVolumeMl;
    const runs = (n: number) => Array.from({ length: n }, (_, i) => run({ run: i + 1, temperatureC: -78, solvents: thf, components: [{ ...nBuLi, volumeUl: 1000 }] }));
    const over = plan(runs(ml + 1));
    const c = over.cautions.find((x) => x.code === "TL-R03");
    expect(c?.runs).toEqual(Array.from({ length: ml + 1 }, (_, i) => i + 1));
    expect(codes(plan(runs(ml)))).not.toContain("TL-R03");
  });
  it("a water-reactive reagent with water in the vial blocks release", () => {
    const r = one({ solvents: [{ name: "THF", volumeFraction: 0.9 }, { name: "water", volumeFraction: 0.1 }], components: [nBuLi] });
    expect(r.cautions.find((c) => c.code === "TL-R04")?.severity).toBe("blocking");
    expect(r.releasable).toBe(false);
  });
  it("… and with a protic component (methanol) too", () => {
    const r = one({ solvents: thf, components: [nBuLi, { name: "methanol", ghs: [] }] });
    expect(codes(r)).toContain("TL-R04");
  });
  it("… but not in dry THF", () => {
    expect(codes(one({ solvents: thf, components: [nBuLi] }))).not.toContain("TL-R04");
  });
});

describe("TL-X01 / TL-X02 / TL-X03 peroxide formers", () => {
  // Class B interval 12 months, class A 3 months, unopened 18 months (the record's published source (docs/sources.md),
  // Prudent Practices in the Laboratory, NRC 2011); "now" is 2026-12-01.
  const thfComponent = (over: Partial<Component>): Component => ({ name: "THF", ghs: ["H225", "EUH019"], peroxideClass: "B", ...over });
  const tol = [{ name: "toluene", volumeFraction: 1 }];
  it("fires when the container was opened 13 months ago with no test", () => {
    const r = one({ solvents: tol, components: [thfComponent({ openedOn: "2025-11-01" })] });
    expect(r.cautions.find((c) => c.code === "TL-X01")?.component).toBe("THF");
  });
  it("is silent at 11 months", () => {
    expect(codes(one({ solvents: tol, components: [thfComponent({ openedOn: "2026-01-01" })] }))).not.toContain("TL-X01");
  });
  it("is silent after a recent peroxide test", () => {
    const r = one({ solvents: tol, components: [thfComponent({ openedOn: "2025-01-01", peroxideTestedOn: "2026-11-01" })] });
    expect(codes(r)).not.toContain("TL-X01");
  });
  it("class A uses its 3-month interval: 4 months fires, 2 months is silent", () => {
    const ipe = (openedOn: string): Component => ({ name: "diisopropyl ether", ghs: ["H225", "EUH019"], peroxideClass: "A", openedOn });
    expect(codes(one({ solvents: tol, components: [ipe("2026-08-01")] }))).toContain("TL-X01");
    expect(codes(one({ solvents: tol, components: [ipe("2026-10-01")] }))).not.toContain("TL-X01");
  });
  it("judges each run's container on its own dates (computed in this test: run 1 old container, run 2 new one)", () => {
    const r = plan([
      run({ run: 1, solvents: tol, components: [thfComponent({ openedOn: "2025-11-01" })] }),
      run({ run: 2, solvents: tol, components: [thfComponent({ openedOn: "2026-11-01" })] }),
      run({ run: 3, solvents: tol, components: [thfComponent({ openedOn: "2025-11-01" })] }),
    ]);
    expect(r.cautions.find((c) => c.code === "TL-X01")?.runs).toEqual([1, 3]);
  });
  it("an unopened container uses the 18-month unopened interval: received 19 months ago fires, 17 months is silent", () => {
    expect(codes(one({ solvents: tol, components: [thfComponent({ openedOn: null, receivedOn: "2025-05-01" })] }))).toContain("TL-X01");
    expect(codes(one({ solvents: tol, components: [thfComponent({ openedOn: null, receivedOn: "2025-07-01" })] }))).not.toContain("TL-X01");
  });
  it("a run that concentrates or heats a peroxide former to dryness fires TL-X02; one that does not is silent", () => {
    const c = [thfComponent({ openedOn: "2026-10-01" })];
    expect(codes(one({ solvents: tol, components: c, concentratesOrHeatsToDryness: true }))).toContain("TL-X02");
    expect(codes(one({ solvents: tol, components: c, concentratesOrHeatsToDryness: false }))).not.toContain("TL-X02");
  });
  it("a peroxide-forming solvent with no recorded opening date gets an info note; an unopened one does not", () => {
    expect(one({ solvents: [{ name: "THF", volumeFraction: 1 }] }).cautions.find((c) => c.code === "TL-X03")?.severity).toBe("info");
    expect(codes(one({ solvents: tol, components: [thfComponent({ openedOn: null })] }))).not.toContain("TL-X03");
  });
});

describe("TL-H01 carcinogenic, mutagenic, reprotoxic", () => {
  it("fires for H350 / H340 / H360 (with suffixes, e.g. H360FD of DME from its solvent record)", () => {
    expect(codes(one({ components: [{ name: "reagent C", ghs: ["H350"] }] }))).toContain("TL-H01");
    expect(codes(one({ components: [{ name: "reagent M", ghs: ["H340"] }] }))).toContain("TL-H01");
    expect(one({ solvents: [{ name: "DME", volumeFraction: 1 }] }).cautions.find((c) => c.code === "TL-H01")?.component).toBe("1,2-dimethoxyethane");
  });
  it("is silent for the 'suspected' categories H351, H341, H361", () => {
    expect(codes(one({ components: [{ name: "reagent S", ghs: ["H351", "H341", "H361d"] }] }))).not.toContain("TL-H01");
  });
});

describe("sign-off and release", () => {
  it("TL-S01: a run at the lab's sign-off temperature (default 120 °C) needs sign-off; 119.9 °C does not", () => {
    // DMSO stays far below its boiling point here, so TL-S03 does not interfere.
    expect(one({ temperatureC: 120 }).signOffReasons.some((s) => s.startsWith("TL-S01"))).toBe(true);
    expect(one({ temperatureC: 119.9 }).signOffRequired).toBe(false);
  });
  it("one caution per rule and component lists every run it touches", () => {
    const tol = [{ name: "toluene", volumeFraction: 1 }];
    const r = plan([run({ run: 3, temperatureC: 50, solvents: tol }), run({ run: 1, temperatureC: 60, solvents: tol }), run({ run: 2, temperatureC: 0, solvents: tol })]);
    const f01 = r.cautions.filter((c) => c.code === "TL-F01");
    expect(f01).toHaveLength(1);
    expect(f01[0]?.runs).toEqual([1, 3]);
    expect(f01[0]?.message).toMatch(/Worst case: run 1/);
    expect(r.perRun.map((p) => p.run)).toEqual([3, 1, 2]);
  });
  it("blocking cautions sort first", () => {
    const r = one({ temperatureC: 110, solvents: [{ name: "diethyl ether", volumeFraction: 1 }] }, { vessel: flask });
    expect(r.cautions[0]?.severity).toBe("blocking");
  });
});

describe("invalid plan input", () => {
  it("−300 °C → runs.0.temperatureC", () => {
    expect(invalidPaths(() => one({ temperatureC: -300 }))).toEqual(["runs.0.temperatureC"]);
  });
  it("fractions not summing to 1 → runs.0.solvents", () => {
    expect(invalidPaths(() => one({ solvents: [{ name: "toluene", volumeFraction: 0.7 }] }))).toEqual(["runs.0.solvents"]);
  });
  it("a date that is not ISO → its path", () => {
    expect(invalidPaths(() => one({ components: [{ name: "THF", ghs: [], openedOn: "last spring" }] }))).toEqual(["runs.0.components.0.openedOn"]);
  });
});
