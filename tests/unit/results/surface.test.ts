import { readFileSync } from "node:fs";
import { describe, expect, it } from "vitest";
import { resolveRuns } from "@/lib/chemistry/design-runs";
import { planDocumentSchema } from "@/lib/chemistry/plan-document";
import { pointSafety } from "@/lib/chemistry/point-safety";
import { AppError } from "@/lib/errors/app-error";
import { analyzeSources } from "@/lib/results/analysis";
import type { AnalysisPlanSource } from "@/lib/results/analysis-input";
import { safeEnvelope } from "@/lib/results/envelope";
import { cellKey, type ResultCell } from "@/lib/results/entries";
import { analysisQuerySchema, surfaceQuerySchema } from "@/lib/results/schemas";
import { surfaceOfSources } from "@/lib/results/surface";
import type { StudyResponse } from "@/lib/studies/schemas";

// The demo's Suzuki–Miyaura screen (examples/plan-suzuki.json): 1,4-dioxane/water 8:2 in a
// sealed 4 mL vial rated 10 bar (limit 5 bar at the safety factor 0.5), heating block to 150 °C.
const example = () => JSON.parse(readFileSync("examples/plan-suzuki.json", "utf8")) as { factors: Array<Record<string, unknown>>; design: unknown };

/** A Box–Behnken plan on temperature 90–125 °C, base equivalents and Pd loading with invented yields from a stated model. */
function bbd(): { source: AnalysisPlanSource; document: unknown } {
  const raw = example();
  raw.factors = [{ ...raw.factors[0], low: 90, high: 125 }, raw.factors[1]!, raw.factors[3]!];
  raw.design = { design: "box-behnken", centerPoints: 3, randomize: true, seed: 12 };
  const doc = planDocumentSchema.parse(raw);
  const runs = resolveRuns(doc);
  const results = new Map<string, ResultCell>();
  for (const r of runs) {
    const c = r.coded as Record<string, number>;
    const y = 70 + 4 * c.temperature! + 3 * c.baseEquiv! + 1 * c.pdLoading! - 5 * c.temperature! ** 2 - 3 * c.baseEquiv! ** 2 - 2 * c.pdLoading! ** 2 + (((r.standardOrder * 7) % 5) - 2) * 0.2;
    const imp = 1.6 + 0.5 * c.temperature! - 0.2 * c.pdLoading! + (((r.standardOrder * 3) % 4) - 1.5) * 0.05;
    results.set(cellKey(r.standardOrder, "yield"), { run: r.standardOrder, response: "yield", value: y, failed: false, reason: null });
    results.set(cellKey(r.standardOrder, "impurity"), { run: r.standardOrder, response: "impurity", value: imp, failed: false, reason: null });
  }
  return {
    document: raw,
    source: { id: "plan-1", name: "BBD", factors: doc.factors.map((f) => ({ name: f.name, low: f.low, high: f.high, unit: f.unit })), runs: runs.map((r) => ({ run: r.standardOrder, runOrder: r.runOrder, natural: r.natural })), results, exclusions: [] },
  };
}
const RESPONSES: StudyResponse[] = [
  { name: "yield", unit: "%", goal: "maximize" },
  { name: "impurity", unit: "area %", goal: "minimize", low: 0.5, high: 3 },
];
const issuesOf = (fn: () => unknown) => {
  try {
    fn();
  } catch (e) {
    if (e instanceof AppError) return e.issues.map((i) => i.path);
    throw e;
  }
  return [];
};

describe("the safe envelope: blocking cautions and the lab's limits", () => {
  const env = safeEnvelope(example());
  const at = (temperature: number, waterFraction: number) => env.check({ temperature, baseEquiv: 2.25, boronicEquiv: 1.3, pdLoading: 1.25, waterFraction }).blocking.map((c) => c.code);
  it("fires TL-F02 from 130 °C: within 50 °C of 1,4-dioxane's autoignition temperature, 180 °C (REFERENCE.md §3)", () => {
    expect(at(129, 0.2)).toEqual([]);
    expect(at(131, 0.2)).toContain("TL-F02");
    expect(env.kindOf("TL-F02")).toBe("caution");
  });
  it("counts the heating block's 150 °C maximum (the plan's equipment) as a limit of the lab", () => {
    expect(at(151, 0.2)).toContain("TL-T01");
    expect(at(149, 0.2)).not.toContain("TL-T01");
    expect(env.kindOf("TL-T01")).toBe("limit");
  });
  it("does not count a stock above its solubility (the planner weighs the solid into each vial instead)", () => {
    const raw = pointSafety(example())({ temperature: 80, baseEquiv: 2.25, boronicEquiv: 1.3, pdLoading: 1.25, waterFraction: 0.1 });
    expect(raw.limits.map((l) => l.code)).toEqual(["stock_solubility"]);
    expect(at(80, 0.1)).toEqual([]);
  });
});

describe("the surface of an analysis", () => {
  const { source, document } = bbd();
  const envelope = { plan: { id: "plan-1", name: "BBD" }, document };
  const q = (o: Record<string, string>) => surfaceQuerySchema.parse({ model: "quadratic", ...o });

  it("draws the two strongest factors by default, the others at their centre; the runs on the slice are the Box–Behnken runs with Pd loading at its centre (4 edge runs + 3 centre runs; Box & Behnken 1960)", () => {
    const s = surfaceOfSources([source], RESPONSES, q({}), envelope);
    expect([s.x, s.y]).toEqual(["temperature", "baseEquiv"]);
    expect(s.grid.fixed).toEqual({ pdLoading: 1.25 });
    expect(s.points).toHaveLength(15);
    expect(s.points.filter((p) => p.onSlice)).toHaveLength(7);
    // Inside the studied range (90–125 °C) nothing blocks.
    expect(s.envelope.checked).toBe(true);
    expect(s.envelope.findings).toEqual([]);
    expect(s.extrapolated.rings).toEqual([]);
  });
  it("extended to 170 °C: TL-F02 covers the columns from 130 °C, TL-V02 and the block's limit further on, each labelled inside its own region", () => {
    const s = surfaceOfSources([source], RESPONSES, q({ x: "temperature", y: "baseEquiv", xRange: "90,170", steps: "41" }), envelope);
    // 41 columns 2 °C apart: 130, 132, …, 170 °C are 21 of them (REFERENCE.md §3: 180 − 50 = 130 °C).
    const f02 = s.envelope.findings.find((f) => f.code === "TL-F02")!;
    expect(f02.kind).toBe("caution");
    expect(f02.share).toBeCloseTo(21 / 41, 12);
    expect(f02.title).toBe("Near the autoignition temperature");
    const t01 = s.envelope.findings.find((f) => f.code === "TL-T01")!;
    expect(t01.kind).toBe("limit");
    expect(t01.share).toBeCloseTo(10 / 41, 12); // 152 … 170 °C
    const v02 = s.envelope.findings.find((f) => f.code === "TL-V02")!;
    for (const f of [f02, t01, v02]) {
      const i = s.grid.xNatural.indexOf(f.label![0]);
      const j = s.grid.yNatural.indexOf(f.label![1]);
      expect(s.grid.blocked![j]![i]).toContain(f.index);
    }
    // Labelled apart: F02 where it fires alone (below the pressure limit), the block's limit past 150 °C.
    expect(f02.label![0]).toBeLessThan(v02.label![0]);
    expect(t01.label![0]).toBeGreaterThan(150);
    expect(s.envelope.cautions.rings.length).toBeGreaterThan(0);
    expect(s.envelope.limits.rings.length).toBeGreaterThan(0);
    expect(s.extrapolated.rings.length).toBeGreaterThan(0);
    // The extrapolated region (past the runs, 125 °C) is labelled where nothing blocks yet: below 130 °C.
    const [ex, ey] = s.extrapolated.label!;
    expect(s.grid.blocked![s.grid.yNatural.indexOf(ey)]![s.grid.xNatural.indexOf(ex)]).toEqual([]);
    expect(ex).toBeGreaterThan(125);
    expect(ex).toBeLessThan(130);
  });
  it("holds a factor where the slider sets it, and says which runs lie on that slice", () => {
    const s = surfaceOfSources([source], RESPONSES, q({ x: "temperature", y: "pdLoading", hold: "baseEquiv:3" }), envelope);
    expect(s.grid.fixed).toEqual({ baseEquiv: 3 });
    expect(s.points.filter((p) => p.onSlice).map((p) => p.run).length).toBe(4); // the runs with base at its high level
  });
  it("refuses bad axes and sliders at the query's own parameters", () => {
    expect(issuesOf(() => surfaceOfSources([source], RESPONSES, q({ x: "pressure" }), envelope))).toEqual(["x"]);
    expect(issuesOf(() => surfaceOfSources([source], RESPONSES, q({ x: "temperature", y: "temperature" }), envelope))).toEqual(["y"]);
    expect(issuesOf(() => surfaceOfSources([source], RESPONSES, q({ hold: "catalyst:2" }), envelope))).toEqual(["hold.catalyst"]);
    expect(surfaceQuerySchema.safeParse({ xRange: "5,1" }).error?.issues[0]?.path).toEqual(["xRange"]);
    expect(surfaceQuerySchema.safeParse({ hold: "pdLoading:abc" }).error?.issues[0]?.path).toEqual(["hold", "pdLoading"]);
    expect(surfaceQuerySchema.safeParse({ steps: "1000" }).error?.issues[0]?.path).toEqual(["steps"]);
  });
});

describe("the optimum of an analysis: region, envelope, desirability", () => {
  const { source, document } = bbd();
  const envelope = { plan: { id: "plan-1", name: "BBD" }, document };
  it("in the design's sphere: a Box–Behnken design's points lie at √2 coded from the centre (Box & Behnken 1960)", () => {
    const a = analyzeSources([source], RESPONSES, analysisQuerySchema.parse({ model: "quadratic", region: "sphere" }), envelope);
    expect(a.optimum!.region).toBe("sphere");
    expect(a.optimum!.radius).toBeCloseTo(Math.SQRT2, 12);
    expect(a.analysis.region).toBe("sphere");
    expect(a.analysis.desirability).toBeNull();
  });
  it("two responses through their desirability: the study's bounds for impurity, the observed range for yield", () => {
    const a = analyzeSources([source], RESPONSES, analysisQuerySchema.parse({ model: "quadratic", combine: "impurity" }), envelope);
    const d = a.analysis.desirability!;
    expect(d.map((x) => [x.name, x.bounds])).toEqual([["yield", "observed"], ["impurity", "study"]]);
    const yields = [...source.results.values()].filter((c) => c.response === "yield").map((c) => c.value!);
    expect(d[0]!.low).toBe(Math.min(...yields));
    expect(d[0]!.high).toBe(Math.max(...yields));
    expect(a.optimum!.responses!.map((r) => r.name)).toEqual(["yield", "impurity"]);
    // D is the geometric mean of the two (Derringer & Suich 1980).
    const [d1, d2] = a.optimum!.responses!.map((r) => r.desirability);
    expect(a.optimum!.desirability).toBeCloseTo(Math.sqrt(d1! * d2!), 12);
    expect(safeEnvelope(document).check(a.optimum!.natural).blocking).toEqual([]);
  });
  it("refuses an unknown response to combine at `combine`", () => {
    expect(issuesOf(() => analyzeSources([source], RESPONSES, analysisQuerySchema.parse({ combine: "purity" }), envelope))).toEqual(["combine"]);
  });
});
