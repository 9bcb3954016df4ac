/**
 * Safe design for a plan document (lib/plans/safe-design.ts): the runs that block are
 * named with what blocks them, the alternatives come from the design engine with the
 * hazard engine as the verdict, and an applied alternative that says nothing blocks is a
 * plan in which the full pipeline (`planReport`: validation, run sheet, dispensing,
 * caution rules) finds no blocking run.
 *
 * Plans: the demo's Suzuki–Miyaura screen (examples/plan-suzuki.json, 1,4-dioxane/water)
 * and a THF-type plan written here (an invented SNAr of an aryl fluoride with an amine in
 * tetrahydrofuran, sealed vials), with random factor boxes and random designs.
 */
import { readFileSync } from "node:fs";
import seedrandom from "seedrandom";
import { describe, expect, it } from "vitest";
import { AppError } from "@/lib/errors/app-error";
import type { PlanDocumentInput } from "@/lib/chemistry/plan-document";
import { planReport } from "@/lib/chemistry/plan-report";
import { pointSafety } from "@/lib/chemistry/point-safety";
import { ALTERNATIVE_KINDS } from "@/lib/doe";
import { QUICK_ALTERNATIVES, safeDesign, safeDesignRequestSchema, type SafeDesignAlternative, type SafeDesignReport } from "@/lib/plans/safe-design";

type Doc = Record<string, unknown> & { recipe: Record<string, unknown> & { components: Array<Record<string, unknown>> }; factors: Array<Record<string, unknown>>; design: Record<string, unknown> };

const suzuki = (): Doc => JSON.parse(readFileSync(new URL("../../../examples/plan-suzuki.json", import.meta.url), "utf8")) as Doc;

/** The Suzuki screen on three factors with a rotatable CCD, temperature 80–120 °C, and soluble enough stocks. */
function suzukiCcd(): Doc {
  const d = suzuki();
  d.factors = d.factors.slice(0, 3);
  d.factors[0] = { ...d.factors[0], low: 80, high: 120 };
  d.recipe.components[1]!.solubilityMgPerMl = 200;
  d.design = { design: "central-composite", alpha: "rotatable", centerPoints: 3, seed: 7 };
  return d;
}

/** An invented THF-type plan: an SNAr of an aryl fluoride with a secondary amine and a tertiary-amine base in THF, sealed vials. */
function thfPlan(): Doc {
  return {
    name: "THF-type test plan (invented)",
    recipe: {
      limitingReagent: "arF",
      scaleMmol: 1,
      concentrationM: 0.4,
      temperatureC: 25,
      timeH: 4,
      components: [
        { id: "arF", name: "activated aryl fluoride", role: "reagent", formula: "C6H4FNO2", form: { state: "solid", purityWtPercent: 99 }, solubilityMgPerMl: 400 },
        { id: "amine", name: "cyclic secondary amine", role: "reagent", formula: "C4H9NO", equivalents: 1.5, form: { state: "liquid", densityGPerMl: 1.0 } },
        { id: "base", name: "tertiary amine base", role: "reagent", formula: "C8H19N", equivalents: 2, form: { state: "liquid", densityGPerMl: 0.742 } },
      ],
      solvents: [{ name: "tetrahydrofuran", volumeFraction: 1, openedOn: "2026-11-01", peroxideTestedOn: "2026-11-01" }],
    },
    factors: [
      { name: "temperature", low: 40, high: 90, unit: "degC", binding: { kind: "temperature" } },
      { name: "amineEquiv", low: 1.1, high: 2, unit: "equiv", binding: { kind: "equivalents", component: "amine" } },
      { name: "conc", low: 0.3, high: 0.5, unit: "M", binding: { kind: "concentration", hold: "scale" } },
    ],
    design: { design: "central-composite", alpha: "rotatable", centerPoints: 2, seed: 3 },
    vessel: "vial-microwave-crimp-2-5ml",
    thresholds: {},
    equipment: { blockMaxC: 150, coolingMinC: -78 },
    dispensing: { minPipetteVolumeUl: 10, overagePercent: 10, deadVolumeUl: 50, minWeighMassMg: 8.2, maxStockVolumeMl: 50 },
    now: "2026-12-01",
  };
}

const report = (d: Doc, kinds?: (typeof ALTERNATIVE_KINDS)[number][]) => safeDesign({ sent: d, evaluated: d as unknown as PlanDocumentInput }, kinds ? { kinds } : {});
const byKind = (r: SafeDesignReport, kind: SafeDesignAlternative["kind"]) => {
  const a = r.alternatives.find((x) => x.kind === kind);
  if (!a) throw new Error(`${kind} missing`);
  return a;
};

/** The runs the full pipeline finds blocking (run numbers), or the reason it refuses the plan. */
function pipelineBlocking(doc: unknown): { runs: number[]; refused: string | null; limits: number[] } {
  try {
    const r = planReport(doc);
    const runs = new Set<number>();
    const limits = new Set<number>();
    for (const c of r.cautions) {
      if (c.severity === "blocking") c.runs.forEach((n) => runs.add(n));
      if (c.code === "TL-T01" || c.code === "TL-T02") c.runs.forEach((n) => limits.add(n));
    }
    return { runs: [...runs].sort((a, b) => a - b), refused: null, limits: [...limits] };
  } catch (e) {
    if (!(e instanceof AppError)) throw e;
    return { runs: [], refused: `${e.code}: ${e.message}`, limits: [] };
  }
}

describe("safe design of the Suzuki screen as a rotatable CCD, temperature 80–120 °C", () => {
  const doc = suzukiCcd();
  const r = report(doc);

  it("names the +α temperature run, its run order, the caution and the factor values", () => {
    // +α = 100 + 1.68179·20 = 133.6 °C (α = 8^¼, NIST/SEMATECH e-Handbook §5.3.3.6.1), within the
    // lab's 50 °C margin of 1,4-dioxane's autoignition temperature, 180 °C (REFERENCE.md §3, from
    // memory): TL-F02 blocks. In standard order it is run 10 (8 factorial runs, then −α, +α on the first factor).
    expect(r.blockingRuns.map((b) => b.standardOrder)).toEqual([10]);
    const b = r.blockingRuns[0]!;
    expect(b.kind).toBe("axial");
    expect(b.natural.temperature).toBeCloseTo(100 + Math.pow(8, 0.25) * 20, 9);
    expect(b.findings.map((f) => `${f.severity}:${f.code}`)).toEqual(["blocking:TL-F02"]);
    expect(b.findings[0]!.message).toMatch(/autoignition/);
    // The run order is the plan's own: the run sheet of the same document lists run 10 with it.
    const sheet = planReport(doc);
    expect(sheet.runs.find((x) => x.run === 10)!.runOrder).toBe(b.runOrder);
    expect(sheet.cautions.filter((c) => c.severity === "blocking").flatMap((c) => c.runs)).toEqual([10]);
  });

  it("offers the five alternatives, each clear of blocking runs, with what changes", () => {
    expect(r.alternatives.map((a) => a.kind)).toEqual([...ALTERNATIVE_KINDS]);
    for (const a of r.alternatives) {
      expect(a.available, a.kind).toBe(true);
      expect(a.runCount, a.kind).toBe(17); // F + 2k + n0 = 8 + 6 + 3 (REFERENCE.md §6)
      expect(a.nothingBlocks, a.kind).toBe(true);
      expect(a.changes.length, a.kind).toBeGreaterThan(0);
    }
    expect(byKind(r, "face-centered").changes).toEqual(["α 1.682 → 1"]);
  });

  it("the smaller α stops below (130 − 100)/20 = 1.5 (by hand): at exactly 130 °C TL-F02 fires", () => {
    const a = byKind(r, "smaller-alpha");
    const alpha = (a.document!.design as { alpha: number }).alpha;
    expect(alpha).toBeLessThan(1.5);
    expect(alpha).toBeGreaterThan(1.499);
    expect(a.changes).toEqual(["α 1.682 → 1.5"]);
  });

  it("the narrower range lowers only the temperature's high limit (by hand: 117.28 °C) and keeps the rest of the document", () => {
    // +α run (80 + h)/2 + α(h − 80)/2 < 130 → h < (180 + 80α)/(1 + α) = 117.29…, rounded inward to 0.01.
    const a = byKind(r, "narrower-range");
    const h = (180 + 80 * Math.pow(8, 0.25)) / (1 + Math.pow(8, 0.25));
    const applied = a.document as Doc;
    expect(applied.factors[0]).toEqual({ ...doc.factors[0], high: Math.floor(h * 100) / 100 });
    expect(applied.factors.slice(1)).toEqual(doc.factors.slice(1));
    expect(applied.recipe).toEqual(doc.recipe);
    expect(applied.vessel).toEqual(doc.vessel);
    expect(a.changes).toEqual([`temperature 80–120 → 80–${Math.floor(h * 100) / 100} °C`]);
    // Runs are grouped by temperature as before: the applied design does not spell out the default.
    expect(applied.design.hardToChange).toBeUndefined();
  });

  it("the D-optimal candidates are filtered by the hazard engine itself: a lab's wider autoignition margin removes more", () => {
    const a = byKind(r, "d-optimal");
    const candidates = (a.document!.design as { candidates: Array<Record<string, number>> }).candidates;
    const at = pointSafety(doc);
    expect(candidates.every((c) => at(c).blocking.length === 0)).toBe(true);
    expect(candidates.every((c) => c.temperature! < 130)).toBe(true);
    // With the lab's margin at 65 °C the limit is 180 − 65 = 115 °C: the grid's 120 °C level goes
    // too, which a filter written as "temperature < 130" would keep.
    const strict = { ...suzukiCcd(), thresholds: { autoignitionMarginC: 65 } };
    const s = byKind(report(strict, ["d-optimal"]), "d-optimal");
    const kept = (s.document!.design as { candidates: Array<Record<string, number>> }).candidates;
    expect(kept.length).toBeGreaterThan(0);
    expect(kept.every((c) => c.temperature! < 115)).toBe(true);
    expect(candidates.some((c) => c.temperature === 120)).toBe(true);
    expect(kept.length).toBeLessThan(candidates.length);
  });

  it("computes only the alternatives asked for and says which it left out", () => {
    // The panel's quick set is every kind but the D-optimal search (one list, checked here against the engine's).
    expect(QUICK_ALTERNATIVES).toEqual(ALTERNATIVE_KINDS.filter((k) => k !== "d-optimal"));
    const quick = report(doc, ["face-centered", "smaller-alpha"]);
    expect(quick.alternatives.map((a) => a.kind)).toEqual(["face-centered", "smaller-alpha"]);
    expect(quick.notComputed).toEqual(["inscribed", "narrower-range", "d-optimal"]);
    expect(quick.blockingRuns).toEqual(r.blockingRuns);
  });

  it("offers nothing when no run blocks, and only names the runs of a design given as a list", () => {
    const safe = { ...suzukiCcd(), factors: suzukiCcd().factors.map((f, i) => (i === 0 ? { ...f, low: 60, high: 90 } : f)) };
    const none = report(safe);
    expect(none.blockingRuns).toEqual([]);
    expect(none.alternatives).toEqual([]);
    const listed = { ...doc, design: { runs: [{ standardOrder: 1, natural: { temperature: 135, baseEquiv: 2, boronicEquiv: 1.3 } }, { standardOrder: 2, natural: { temperature: 90, baseEquiv: 2, boronicEquiv: 1.3 } }] } };
    const l = report(listed);
    expect(l.blockingRuns.map((b) => b.run)).toEqual([1]);
    expect(l.alternatives).toEqual([]);
    expect(l.note).toMatch(/list of runs/);
  });

  it("reports a document the engines refuse at its path", () => {
    const bad = { ...doc, factors: [{ ...doc.factors[0], binding: { kind: "equivalents", component: "nope" } }, ...doc.factors.slice(1)] };
    try {
      report(bad);
      throw new Error("expected a refusal");
    } catch (e) {
      expect(e).toBeInstanceOf(AppError);
      expect((e as AppError).issues.map((i) => i.path)).toContain("factors.0.binding.component");
    }
    expect(safeDesignRequestSchema.safeParse({ document: doc, kinds: ["wider"] }).success).toBe(false);
  });
});

describe("the THF-type plan: pressure in sealed vials", () => {
  it("names runs over the vial's pressure limit (TL-V02) and the applied alternatives clear them", () => {
    // THF boils at 66 °C (REFERENCE.md §3); in the screw-cap vial (3 bar × the lab's 0.5 = 1.5 bar
    // absolute, REFERENCE.md §2 [M]/[CP]) vapour plus heated air passes 1.5 bar well below 90 °C.
    const d = { ...thfPlan(), vessel: "vial-4ml-screw-septum", recipe: { ...thfPlan().recipe, scaleMmol: 0.5 } };
    d.factors[0] = { ...d.factors[0], low: 20, high: 60 };
    d.factors[2] = { ...d.factors[2], low: 0.35, high: 0.5 };
    const r = report(d);
    expect(r.blockingRuns.length).toBeGreaterThan(0);
    expect(r.blockingRuns.every((b) => b.findings.some((f) => f.code === "TL-V02"))).toBe(true);
    const pipe = pipelineBlocking(d);
    expect(pipe.refused).toBeNull();
    expect(r.blockingRuns.map((b) => b.run).filter((n) => pipe.runs.includes(n))).toEqual(pipe.runs);
    for (const a of r.alternatives.filter((x) => x.nothingBlocks)) expect(pipelineBlocking(a.document).runs, a.kind).toEqual([]);
  });
});

/** A random design spec for k factors. */
function randomDesign(k: number, rng: () => number): Record<string, unknown> {
  const pick = <T,>(xs: readonly T[]): T => xs[Math.floor(rng() * xs.length)]!;
  const seed = Math.floor(rng() * 1e6);
  const kinds = ["central-composite", "central-composite", "full-factorial", ...(k >= 3 ? ["box-behnken"] : []), ...(k >= 4 ? ["fractional-factorial"] : []), "d-optimal"];
  const kind = pick(kinds);
  if (kind === "central-composite") return { design: kind, alpha: pick(["rotatable", "spherical", 1.3, 1.9]), placement: pick(["circumscribed", "circumscribed", "inscribed"]), centerPoints: pick([1, 2, 3]), seed };
  if (kind === "box-behnken") return { design: kind, centerPoints: pick([1, 3]), seed };
  if (kind === "full-factorial") return { design: kind, centerPoints: pick([0, 2]), seed };
  if (kind === "fractional-factorial") return { design: kind, centerPoints: 2, seed };
  return { design: kind, model: "quadratic", runs: (k + 1) * (k + 2) / 2 + 3, seed };
}

const u = (rng: () => number, lo: number, hi: number) => lo + (hi - lo) * rng();

/** The Suzuki screen with 2–4 random factors over random boxes. */
function randomSuzuki(rng: () => number): Doc {
  const d = suzuki();
  d.recipe.components[1]!.solubilityMgPerMl = u(rng, 60, 300);
  const t0 = u(rng, 50, 110);
  const boxes: Record<string, [number, number]> = {
    temperature: [t0, t0 + u(rng, 10, 50)],
    baseEquiv: [u(rng, 1, 2), u(rng, 2.2, 4)],
    boronicEquiv: [u(rng, 1, 1.3), u(rng, 1.4, 2)],
    pdLoading: [u(rng, 0.2, 1), u(rng, 1.2, 4)],
    waterFraction: [u(rng, 0.03, 0.15), u(rng, 0.2, 0.45)],
  };
  const k = 2 + Math.floor(rng() * 3);
  const chosen = [0, ...[1, 2, 3, 4].sort(() => rng() - 0.5).slice(0, k - 1)].sort();
  d.factors = chosen.map((i) => {
    const f = d.factors[i]!;
    const [low, high] = boxes[f.name as string]!;
    return { ...f, low: Number(low.toFixed(3)), high: Number(high.toFixed(3)) };
  });
  d.design = randomDesign(k, rng);
  return d;
}

/** The THF-type plan over random boxes, in either vial. */
function randomThf(rng: () => number): Doc {
  const d = thfPlan();
  d.vessel = rng() < 0.5 ? "vial-4ml-screw-septum" : "vial-microwave-crimp-2-5ml";
  d.recipe = { ...d.recipe, scaleMmol: d.vessel === "vial-4ml-screw-septum" ? u(rng, 0.2, 0.6) : u(rng, 0.8, 1.6) };
  const t0 = u(rng, 20, 120);
  const boxes: Array<[number, number]> = [
    [t0, t0 + u(rng, 10, 60)],
    [u(rng, 1, 1.4), u(rng, 1.6, 3)],
    [u(rng, 0.15, 0.35), u(rng, 0.4, 0.8)],
  ];
  const k = 2 + Math.floor(rng() * 2);
  d.factors = d.factors.slice(0, k).map((f, i) => ({ ...f, low: Number(boxes[i]![0].toFixed(3)), high: Number(boxes[i]![1].toFixed(3)) }));
  d.design = randomDesign(k, rng);
  return d;
}

describe("property: an applied alternative that says nothing blocks has no run the full pipeline finds blocking (and one that still blocks names every such run)", () => {
  // A few seconds alone (the D-optimal searches dominate); allow for a loaded machine.
  it("over 36 random plans (Suzuki-type and THF-type, random boxes and designs)", { timeout: 240_000 }, () => {
    const rng = seedrandom("tareline-safe-design-1");
    let withBlocking = 0;
    let applied = 0;
    const kindsSeen = new Set<string>();
    for (let n = 0; n < 36; n++) {
      const doc = n % 2 === 0 ? randomSuzuki(rng) : randomThf(rng);
      const where = `case ${n}: ${JSON.stringify({ factors: doc.factors.map((f) => [f.name, f.low, f.high]), design: doc.design, vessel: doc.vessel })}`;
      let r: SafeDesignReport;
      try {
        r = report(doc);
      } catch (e) {
        // A random box the engines refuse outright (a design the engine cannot build for it): not a case.
        if (e instanceof AppError && e.code === "invalid_input") continue;
        throw e;
      }
      // Every run the pipeline finds blocking is named (the pipeline may refuse a whole plan whose runs leave a limit).
      const pipe = pipelineBlocking(doc);
      const named = new Set(r.blockingRuns.map((b) => b.run));
      expect(pipe.runs.filter((x) => !named.has(x)), where).toEqual([]);
      if (r.blockingRuns.length === 0) continue;
      withBlocking++;
      for (const a of r.alternatives) {
        if (!a.available) continue;
        if (!a.nothingBlocks) {
          // One that says it still blocks names every run the pipeline blocks once it is applied.
          const still = pipelineBlocking(a.document);
          if (still.refused === null) expect(still.runs.filter((x) => !a.stillBlocking.includes(x)), `${where} → ${a.kind}: still blocking`).toEqual([]);
          continue;
        }
        applied++;
        kindsSeen.add(a.kind);
        const after = pipelineBlocking(a.document);
        expect(after.refused, `${where} → ${a.kind}`).toBeNull();
        expect(after.runs, `${where} → ${a.kind}`).toEqual([]);
        expect(after.limits, `${where} → ${a.kind}: a run outside the block's range`).toEqual([]);
        expect(planReport(a.document).runs.length, `${where} → ${a.kind}`).toBe(a.runCount);
      }
    }
    // The property is exercised: plans with blocking runs, and alternatives of several kinds applied.
    expect(withBlocking).toBeGreaterThan(10);
    expect(applied).toBeGreaterThan(20);
    expect(kindsSeen.size).toBeGreaterThanOrEqual(4);
  });
});
