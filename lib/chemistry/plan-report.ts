/**
 * The `plan` verb's output: the run sheet of a plan document plus the hazard engine's
 * cautions for every run (interfaces.md): `cautions`, `signOffRequired`,
 * `signOffReasons`, `releasable`, `notice` and the per-run pressure estimates `perRun`.
 */
import { AppError, parseOrThrow } from "../errors/app-error";
import { evaluatePlanCautions, type PlanCautionReport } from "../hazards/plan-cautions";
import { buildCautionInput } from "./caution-input";
import { resolveRuns } from "./design-runs";
import { planDocumentSchema, type PlanDocument } from "./plan-document";
import { buildFromRuns, resolveVessel, type RunSheet } from "./run-sheet";
import { componentInfos } from "./stoichiometry";

export type PlanReport = RunSheet & PlanCautionReport;

/**
 * Builds the run sheet (see run-sheet.ts) and evaluates the cautions of every run with
 * the hazard engine's `evaluatePlanCautions`.
 * @throws AppError("invalid_input") with dotted paths for a document that does not
 *   validate; AppError("infeasible") naming components and runs for an impossible plan.
 */
export function planReport(input: unknown): PlanReport {
  const doc: PlanDocument = parseOrThrow(planDocumentSchema, input, "The plan document is not valid.");
  const sheet = buildFromRuns(doc, resolveVessel(doc), componentInfos(doc), resolveRuns(doc));
  let report: PlanCautionReport;
  try {
    report = evaluatePlanCautions(buildCautionInput(doc, sheet));
  } catch (e) {
    if (e instanceof AppError) throw new AppError(e.code, `Caution evaluation: ${e.message}`, e.issues);
    throw e;
  }
  return { ...sheet, ...report };
}
