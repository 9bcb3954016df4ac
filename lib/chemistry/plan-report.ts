/**
 * The `plan` verb's output: the run sheet of a plan document plus the hazard engine's
 * cautions for every run: `cautions`, `signOffRequired`, `signOffReasons`, `releasable`,
 * `notice` and the per-run pressure estimates `perRun`.
 */
import { AppError, type FieldIssue } from "../errors/app-error";
import { evaluatePlanCautions, type PlanCautionReport } from "../hazards/plan-cautions";
import { buildCautionInput, type CautionInput } from "./caution-input";
import type { PlanDocument } from "./plan-document";
import { buildFromRuns, type RunSheet } from "./run-sheet";
import { factorPointPath, validatePlan } from "./validate-plan";

export type PlanReport = RunSheet & PlanCautionReport;

const COMPONENT_HAZARD_FIELDS = new Set(["ghs", "pyrophoric", "waterReactive", "peroxideClass", "protic", "aqueous", "openedOn", "peroxideTestedOn", "receivedOn", "expiresOn"]);

/**
 * The path in the plan document of a path in the hazard engine's input (`runs.3.temperatureC`
 * → the temperature factor's `low`/`high`, or `recipe.temperatureC`; `runs.0.components.2.openedOn`
 * → `recipe.components.2.hazards.openedOn` or the solvent's `recipe.solvents.<k>.openedOn`).
 */
export function documentPathOfCautionPath(path: string, doc: PlanDocument, input: CautionInput, sheet: RunSheet): string {
  const m = /^runs\.(\d+)(?:\.(.*))?$/.exec(path);
  if (!m) return path;
  const ri = Number(m[1]);
  const rest = m[2] ?? "";
  const run = sheet.runs[ri];
  if (rest === "temperatureC") {
    const i = doc.factors.findIndex((f) => f.binding.kind === "temperature");
    return i >= 0 && run ? factorPointPath(doc, i, run, ri) : "recipe.temperatureC";
  }
  if (rest.startsWith("solvents")) return "recipe.solvents";
  if (rest === "liquidVolumeMl") return doc.recipe.finalVolumeUl !== undefined ? "recipe.finalVolumeUl" : "recipe.concentrationM";
  if (rest === "gasReleasedMmol") return "recipe.components";
  const c = /^components\.(\d+)(?:\.([A-Za-z]+))?/.exec(rest);
  if (c) {
    const ci = Number(c[1]);
    const field = c[2];
    if (ci < doc.recipe.components.length) return field && COMPONENT_HAZARD_FIELDS.has(field) ? `recipe.components.${ci}.hazards.${field}` : `recipe.components.${ci}`;
    const name = input.runs[ri]?.components[ci]?.name;
    const si = doc.recipe.solvents.findIndex((s) => s.name === name);
    if (si >= 0) return field ? `recipe.solvents.${si}.${field}` : `recipe.solvents.${si}`;
    return "recipe.solvents";
  }
  return "recipe";
}

/**
 * Validates the document up front (validate-plan.ts), builds the run sheet (see
 * run-sheet.ts) and evaluates the cautions of every run with the hazard engine's
 * `evaluatePlanCautions`. Every error names a path in the document.
 * @throws AppError("invalid_input") with document paths for a document that does not
 *   validate; AppError("infeasible") naming components and runs for an impossible plan.
 */
export function planReport(input: unknown): PlanReport {
  const { doc, vessel, infos, runs } = validatePlan(input);
  const sheet = buildFromRuns(doc, vessel, infos, runs);
  const cautionInput = buildCautionInput(doc, sheet);
  let report: PlanCautionReport;
  try {
    report = evaluatePlanCautions(cautionInput);
  } catch (e) {
    if (e instanceof AppError) {
      const issues: FieldIssue[] = e.issues.map((is) => ({ path: documentPathOfCautionPath(is.path, doc, cautionInput, sheet), message: is.message }));
      throw new AppError(e.code, `The plan's cautions cannot be evaluated: ${issues.map((i) => `${i.path}: ${i.message}`).join("; ")}`, issues);
    }
    throw e;
  }
  return { ...sheet, ...report };
}
