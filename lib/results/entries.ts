/**
 * The results of a plan, pure: checking a results entry against the plan's runs and the
 * study's responses (every problem named at its path in the request, `runs.3.responses.yield`),
 * turning it into cell changes, and telling which cells are still missing. The server
 * operation (lib/results/server/put-results.ts) stores what this accepts.
 */
import type { FieldIssue } from "../errors/app-error";
import type { StudyResponse } from "../studies/schemas";
import { valueWarning } from "./numbers";
import type { ResultRun } from "./schemas";

/** One stored result: a value, or failed (value null) with an optional reason. */
export interface ResultCell {
  run: number;
  response: string;
  value: number | null;
  failed: boolean;
  reason: string | null;
}

/** A change of one cell: set (a value or failed) or clear (remove what was entered). */
export type CellChange = ({ kind: "set" } & ResultCell) | { kind: "clear"; run: number; response: string };

export interface CheckedEntry {
  changes: CellChange[];
  issues: FieldIssue[];
  /** Accepted but suspicious values (a yield above 100 %), at their paths. */
  warnings: FieldIssue[];
}

/** The key of a cell in maps. */
export const cellKey = (run: number, response: string): string => `${run}\u0000${response}`;

/**
 * Checks a results entry. `runNumbers` are the plan's run numbers (the run sheet's `run`);
 * `responses` the study's. `pathOf(i)` names the i-th run in the request (default `runs.i`;
 * the CSV import names rows instead).
 */
export function checkEntries(
  runs: readonly ResultRun[],
  plan: { runNumbers: readonly number[]; responses: readonly StudyResponse[] },
  pathOf: (i: number, field: string) => string = (i, field) => `runs.${i}${field ? `.${field}` : ""}`,
): CheckedEntry {
  const known = new Set(plan.runNumbers);
  const byName = new Map(plan.responses.map((r) => [r.name, r]));
  const lower = new Map(plan.responses.map((r) => [r.name.toLowerCase(), r.name]));
  const firstAt = new Map<number, number>();
  const issues: FieldIssue[] = [];
  const warnings: FieldIssue[] = [];
  const changes: CellChange[] = [];
  const range = plan.runNumbers.length ? `runs ${Math.min(...plan.runNumbers)}–${Math.max(...plan.runNumbers)}` : "no runs";
  runs.forEach((r, i) => {
    const prior = firstAt.get(r.run);
    if (prior !== undefined) {
      issues.push({ path: pathOf(i, "run"), message: `repeats run ${r.run} (given at ${pathOf(prior, "")} already)` });
      return;
    }
    firstAt.set(r.run, i);
    if (!known.has(r.run)) {
      issues.push({ path: pathOf(i, "run"), message: `the plan has no run ${r.run} (${range})` });
      return;
    }
    const cleared = new Set<string>();
    (r.clear ?? []).forEach((name, k) => {
      if (!byName.has(name)) issues.push({ path: pathOf(i, `clear.${k}`), message: unknownResponse(name, lower) });
      else cleared.add(name);
    });
    let anyFailed = false;
    if (r.responses === null) {
      anyFailed = true;
      for (const resp of plan.responses) {
        if (!cleared.has(resp.name)) changes.push({ kind: "set", run: r.run, response: resp.name, value: null, failed: true, reason: r.reason ?? null });
      }
    } else if (r.responses !== undefined) {
      for (const [name, value] of Object.entries(r.responses)) {
        const resp = byName.get(name);
        const path = pathOf(i, `responses.${name}`);
        if (!resp) {
          issues.push({ path, message: unknownResponse(name, lower) });
          continue;
        }
        if (cleared.has(name)) {
          issues.push({ path, message: "is both given and cleared" });
          continue;
        }
        if (value === null) {
          anyFailed = true;
          changes.push({ kind: "set", run: r.run, response: name, value: null, failed: true, reason: r.reason ?? null });
        } else {
          const w = valueWarning(value, resp.unit);
          if (w) warnings.push({ path, message: w });
          changes.push({ kind: "set", run: r.run, response: name, value, failed: false, reason: null });
        }
      }
    }
    if (r.reason !== undefined && !anyFailed) issues.push({ path: pathOf(i, "reason"), message: "only a failed result has a reason (give the failed responses as null)" });
    for (const name of cleared) changes.push({ kind: "clear", run: r.run, response: name });
  });
  return { changes, issues, warnings };
}

function unknownResponse(name: string, lower: ReadonlyMap<string, string>): string {
  const near = lower.get(name.toLowerCase());
  const names = [...lower.values()].join(", ");
  return near ? `is not a response of the study; did you mean ${near}?` : `is not a response of the study (${names})`;
}

/** The cells of the plan that have neither a value nor a failure: per response, the runs still missing. */
export function missingCells(stored: ReadonlyMap<string, ResultCell>, runNumbers: readonly number[], responses: readonly { name: string }[]): { run: number; response: string }[] {
  const out: { run: number; response: string }[] = [];
  for (const run of runNumbers) for (const r of responses) if (!stored.has(cellKey(run, r.name))) out.push({ run, response: r.name });
  return out;
}

/** A cell's value as the audit log shows it: the number, or "failed (reason)". */
export function cellAuditValue(c: Pick<ResultCell, "value" | "failed" | "reason"> | undefined): number | string | null {
  if (!c) return null;
  if (c.failed) return c.reason ? `failed (${c.reason})` : "failed";
  return c.value;
}
