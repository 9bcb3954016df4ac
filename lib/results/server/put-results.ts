import "server-only";
import type { Transaction } from "sequelize";
import { AppError, parseOrThrow, type FieldIssue } from "@/lib/errors/app-error";
import { getPlan } from "@/lib/plans/server/get-plan";
import { makeMoves } from "@/lib/plans/server/move-plan";
import { PLAN_STATE_LABELS, RESULTS_STATES, type PlanAction, type PlanState } from "@/lib/plans/states";
import type { PlanView } from "@/lib/plans/view";
import { audit } from "@/lib/server/audit";
import { inTransaction } from "@/lib/server/db";
import { PlanResult } from "@/lib/server/models";
import { parseResultsCsv } from "../csv-import";
import { cellAuditValue, cellKey, checkEntries, missingCells, type CellChange, type ResultCell } from "../entries";
import { resultsPutSchema, type ResultRun } from "../schemas";
import type { ResultsEntryAnswer } from "../view";
import { activeExclusions, cellMap, loadPlanForResults, resultRows } from "./common";
import { consumePlanStock } from "./consume-plan-stock";
import { resultsView } from "./get-results";
import { planRunRefs } from "./run-refs";

const stateWord = (s: PlanState) => PLAN_STATE_LABELS[s].toLowerCase();

/**
 * Enters or corrects a plan's results (CONTRACT.md `PUT /plans/{plan}/results`): typed runs
 * (`{ runs: [{ run, responses: { yield: 72.1 } }] }`, null for a failed result, `reason`,
 * `clear`) or a CSV file (`{ csv, mapping? }`, checked as the preview checks it). All or
 * nothing: any bad field is a 422 naming it (`runs.3.responses.yield`, or `rows.4.yield`
 * for a file) and nothing is stored. Allowed while the state table says a plan takes
 * results (RESULTS_STATES); the first result moves a released plan to running, the one
 * that completes it moves it to results_entered and consumes its held reservations with
 * the amounts actually used (`consumption`, default the planned amounts), releasing what
 * was not used — in the same transaction. Every changed cell is in one audit entry (before
 * → after) with the state moves.
 * @throws AppError invalid_input, not_found, conflict (state; removing a result of a plan
 *   whose results are entered; stock).
 */
export async function putResults(
  opts: { labId: string; actorUserId: string; planId: string; input: unknown },
  t?: Transaction,
): Promise<ResultsEntryAnswer<PlanView>> {
  const body = parseOrThrow(resultsPutSchema, opts.input, "The results are not valid.");
  const outcome = await inTransaction(t, async (tx) => {
    const p = await loadPlanForResults({ labId: opts.labId, planId: opts.planId, lock: true }, tx);
    const { plan } = p;
    const from: PlanState = plan.state;
    if (!RESULTS_STATES.includes(from)) {
      throw new AppError("conflict", `A plan that is ${stateWord(from)} takes no results; results are entered once it is released.`, [{ path: "state", message: `${from} does not take results` }]);
    }
    const runNumbers = p.runs.map((r) => r.standardOrder);
    let runs: ResultRun[];
    let warnings: FieldIssue[] = [];
    if (body.csv !== undefined) {
      const parsed = parseResultsCsv(body.csv, { runs: await planRunRefs(p, opts.labId, tx), responses: p.responses }, body.mapping);
      if (parsed.issues.length) {
        throw new AppError(
          "invalid_input",
          `The file has ${parsed.issues.length} problem${parsed.issues.length === 1 ? "" : "s"}; nothing was stored.`,
          parsed.issues.map((i) => ({ path: i.row === 0 ? `csv.${i.field}` : `rows.${i.row}.${i.field}`, message: i.row === 0 ? i.message : `row ${i.row}, column ${i.column}: ${i.message}` })),
        );
      }
      if (parsed.runs.length === 0) throw AppError.field("csv", "the file holds no results");
      runs = parsed.runs;
      warnings = parsed.warnings.map((w) => ({ path: `rows.${w.row}.${w.field}`, message: `row ${w.row}, column ${w.column}: ${w.message}` }));
    } else {
      runs = body.runs!;
    }
    const checked = checkEntries(runs, { runNumbers, responses: p.responses });
    if (checked.issues.length) throw new AppError("invalid_input", "The results are not valid; nothing was stored.", checked.issues);
    if (body.csv === undefined) warnings = checked.warnings;

    const rows = await resultRows({ labId: opts.labId, planId: plan.id }, tx);
    const byKey = new Map(rows.map((r) => [cellKey(r.run, r.response), r]));
    const before: Record<string, unknown> = {};
    const after: Record<string, unknown> = {};
    const now = new Date();
    let set = 0;
    let cleared = 0;
    const label = (c: { run: number; response: string }) => `run ${c.run} ${c.response}`;
    const same = (row: PlanResult, c: ResultCell) => row.failed === c.failed && row.value === c.value && (row.failureReason ?? null) === (c.reason ?? null);
    for (const c of checked.changes as CellChange[]) {
      const key = cellKey(c.run, c.response);
      const row = byKey.get(key);
      if (c.kind === "clear") {
        if (!row) continue;
        before[label(c)] = cellAuditValue({ value: row.value, failed: row.failed, reason: row.failureReason });
        after[label(c)] = null;
        await row.destroy({ transaction: tx });
        byKey.delete(key);
        cleared++;
        continue;
      }
      if (row && same(row, c)) continue;
      before[label(c)] = row ? cellAuditValue({ value: row.value, failed: row.failed, reason: row.failureReason }) : null;
      after[label(c)] = cellAuditValue(c);
      if (row) {
        row.value = c.value;
        row.failed = c.failed;
        row.failureReason = c.reason;
        row.enteredBy = opts.actorUserId;
        row.enteredAt = now;
        await row.save({ transaction: tx });
      } else {
        const created = await PlanResult.create(
          { labId: opts.labId, planId: plan.id, run: c.run, response: c.response, value: c.value, failed: c.failed, failureReason: c.reason, enteredBy: opts.actorUserId, enteredAt: now },
          { transaction: tx },
        );
        byKey.set(key, created);
      }
      set++;
    }

    // The state moves the results make, through the state table.
    const stored = cellMap([...byKey.values()]);
    const complete = missingCells(stored, runNumbers, p.responses).length === 0;
    if (from === "results_entered" && !complete) {
      throw new AppError("conflict", "The plan's results are entered: correct a value or mark it failed rather than removing it.", [{ path: "runs", message: "would leave the plan without a result for every run" }]);
    }
    const actions: PlanAction[] = [];
    if (from === "released" && stored.size > 0) actions.push("start");
    if ((from === "running" || actions.length > 0) && complete) actions.push("enter_results");
    // Through the one state table and the moves' own rules (lib/plans/server/move-plan.ts): each move's permission, one more version.
    const made = await makeMoves({ labId: opts.labId, actorUserId: opts.actorUserId, plan, actions }, tx);
    const moves = made.map((m) => `${m.from} → ${m.to}`);
    const state: PlanState = plan.state;
    let stock = { consumed: 0, released: 0 };
    if (state === "results_entered" && from !== "results_entered") {
      stock = await consumePlanStock({ labId: opts.labId, actorUserId: opts.actorUserId, plan, lines: body.consumption ?? [] }, tx);
    } else if (body.consumption?.length) {
      throw AppError.field("consumption", "stock is consumed when the results complete the plan; these results do not");
    }
    if (set + cleared > 0 || state !== from) {
      await audit(
        {
          labId: opts.labId,
          actorUserId: opts.actorUserId,
          action: from === "results_entered" ? "plan.results_corrected" : "plan.results_entered",
          entityType: "plan",
          entityId: plan.id,
          before: { state: from, ...(made.length ? { version: plan.version - 1 } : {}), ...before },
          after: { state, ...(made.length ? { version: plan.version } : {}), ...after, ...(stock.consumed + stock.released > 0 ? { reservationsConsumed: stock.consumed, reservationsReleased: stock.released } : {}) },
        },
        tx,
      );
    }
    const finalRows = await resultRows({ labId: opts.labId, planId: plan.id }, tx);
    const exclusions = await activeExclusions({ labId: opts.labId, planId: plan.id }, tx);
    return { results: resultsView(p, finalRows, exclusions), warnings, changed: { set, cleared, moves, ...stock } };
  });
  return { plan: await getPlan({ labId: opts.labId, planId: opts.planId }, t), ...outcome };
}
