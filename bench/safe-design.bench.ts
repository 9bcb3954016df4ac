/**
 * Safe design for a plan (lib/plans/safe-design.ts `safeDesign`, what POST /plans/alternatives
 * computes after reading the lab's settings and inventory): the time per plan type, for the
 * quick alternatives the editor asks for first (face-centred, inscribed, smaller α, narrower
 * range) and for the D-optimal one it asks for on its own (a search over the candidate grid
 * with every blocked candidate removed by the hazard engine). The plans are the demo's
 * Suzuki–Miyaura screen (examples/plan-suzuki.json) with temperature 80–120 °C (the
 * Box–Behnken plan to 135 °C), so the hottest runs come within the lab's margin of
 * 1,4-dioxane's autoignition temperature.
 * Targets are Tareline's own: the quick set within an editor's debounce (300 ms), the
 * D-optimal one within the D-optimal engine's 2 s.
 */
import { readFileSync } from "node:fs";
import { fileURLToPath } from "node:url";
import type { BenchCase } from "./harness";
import type { PlanDocumentInput } from "../lib/chemistry/plan-document";
import { QUICK_ALTERNATIVES, safeDesign, type SafeDesignReport } from "../lib/plans/safe-design";

type Doc = Record<string, unknown> & { factors: Array<Record<string, unknown>>; recipe: { components: Array<Record<string, unknown>> } };
const example = (): Doc => JSON.parse(readFileSync(fileURLToPath(new URL("../examples/plan-suzuki.json", import.meta.url)), "utf8")) as Doc;

/** The screen on its first k factors (k = 6 adds concentration), temperature 80–120 °C (or `high`), with `design`. */
function plan(k: number, design: Record<string, unknown>, high = 120): Doc {
  const d = example();
  d.recipe.components[1]!.solubilityMgPerMl = 300;
  if (k === 6) d.factors.push({ name: "conc", low: 0.18, high: 0.22, unit: "M", binding: { kind: "concentration", hold: "scale" } });
  d.factors = d.factors.slice(0, k).map((f, i) => (i === 0 ? { ...f, low: 80, high } : f));
  d.design = design;
  return d;
}

const ccd = { design: "central-composite", alpha: "rotatable", centerPoints: 3, seed: 7 };
const PLANS: Array<[string, Doc]> = [
  ["3-factor rotatable CCD, 17 runs", plan(3, ccd)],
  ["5-factor rotatable CCD, 45 runs", plan(5, ccd)],
  ["6-factor rotatable CCD, 79 runs", plan(6, ccd)],
  ["3-factor Box–Behnken to 135 °C, 15 runs", plan(3, { design: "box-behnken", centerPoints: 3, seed: 7 }, 135)],
  ["2^(5−1) + 2 centre points, 18 runs", plan(5, { design: "fractional-factorial", centerPoints: 2, seed: 7 })],
];

const run = (d: Doc, kinds: readonly (typeof QUICK_ALTERNATIVES)[number][] | ["d-optimal"]) => safeDesign({ sent: d, evaluated: d as unknown as PlanDocumentInput }, { kinds });
const describe = (r: SafeDesignReport) => [`${r.blockingRuns.length} of ${r.runCount} runs block; ` + r.alternatives.map((a) => `${a.kind} ${a.available ? `${a.nothingBlocks ? "clear" : "still blocks"}${a.dEfficiency === null ? "" : `, D-eff ${(100 * a.dEfficiency).toFixed(0)} %`}` : `n/a (${a.summary})`}`).join("; ")];

export const cases: BenchCase[] = PLANS.flatMap(([label, doc]): BenchCase[] => [
  {
    name: `safe design: ${label}, quick alternatives`,
    targetMs: 300,
    repeat: 5,
    warmup: 1,
    run: () => run(doc, QUICK_ALTERNATIVES),
    note: () => describe(run(doc, QUICK_ALTERNATIVES)),
  },
  {
    name: `safe design: ${label}, D-optimal alternative`,
    targetMs: 2000,
    repeat: 3,
    warmup: 1,
    run: () => run(doc, ["d-optimal"]),
    note: () => describe(run(doc, ["d-optimal"])),
  },
]);
