/**
 * Container CSV import, the pure part: parse the file (papaparse), apply the column
 * mapping, and validate every row with the shared schema (inventory/schemas.ts
 * `csvRowSchema`: the same fields and limits as the API's chemicals, locations and
 * containers), naming the row and column of each problem. Nothing is written here; inventory/server/import-containers.ts adds the database checks and writes
 * the whole file in one transaction when the stockkeeper confirms.
 */
import Papa from "papaparse";
import { toBase, unitInfo, type Dimension } from "./units";
import { CSV_FIELDS, FIELD_LABELS, REQUIRED_FIELDS, guessMapping, type CsvField } from "./csv-fields";
import { csvRowSchema, type CsvRowValues } from "./schemas";

export interface ImportIssue {
  /** Data row number, 1 = the first row under the header. */
  row: number;
  /** The file's header for the column (or the field name when the column is not mapped). */
  column: string;
  field: CsvField | "file";
  message: string;
}

export interface ImportRow {
  row: number;
  name: string | null;
  cas: string;
  barcode: string;
  amountBase: bigint;
  dimension: Dimension;
  displayUnit: string;
  location: string | null;
  lot: string | null;
  purityPercent: string | null;
  concentration: string | null;
  concentrationUnit: "M" | "mg/mL" | null;
  solvent: string | null;
  receivedOn: string | null;
  openedOn: string | null;
  expiresOn: string | null;
  status: "available" | "quarantined";
  formula: string | null;
  molarMass: string | null;
  density: string | null;
}

export interface ParsedImport {
  headers: string[];
  mapping: Partial<Record<CsvField, string>>;
  rows: ImportRow[];
  issues: ImportIssue[];
  /** Rows in the file (without the header). */
  rowCount: number;
}

/** The largest file accepted, in rows (the whole file goes in one transaction). */
export const MAX_IMPORT_ROWS = 5000;

/** What people write for the two concentration units, mapped to Tareline's. */
const CONCENTRATION_UNITS: Record<string, "M" | "mg/mL"> = { m: "M", "mol/l": "M", "mg/ml": "mg/mL", "g/l": "mg/mL" };

const clip = (v: string) => (v.length > 40 ? `${v.slice(0, 40)}…` : v);

/** A validated row in the shape the import writes (amount in exact base units). */
function importRow(row: number, v: CsvRowValues): ImportRow {
  const { base, dimension } = toBase(v.amount, v.unit);
  return {
    row,
    name: v.name,
    cas: v.cas,
    barcode: v.barcode,
    amountBase: base,
    dimension,
    displayUnit: unitInfo(v.unit)!.label,
    location: v.location,
    lot: v.lot,
    purityPercent: v.purity,
    concentration: v.concentration,
    concentrationUnit: v.concentration ? v.concentration_unit : null,
    solvent: v.solvent,
    receivedOn: v.received,
    openedOn: v.opened,
    expiresOn: v.expiry,
    status: v.status,
    formula: v.formula,
    molarMass: v.molar_mass,
    density: v.density,
  };
}

/**
 * Parses and validates a container CSV. `mapping` says which header feeds each field;
 * missing entries are guessed from the headers. Every problem becomes an issue with its
 * row and column; rows with problems are left out of `rows`.
 */
export function parseContainerCsv(text: string, mappingIn?: Partial<Record<CsvField, string>>): ParsedImport {
  const parsed = Papa.parse<Record<string, string>>(text.replace(/^\uFEFF/, ""), { header: true, skipEmptyLines: "greedy", transform: (v) => v.trim() });
  const headers = (parsed.meta.fields ?? []).filter((h) => h !== "");
  const guessed = guessMapping(headers);
  const mapping: Partial<Record<CsvField, string>> = { ...guessed };
  if (mappingIn) {
    for (const f of CSV_FIELDS) {
      if (f in mappingIn) {
        const h = mappingIn[f];
        if (h) mapping[f] = h;
        else delete mapping[f];
      }
    }
  }
  const issues: ImportIssue[] = [];
  const rows: ImportRow[] = [];
  for (const f of CSV_FIELDS) {
    const h = mapping[f];
    if (h !== undefined && !headers.includes(h)) issues.push({ row: 0, column: h, field: f, message: `the file has no column "${h}"` });
  }
  for (const f of REQUIRED_FIELDS) {
    if (!mapping[f]) issues.push({ row: 0, column: f, field: f, message: `no column is mapped to ${f}` });
  }
  if (headers.length === 0) issues.push({ row: 0, column: "", field: "file", message: "the file is empty or has no header row" });
  const data = parsed.data;
  if (data.length > MAX_IMPORT_ROWS) issues.push({ row: 0, column: "", field: "file", message: `at most ${MAX_IMPORT_ROWS} rows per file` });
  if (issues.length) return { headers, mapping, rows, issues, rowCount: data.length };

  const seenBarcodes = new Map<string, number>();
  const position = (column: string) => headers.indexOf(column) + 1 || headers.length + 1;
  data.forEach((record, i) => {
    const row = i + 1;
    const rowIssues: ImportIssue[] = [];
    const column = (f: CsvField) => mapping[f] ?? f;
    const cells: Partial<Record<CsvField, string>> = {};
    for (const f of CSV_FIELDS) {
      const h = mapping[f];
      const v = h ? (record[h] ?? "").trim() : "";
      if (v !== "") cells[f] = v;
    }
    for (const f of REQUIRED_FIELDS) if (cells[f] === undefined) rowIssues.push({ row, column: column(f), field: f, message: `${FIELD_LABELS[f].toLowerCase()} is missing` });
    const input: Record<string, unknown> = { ...cells };
    if (cells.status !== undefined) input.status = cells.status.toLowerCase();
    if (cells.concentration_unit !== undefined) input.concentration_unit = CONCENTRATION_UNITS[cells.concentration_unit.replace(/\s/g, "").toLowerCase()] ?? cells.concentration_unit;
    const parsed = csvRowSchema.safeParse(input);
    if (!parsed.success) {
      for (const issue of parsed.error.issues) {
        const f = issue.path[0] as CsvField | undefined;
        if (f === undefined || (REQUIRED_FIELDS.includes(f) && cells[f] === undefined)) continue; // already "missing"
        const cell = cells[f];
        rowIssues.push({ row, column: column(f), field: f, message: cell === undefined || issue.message.includes(cell) ? issue.message : `"${clip(cell)}": ${issue.message}` });
      }
    }
    const barcode = cells.barcode;
    if (barcode !== undefined) {
      const seen = seenBarcodes.get(barcode.toLowerCase());
      if (seen !== undefined) rowIssues.push({ row, column: column("barcode"), field: "barcode", message: `barcode ${barcode} is also on row ${seen}` });
      else seenBarcodes.set(barcode.toLowerCase(), row);
    }
    rowIssues.sort((x, y) => position(x.column) - position(y.column));
    issues.push(...rowIssues);
    if (rowIssues.length === 0 && parsed.success) rows.push(importRow(row, parsed.data));
  });
  return { headers, mapping, rows, issues, rowCount: data.length };
}
