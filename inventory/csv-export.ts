/**
 * CSV export with formula-injection neutralisation: a cell that a spreadsheet would read
 * as a formula (starting with =, +, -, − (U+2212), @, tab or carriage return) is prefixed
 * with a single quote, as the OWASP "CSV Injection" guidance recommends.
 */
import Papa from "papaparse";

const DANGEROUS_START = /^[=+\-\u2212@\t\r]/;

/** The cell as written to the file: prefixed with ' when it would start a formula. */
export function neutraliseCell(value: string): string {
  return DANGEROUS_START.test(value) ? `'${value}` : value;
}

/** Writes rows as CSV (header first), every cell neutralised. */
export function toCsv(headers: readonly string[], rows: ReadonlyArray<ReadonlyArray<string | number | null>>): string {
  const safe = rows.map((r) => r.map((v) => neutraliseCell(v === null ? "" : String(v))));
  return Papa.unparse({ fields: headers.map(neutraliseCell), data: safe }, { newline: "\r\n" });
}
