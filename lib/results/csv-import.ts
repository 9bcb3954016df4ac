/**
 * A results CSV, the pure part: parse the file (papaparse), map its columns to the run
 * (by run number or by vial position) and to the study's responses, and read every cell
 * as a number (lib/results/numbers.ts), naming the row and column of each problem. Nothing
 * is stored here: the preview shows what this returns, and the results entry
 * (lib/results/server/put-results.ts) stores the runs only when no row has a problem.
 */
import Papa from "papaparse";
import type { StudyResponse } from "../studies/schemas";
import { readResultCell, valueWarning } from "./numbers";
import { MAX_RESULT_RUNS, type ResultRun, type ResultsCsvMapping } from "./schemas";

/** A run of the plan as the CSV may name it. */
export interface CsvRunRef {
  run: number;
  /** Its vial position ("B3", "2:B3"), null when the plan has no vial map. */
  vial: string | null;
}

export interface ResultsCsvIssue {
  /** Data row, 1 = the first row under the header; 0 for the file as a whole. */
  row: number;
  /** The file's header of the column (or what is missing). */
  column: string;
  /** run | vial | reason | a response name | file */
  field: string;
  message: string;
}

export interface ResultsCsvRow {
  row: number;
  run: number;
  vial: string | null;
  /** Response → value; null for a failed result. Responses left blank are absent. */
  values: Record<string, number | null>;
  reason: string | null;
}

export interface ParsedResultsCsv {
  headers: string[];
  mapping: { run?: string; vial?: string; reason?: string; responses: Record<string, string> };
  /** How rows find their run. */
  mapBy: "run" | "vial" | null;
  rows: ResultsCsvRow[];
  issues: ResultsCsvIssue[];
  warnings: ResultsCsvIssue[];
  rowCount: number;
  /** The rows as a results entry (`PUT … { runs }`); empty when any row has a problem. */
  runs: ResultRun[];
}

const norm = (h: string) => h.toLowerCase().replace(/[^a-z0-9]/g, "");
const RUN_HEADERS = ["run", "runno", "runnumber", "runnr", "runid"];
const VIAL_HEADERS = ["vial", "vialposition", "position", "pos", "well", "vialid"];
const REASON_HEADERS = ["reason", "failurereason", "failedreason", "whyfailed", "failed"];

/** Guesses which header feeds what: run, vial, reason, and each response by its name ("Yield (%)" → yield). */
export function guessResultsMapping(headers: readonly string[], responses: readonly { name: string }[]): ParsedResultsCsv["mapping"] {
  const find = (names: readonly string[]) => headers.find((h) => names.includes(norm(h)));
  const out: ParsedResultsCsv["mapping"] = { responses: {} };
  const run = find(RUN_HEADERS);
  const vial = find(VIAL_HEADERS);
  const reason = find(REASON_HEADERS);
  if (run) out.run = run;
  if (vial) out.vial = vial;
  if (reason) out.reason = reason;
  for (const r of responses) {
    const key = norm(r.name);
    const h = headers.find((x) => norm(x) === key) ?? headers.find((x) => norm(x).startsWith(key) && ![run, vial, reason].includes(x));
    if (h) out.responses[r.name] = h;
  }
  return out;
}

/**
 * Parses and checks a results CSV against the plan's runs and the study's responses.
 * Every problem is an issue with its row and column; a file with any problem gives no runs.
 * Example: parseResultsCsv("Run,Yield\n1,72.1\n", { runs, responses }).runs → [{ run: 1, responses: { yield: 72.1 } }]
 */
export function parseResultsCsv(text: string, plan: { runs: readonly CsvRunRef[]; responses: readonly StudyResponse[] }, mappingIn?: ResultsCsvMapping): ParsedResultsCsv {
  const parsed = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ""), { header: true, skipEmptyLines: "greedy", transform: (v) => v.trim() });
  const headers = (parsed.meta.fields ?? []).filter((h) => h !== "");
  const guessed = guessResultsMapping(headers, plan.responses);
  const mapping: ParsedResultsCsv["mapping"] = {
    ...(mappingIn?.run !== undefined ? { run: mappingIn.run } : guessed.run ? { run: guessed.run } : {}),
    ...(mappingIn?.vial !== undefined ? { vial: mappingIn.vial } : guessed.vial ? { vial: guessed.vial } : {}),
    ...(mappingIn?.reason !== undefined ? { reason: mappingIn.reason } : guessed.reason ? { reason: guessed.reason } : {}),
    responses: { ...guessed.responses, ...(mappingIn?.responses ?? {}) },
  };
  for (const k of ["run", "vial", "reason"] as const) if (mapping[k] === "") delete mapping[k];
  for (const [k, v] of Object.entries(mapping.responses)) if (v === "") delete mapping.responses[k];
  const issues: ResultsCsvIssue[] = [];
  const warnings: ResultsCsvIssue[] = [];
  const data = parsed.data;
  const base = { headers, mapping, rows: [] as ResultsCsvRow[], issues, warnings, rowCount: data.length, runs: [] as ResultRun[] };

  if (headers.length === 0) issues.push({ row: 0, column: "", field: "file", message: "the file is empty or has no header row" });
  for (const [field, h] of [["run", mapping.run], ["vial", mapping.vial], ["reason", mapping.reason], ...Object.entries(mapping.responses)] as const) {
    if (h !== undefined && !headers.includes(h)) issues.push({ row: 0, column: h, field, message: `the file has no column "${h}"` });
  }
  const known = new Set(plan.responses.map((r) => r.name));
  for (const name of Object.keys(mapping.responses)) if (!known.has(name)) issues.push({ row: 0, column: mapping.responses[name]!, field: name, message: `${name} is not a response of the study` });
  const hasVials = plan.runs.some((r) => r.vial !== null);
  const mapBy: ParsedResultsCsv["mapBy"] = mapping.run ? "run" : mapping.vial && hasVials ? "vial" : null;
  if (headers.length > 0 && mapBy === null) {
    issues.push({ row: 0, column: "run", field: "run", message: mapping.vial ? "the plan has no vial map yet: map a column to the run number" : "no column holds the run number or the vial position (name one Run or Vial)" });
  }
  if (headers.length > 0 && Object.keys(mapping.responses).length === 0) {
    issues.push({ row: 0, column: plan.responses.map((r) => r.name).join(", "), field: "file", message: `no column holds a response of the study (${plan.responses.map((r) => r.name).join(", ")})` });
  }
  if (data.length > MAX_RESULT_RUNS) issues.push({ row: 0, column: "", field: "file", message: `at most ${MAX_RESULT_RUNS} rows per file` });
  if (issues.length) return { ...base, mapBy };

  const runNumbers = new Set(plan.runs.map((r) => r.run));
  const byVial = new Map(plan.runs.filter((r) => r.vial !== null).map((r) => [r.vial!.toUpperCase(), r]));
  const vialOf = new Map(plan.runs.map((r) => [r.run, r.vial]));
  const seen = new Map<number, number>();
  const rows: ResultsCsvRow[] = [];
  const unitOf = new Map(plan.responses.map((r) => [r.name, r.unit]));

  data.forEach((record, i) => {
    const row = i + 1;
    const rowIssues: ResultsCsvIssue[] = [];
    const cell = (h: string | undefined) => (h ? (record[h] ?? "").trim() : "");
    let run: number | null = null;
    if (mapping.run) {
      const raw = cell(mapping.run);
      if (raw === "") rowIssues.push({ row, column: mapping.run, field: "run", message: "the run number is missing" });
      else if (!/^\d+$/.test(raw)) rowIssues.push({ row, column: mapping.run, field: "run", message: `"${raw.slice(0, 30)}" is not a run number` });
      else if (!runNumbers.has(Number(raw))) rowIssues.push({ row, column: mapping.run, field: "run", message: `the plan has no run ${raw}` });
      else run = Number(raw);
    }
    if (mapping.vial && hasVials) {
      const raw = cell(mapping.vial);
      const byPos = raw === "" ? undefined : byVial.get(raw.toUpperCase());
      if (mapBy === "vial") {
        if (raw === "") rowIssues.push({ row, column: mapping.vial, field: "vial", message: "the vial position is missing" });
        else if (!byPos) rowIssues.push({ row, column: mapping.vial, field: "vial", message: `no run of the plan sits at ${raw.slice(0, 30)}` });
        else run = byPos.run;
      } else if (run !== null && raw !== "" && byPos?.run !== run) {
        rowIssues.push({ row, column: mapping.vial, field: "vial", message: `run ${run} sits at ${vialOf.get(run) ?? "no position"}, not ${raw.slice(0, 30)}` });
      }
    }
    if (run !== null) {
      const prior = seen.get(run);
      if (prior !== undefined) rowIssues.push({ row, column: mapBy === "vial" ? mapping.vial! : mapping.run!, field: mapBy ?? "run", message: `run ${run} is also on row ${prior}` });
      else seen.set(run, row);
    }
    const values: Record<string, number | null> = {};
    const blanks: string[] = [];
    for (const [name, h] of Object.entries(mapping.responses)) {
      const reading = readResultCell(cell(h), unitOf.get(name) ?? "");
      if (reading.kind === "error") rowIssues.push({ row, column: h, field: name, message: reading.message });
      else if (reading.kind === "number") {
        values[name] = reading.value;
        const w = valueWarning(reading.value, unitOf.get(name) ?? "");
        if (w) warnings.push({ row, column: h, field: name, message: w });
      } else blanks.push(name);
    }
    const reason = cell(mapping.reason);
    if (reason !== "") {
      if (blanks.length === 0) rowIssues.push({ row, column: mapping.reason!, field: "reason", message: "a reason is only for a failed run: leave the failed response blank" });
      else if (reason.length > 500) rowIssues.push({ row, column: mapping.reason!, field: "reason", message: "at most 500 characters" });
      else for (const name of blanks) values[name] = null;
    }
    issues.push(...rowIssues);
    if (rowIssues.length === 0 && run !== null) rows.push({ row, run, vial: vialOf.get(run) ?? null, values, reason: reason === "" ? null : reason });
  });
  const ok = issues.length === 0;
  return {
    ...base,
    mapBy,
    rows,
    runs: ok
      ? rows
          .filter((r) => Object.keys(r.values).length > 0)
          .map((r) => ({ run: r.run, responses: r.values, ...(r.reason !== null ? { reason: r.reason } : {}) }))
      : [],
  };
}
