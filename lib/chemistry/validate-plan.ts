/**
 * Validates a plan document once and fully, before anything is computed, and names every
 * bad field by its path in the document the chemist typed (`factors.0.high`, never an
 * engine's inner `runs.1.temperatureC`):
 *
 * - the document's schema (every field at once);
 * - the vessel id, the unit of every factor (it must fit what the factor drives) and the
 *   formula of every component;
 * - the factor ranges against the physical limits the engines accept, at every point the
 *   design generates — the low and high levels and the axial points beyond them:
 *   temperatures within what the hazard engine accepts (above absolute zero, at most
 *   3000 °C: its own `runTemperatureSchema`), times, equivalents, loadings, ligand ratios
 *   and concentrations above zero and stirring rates not negative, solvent fractions
 *   within 0–1 that the other solvents can complete to 1 (the stoichiometry's own rules,
 *   `runConditions`).
 *
 * A problem at a generated point is put on the factor's `low` (at or below the low level,
 * e.g. an axial point −α) or `high` (at or above the high level); at a run given in
 * `design.runs`, on that run's value.
 */
import { AppError, parseOrThrow, type FieldIssue } from "../errors/app-error";
import { runTemperatureSchema } from "../hazards/plan-cautions/schema";
import { findDefaultVessel, type VesselType } from "../hazards/vessels";
import { resolveRuns, type ResolvedRun } from "./design-runs";
import { formulaMolarMass } from "./molar-mass";
import { planDocumentSchema, type PlanDocument, type PlanFactor } from "./plan-document";
import { componentInfos, runConditions, type ComponentInfo, type RunProblem } from "./stoichiometry";
import { toCanonical } from "./units";

export interface ValidatedPlan {
  doc: PlanDocument;
  vessel: VesselType;
  infos: ComponentInfo[];
  runs: ResolvedRun[];
}

/** Resolves the plan's vessel: a vessel type, or the id of a default vessel type. */
export function resolveVessel(doc: PlanDocument): VesselType {
  if (typeof doc.vessel !== "string") return doc.vessel;
  const v = findDefaultVessel(doc.vessel);
  if (!v) throw AppError.field("vessel", `"${doc.vessel}" is not a known vessel type id; give the vessel type in full`);
  return v;
}

function collect(issues: FieldIssue[], fn: () => void): void {
  try {
    fn();
  } catch (e) {
    if (e instanceof AppError && e.code === "invalid_input") issues.push(...e.issues);
    else throw e;
  }
}

const EPS = 1e-9;

/**
 * The document path for a problem of factor `i` at one run: the given run's own field, or
 * the factor's `low`/`high` for a generated point at or beyond that level.
 */
export function factorPointPath(doc: PlanDocument, i: number, run: ResolvedRun, runIndex: number): string {
  const f = doc.factors[i]!;
  const given = doc.design.runs;
  if (Array.isArray(given)) {
    const r = given[runIndex];
    return r?.natural?.[f.name] !== undefined || r?.coded?.[f.name] === undefined ? `design.runs.${runIndex}.natural.${f.name}` : `design.runs.${runIndex}.coded.${f.name}`;
  }
  const c = run.coded[f.name] ?? 0;
  return c <= 0 ? `factors.${i}.low` : `factors.${i}.high`;
}

function pointText(f: PlanFactor, run: ResolvedRun): string {
  const c = run.coded[f.name] ?? 0;
  const v = run.natural[f.name];
  const value = `${v}${f.unit ? ` ${f.unit}` : ""}`;
  if (Math.abs(Math.abs(c) - 1) < EPS) return `at the ${c < 0 ? "low" : "high"} level (${value})`;
  return `at ${Math.abs(c) > 1 ? "the axial point" : "the point"} coded ${Number(c.toFixed(4))} (${value})`;
}

/**
 * Validates a plan document (see the module comment) and returns it parsed, with its
 * vessel, component facts and runs.
 * @throws AppError("invalid_input") naming every bad field by its document path.
 */
export function validatePlan(input: unknown): ValidatedPlan {
  const doc = parseOrThrow(planDocumentSchema, input, "The plan document is not valid.");
  const issues: FieldIssue[] = [];
  let vessel: VesselType | undefined;
  collect(issues, () => {
    vessel = resolveVessel(doc);
  });
  doc.factors.forEach((f, i) => collect(issues, () => void toCanonical(f.binding.kind, f.low, f.unit, `factors.${i}.unit`)));
  doc.recipe.components.forEach((c, i) => {
    if (c.molarMassGPerMol === undefined) collect(issues, () => void formulaMolarMass(c.formula ?? "", `recipe.components.${i}.formula`));
  });
  const temperatureFactor = doc.factors.findIndex((f) => f.binding.kind === "temperature");
  if (temperatureFactor < 0) {
    const t = runTemperatureSchema.safeParse(doc.recipe.temperatureC);
    if (!t.success) issues.push({ path: "recipe.temperatureC", message: t.error.issues[0]?.message ?? "not an accepted temperature" });
  }
  if (issues.length > 0) throw new AppError("invalid_input", "The plan document is not valid.", issues);

  const runs = resolveRuns(doc);
  const byPath = new Map<string, { message: string; runs: number[] }>();
  const add = (path: string, message: string, run: number) => {
    const e = byPath.get(path) ?? { message, runs: [] };
    if (!e.runs.includes(run)) e.runs.push(run);
    byPath.set(path, e);
  };
  const factorIndex = new Map(doc.factors.map((f, i) => [f.name, i]));
  const fractionFactors = doc.factors.map((f, i) => (f.binding.kind === "solvent-fraction" ? i : -1)).filter((i) => i >= 0);
  runs.forEach((run, ri) => {
    const problems: RunProblem[] = [];
    const cond = runConditions(doc, run.natural, run.standardOrder, problems);
    if (temperatureFactor >= 0) {
      const f = doc.factors[temperatureFactor]!;
      const t = runTemperatureSchema.safeParse(cond.temperatureC);
      if (!t.success) add(factorPointPath(doc, temperatureFactor, run, ri), `the temperature would be ${cond.temperatureC} °C ${pointText(f, run)}: ${t.error.issues[0]?.message}`, run.standardOrder);
    }
    for (const p of problems) {
      const name = p.key.slice(p.key.indexOf(":") + 1);
      const targets = p.key === "fraction-sum" ? fractionFactors : [factorIndex.get(name) ?? -1];
      for (const i of targets) {
        if (i < 0) continue;
        add(factorPointPath(doc, i, run, ri), `${p.message} ${pointText(doc.factors[i]!, run)}`, run.standardOrder);
      }
    }
  });
  if (byPath.size > 0) {
    const list = [...byPath.entries()].map(([path, e]) => ({
      path,
      message: `${e.message}${e.runs.length > 1 ? ` (runs ${e.runs.sort((a, b) => a - b).join(", ")})` : ` (run ${e.runs[0]})`}`,
    }));
    throw new AppError("invalid_input", `Some runs of the design leave the physical limits: ${list.map((i) => `${i.path}: ${i.message}`).join("; ")}.`, list);
  }
  return { doc, vessel: vessel!, infos: componentInfos(doc), runs };
}
