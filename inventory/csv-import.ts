/**
 * Container CSV import, the pure part: parse the file (papaparse), apply the column
 * mapping, and validate every row, naming the row and column of each problem. Nothing is
 * written here; inventory/server/import-containers.ts adds the database checks and writes
 * the whole file in one transaction when the stockkeeper confirms.
 */
import Papa from "papaparse";
import { casProblem } from "./cas";
import { parseDecimal, cmp, rational } from "./decimal";
import { toBase, unitInfo, type Dimension } from "./units";
import { CSV_FIELDS, REQUIRED_FIELDS, guessMapping, type CsvField } from "./csv-fields";

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

const ISO_DATE = /^\d{4}-\d{2}-\d{2}$/;

function validDate(s: string): boolean {
  if (!ISO_DATE.test(s)) return false;
  const d = new Date(`${s}T00:00:00Z`);
  return !Number.isNaN(d.getTime()) && d.toISOString().slice(0, 10) === s;
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
  data.forEach((record, i) => {
    const row = i + 1;
    const rowIssues: ImportIssue[] = [];
    const get = (f: CsvField): string => {
      const h = mapping[f];
      return h ? (record[h] ?? "").trim() : "";
    };
    const bad = (f: CsvField, message: string) => rowIssues.push({ row, column: mapping[f] ?? f, field: f, message });
    const optionalDecimal = (f: CsvField, check: (v: string) => string | null): string | null => {
      const v = get(f);
      if (!v) return null;
      try {
        parseDecimal(v);
      } catch {
        bad(f, `"${v}" is not a number`);
        return null;
      }
      const p = check(v);
      if (p) bad(f, p);
      return p ? null : v;
    };
    const optionalDate = (f: CsvField): string | null => {
      const v = get(f);
      if (!v) return null;
      if (!validDate(v)) {
        bad(f, `"${v}" is not a date written YYYY-MM-DD`);
        return null;
      }
      return v;
    };
    const positive = (v: string) => (cmp(parseDecimal(v), rational(0n)) > 0 ? null : "must be greater than zero");

    const cas = get("cas");
    if (!cas) bad("cas", "CAS number is missing");
    else {
      const p = casProblem(cas);
      if (p) bad("cas", `CAS number ${cas}: ${p}`);
    }
    const barcode = get("barcode");
    if (!barcode) bad("barcode", "barcode is missing");
    else if (barcode.length > 64) bad("barcode", "barcode is longer than 64 characters");
    else if (seenBarcodes.has(barcode.toLowerCase())) bad("barcode", `barcode ${barcode} is also on row ${seenBarcodes.get(barcode.toLowerCase())}`);
    else seenBarcodes.set(barcode.toLowerCase(), row);

    const unit = get("unit");
    const info = unit ? unitInfo(unit) : null;
    if (!unit) bad("unit", "unit is missing");
    else if (!info) bad("unit", `unknown unit "${unit}" (use µg, mg, g, kg, µL, mL or L)`);
    const amountText = get("amount");
    let amountBase: bigint | null = null;
    if (!amountText) bad("amount", "amount is missing");
    else {
      let ok = true;
      try {
        parseDecimal(amountText);
      } catch {
        ok = false;
        bad("amount", `"${amountText}" is not a number`);
      }
      if (ok && cmp(parseDecimal(amountText), rational(0n)) < 0) bad("amount", `amount ${amountText} is negative`);
      else if (ok && info) amountBase = toBase(amountText, unit).base;
    }
    const purity = optionalDecimal("purity", (v) => {
      const x = parseDecimal(v);
      return cmp(x, rational(0n)) > 0 && cmp(x, rational(100n)) <= 0 ? null : "purity must be above 0 and at most 100 %";
    });
    const concentration = optionalDecimal("concentration", positive);
    const cu = get("concentration_unit");
    let concentrationUnit: "M" | "mg/mL" | null = null;
    if (cu) {
      const norm = cu.replace(/\s/g, "").toLowerCase();
      if (norm === "m" || norm === "mol/l") concentrationUnit = "M";
      else if (norm === "mg/ml" || norm === "g/l") concentrationUnit = "mg/mL";
      else bad("concentration_unit", `unknown concentration unit "${cu}" (use M or mg/mL)`);
    }
    if (concentration && !cu) bad("concentration_unit", "give the concentration's unit (M or mg/mL)");
    if (concentration && info && info.dimension !== "volume") bad("unit", "a solution's amount must be a volume");
    const received = optionalDate("received");
    const opened = optionalDate("opened");
    const expiry = optionalDate("expiry");
    const statusText = get("status").toLowerCase();
    let status: "available" | "quarantined" = "available";
    if (statusText === "quarantined") status = "quarantined";
    else if (statusText && statusText !== "available") bad("status", `status must be available or quarantined, not "${get("status")}"`);
    const molarMass = optionalDecimal("molar_mass", positive);
    const density = optionalDecimal("density", positive);
    const name = get("name");
    if (name.length > 200) bad("name", "name is longer than 200 characters");

    issues.push(...rowIssues);
    if (rowIssues.length === 0 && info && amountBase !== null) {
      rows.push({
        row,
        name: name || null,
        cas,
        barcode,
        amountBase,
        dimension: info.dimension,
        displayUnit: info.label,
        location: get("location") || null,
        lot: get("lot") || null,
        purityPercent: purity,
        concentration,
        concentrationUnit: concentration ? concentrationUnit : null,
        solvent: get("solvent") || null,
        receivedOn: received,
        openedOn: opened,
        expiresOn: expiry,
        status,
        formula: get("formula") || null,
        molarMass,
        density,
      });
    }
  });
  return { headers, mapping, rows, issues, rowCount: data.length };
}
