/**
 * The confirmation runs of a plan judged in its analysis, pure: for each confirmation plan
 * derived from it, the runs' observed results against the prediction of the model the
 * analysis shows, with the 95 % prediction interval of one run and the interval for the
 * mean of the runs that have a result — and whether the confirmation holds (lib/surface
 * `confirmationHolds`: the observed mean inside the interval for the mean of that many new
 * runs). Runs at different points (a confirmation plan edited after it was made) are judged
 * point by point.
 */
import { codeValue } from "../doe/factors";
import type { PlanState } from "../plans/states";
import type { FittedModel } from "../stats/fitted-model";
import { confirmationHolds, predictMeanOf, type ConfirmationVerdict } from "../surface/confirmation";
import type { ConfirmationDetails, DerivedAnalysis } from "./confirmation-plan";
import { cellKey, type ResultCell } from "./entries";
import type { AnalysisQuery } from "./schemas";

/** A confirmation plan as its source's analysis reads it. */
export interface ConfirmationSource {
  plan: { id: string; name: string; state: PlanState };
  /** What it was derived with (null when the details are missing). */
  details: ConfirmationDetails | null;
  runs: { run: number; natural: Record<string, number> }[];
  /** Its stored results, by `cellKey(run, response)`. */
  results: ReadonlyMap<string, ResultCell>;
}

/** One confirmation point of a confirmation plan, judged. */
export interface ConfirmationCheck {
  plan: { id: string; name: string; state: PlanState };
  /** The analysis the runs were planned from, null when unknown. */
  plannedWith: DerivedAnalysis | null;
  /** The analysis shown is the one the runs were planned from (response, model, pruning, transform, region, responses combined). */
  sameAnalysis: boolean;
  point: { natural: Record<string, number>; coded: Record<string, number> };
  runs: { run: number; status: "result" | "failed" | "missing"; observed: number | null }[];
  /** The prediction of the model shown (null when the runs cannot be judged), and the 95 % prediction interval of one new run. */
  predicted: number | null;
  pi95: [number, number] | null;
  /** The interval for the mean of the runs with a result (of all the runs while none has one). */
  meanInterval95: [number, number] | null;
  /** Null until a run has a result. */
  verdict: ConfirmationVerdict | null;
  /** What to say besides the verdict (waiting for results, planned from another analysis). */
  note: string | null;
}

const sameModel = (a: DerivedAnalysis["model"], b: AnalysisQuery["model"]) => (Array.isArray(a) && Array.isArray(b) ? a.join(",") === b.join(",") : a === b);

/**
 * Judges every confirmation plan's runs for `response` against `model` (the analysis shown).
 * A plan whose runs lack a factor of the model is reported with a note and no verdict.
 * Example: confirmationChecks(model, "yield", query, [source])[0].verdict?.holds
 */
export function confirmationChecks(model: FittedModel, response: string, query: AnalysisQuery, sources: readonly ConfirmationSource[]): ConfirmationCheck[] {
  const out: ConfirmationCheck[] = [];
  for (const s of sources) {
    const plannedWith = s.details?.analysis ?? null;
    const same =
      plannedWith !== null &&
      plannedWith.response === response &&
      sameModel(plannedWith.model, query.model) &&
      plannedWith.alpha === (query.alpha ?? null) &&
      plannedWith.hierarchy === query.hierarchy &&
      plannedWith.transform === query.transform &&
      (plannedWith.region ?? "cube") === query.region &&
      (plannedWith.combine ?? []).join(",") === query.combine.join(",");
    const groups = new Map<string, { natural: Record<string, number>; runs: ConfirmationSource["runs"] }>();
    let missingFactor: string | null = null;
    for (const r of [...s.runs].sort((a, b) => a.run - b.run)) {
      const absent = model.factors.find((f) => r.natural[f.name] === undefined);
      if (absent) {
        missingFactor = absent.name;
        break;
      }
      const natural = Object.fromEntries(model.factors.map((f) => [f.name, r.natural[f.name]!]));
      const key = model.factors.map((f) => natural[f.name]).join("|");
      const g = groups.get(key) ?? { natural, runs: [] };
      g.runs.push(r);
      groups.set(key, g);
    }
    if (missingFactor !== null) {
      out.push({
        plan: s.plan,
        plannedWith,
        sameAnalysis: same,
        point: { natural: {}, coded: {} },
        runs: [],
        predicted: null,
        pi95: null,
        meanInterval95: null,
        verdict: null,
        note: `Its runs do not set ${missingFactor}, a factor of this analysis, so they cannot be judged here.`,
      });
      continue;
    }
    for (const g of groups.values()) {
      const x = model.factors.map((f) => codeValue(f, g.natural[f.name]!));
      const coded = Object.fromEntries(model.factors.map((f, i) => [f.name, x[i]!]));
      const runs = g.runs.map((r) => {
        const cell = s.results.get(cellKey(r.run, response));
        if (cell?.failed) return { run: r.run, status: "failed" as const, observed: null };
        if (!cell || cell.value === null) return { run: r.run, status: "missing" as const, observed: null };
        return { run: r.run, status: "result" as const, observed: cell.value };
      });
      const observed = runs.flatMap((r) => (r.observed === null ? [] : [r.observed]));
      const single = predictMeanOf(model, x, 1);
      const mean = predictMeanOf(model, x, Math.max(1, observed.length || runs.length));
      const verdict = observed.length > 0 ? confirmationHolds(model, coded, observed) : null;
      const notes: string[] = [];
      if (observed.length === 0) notes.push(`Waiting for results: ${runs.length} run${runs.length === 1 ? "" : "s"} planned, none with a ${response} result yet.`);
      else if (observed.length < runs.length) notes.push(`${observed.length} of ${runs.length} runs have a ${response} result; the verdict uses those.`);
      if (plannedWith && !same) notes.push(`Planned from the ${plannedWith.response} analysis with ${describeModel(plannedWith)}; judged here against the model shown.`);
      out.push({ plan: s.plan, plannedWith, sameAnalysis: same, point: { natural: g.natural, coded }, runs, predicted: single.predicted, pi95: single.interval95, meanInterval95: mean.interval95, verdict, note: notes.length ? notes.join(" ") : null });
    }
  }
  return out;
}

function describeModel(a: DerivedAnalysis): string {
  const model = Array.isArray(a.model) ? `the terms ${a.model.join(", ")}` : `the ${a.model} model`;
  const pruned = a.alpha === null ? "" : `, pruned at α = ${a.alpha}${a.hierarchy ? " with hierarchy" : ""}`;
  return `${model}${pruned}${a.transform === "ln" ? ", ln transform" : ""}`;
}
