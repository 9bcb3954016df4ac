import "server-only";
import type { Transaction } from "sequelize";
import { AppError } from "@/lib/errors/app-error";
import { renderPrepSheet } from "@/lib/reports/prep-sheet";
import { planChemicalHazards } from "@/lib/reports/plan-hazards";
import { dispenseWorklistCsv } from "@/lib/reports/worklist";
import { vialMap } from "../vial-map";
import type { PlanView } from "../view";
import { getPlan } from "./get-plan";
import { labOf } from "./plan-mail";

/** A plan's block format for the vial map: its block's positions (the lab's block, stored in the document), else the 24-position block. */
export function blockPositionsOf(plan: Pick<PlanView, "document">): 24 | 48 | 96 {
  const p = plan.document.block?.positions;
  return p === 48 || p === 96 ? p : 24;
}

/** "Study A — screen 1" → "Study-A-screen-1" (a file name of letters, digits and hyphens). */
export function fileStem(name: string): string {
  return name.replace(/[^\p{L}\p{N}]+/gu, "-").replace(/^-+|-+$/g, "").slice(0, 80) || "plan";
}

function runSheetOf(plan: PlanView): NonNullable<PlanView["runSheet"]> {
  if (!plan.runSheet) throw new AppError("conflict", "This plan has no run sheet (its amounts cannot work), so there is no sheet to print.", [{ path: "document", message: "the amounts cannot be planned" }]);
  return plan.runSheet;
}

/** The prep sheet PDF of a plan as it is now (lib/reports/prep-sheet.ts), from the plan the GET returns. */
export async function prepSheetOf(plan: PlanView, labName: string, issuedAt = new Date().toISOString()): Promise<{ filename: string; pdf: Buffer }> {
  const pdf = await renderPrepSheet({
    plan: { name: plan.name, studyName: plan.studyName, authorName: plan.authorName, state: plan.state, version: plan.version, contentHash: plan.contentHash, labName },
    signature: plan.signature,
    runSheet: runSheetOf(plan),
    cautions: plan,
    blockPositions: blockPositionsOf(plan),
    chemicals: planChemicalHazards(plan.document),
    settings: { thresholds: plan.document.thresholds, equipment: plan.document.equipment },
    issuedAt,
  });
  return { filename: `${fileStem(plan.name)}.prep-sheet.pdf`, pdf };
}

/** The dispense worklist CSV of a plan (lib/reports/worklist.ts), vials placed by the one vial-map rule. */
export function worklistOf(plan: PlanView): { filename: string; csv: string } {
  const sheet = runSheetOf(plan);
  return { filename: `${fileStem(plan.name)}.worklist.csv`, csv: dispenseWorklistCsv(sheet, vialMap(sheet.runs, { positions: blockPositionsOf(plan) })) };
}

/**
 * `GET /plans/{plan}/prep-sheet.pdf`: the plan's prep sheet as it is now (its state,
 * signature and content hash are printed on it).
 * @throws AppError not_found, conflict (no run sheet).
 */
export async function renderPlanPrepSheet(opts: { labId: string; planId: string }, t?: Transaction): Promise<{ filename: string; pdf: Buffer }> {
  const plan = await getPlan(opts, t);
  const lab = await labOf(opts.labId, t);
  return prepSheetOf(plan, lab.name);
}

/**
 * `GET /plans/{plan}/worklist.csv`: one row per dispense step of every vial.
 * @throws AppError not_found, conflict (no run sheet).
 */
export async function renderPlanWorklist(opts: { labId: string; planId: string }, t?: Transaction): Promise<{ filename: string; csv: string }> {
  return worklistOf(await getPlan(opts, t));
}
