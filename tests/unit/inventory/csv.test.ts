import { describe, expect, it } from "vitest";
import Papa from "papaparse";
import { parseContainerCsv } from "@/inventory/csv-import";
import { neutraliseCell, toCsv } from "@/inventory/csv-export";
import { sdsProblem, SDS_MAX_BYTES } from "@/inventory/sds";

const header = "Chemical,CAS No.,Barcode,Qty,Unit,Location,Expiry";

describe("container CSV import (preview)", () => {
  it("guesses the mapping and reads good rows in exact base units", () => {
    const csv = `${header}\nTetrahydrofuran,109-99-9,KB-T1,500,mL,Solvent cabinet,2027-05-01\nWater,7732-18-5,KB-W1,1.5,L,,\n`;
    const r = parseContainerCsv(csv);
    expect(r.issues).toEqual([]);
    expect(r.mapping).toMatchObject({ name: "Chemical", cas: "CAS No.", barcode: "Barcode", amount: "Qty", unit: "Unit", expiry: "Expiry" });
    expect(r.rows.map((x) => [x.barcode, x.amountBase, x.dimension])).toEqual([
      ["KB-T1", 500_000_000n, "volume"],
      ["KB-W1", 1_500_000_000n, "volume"],
    ]);
  });

  it("names row and column of every bad cell: missing CAS, bad check digit, negative amount, unknown unit", () => {
    const csv = [
      header,
      "Thing one,,KB-1,10,g,,",
      "Thing two,7732-18-4,KB-2,10,g,,",
      "Thing three,109-99-9,KB-3,-5,g,,",
      "Thing four,123-91-1,KB-4,5,oz,,",
      "Thing five,123-91-1,KB-1,5,g,,2027-02-30",
    ].join("\n");
    const r = parseContainerCsv(csv);
    expect(r.rows).toEqual([]);
    const brief = r.issues.map((i) => [i.row, i.column]);
    expect(brief).toEqual([
      [1, "CAS No."],
      [2, "CAS No."],
      [3, "Qty"],
      [4, "Unit"],
      [5, "Barcode"],
      [5, "Expiry"],
    ]);
    expect(r.issues[1]?.message).toContain("check digit should be 5");
    expect(r.issues[2]?.message).toContain("negative");
    expect(r.issues[3]?.message).toContain('unknown unit "oz"');
  });

  it("uses a column mapping the stockkeeper chose", () => {
    const csv = "Stuff,Registry,Tag,How much,Measure\nWater,7732-18-5,X1,2,kg\n";
    const r = parseContainerCsv(csv, { name: "Stuff", cas: "Registry", barcode: "Tag", amount: "How much", unit: "Measure" });
    expect(r.issues).toEqual([]);
    expect(r.rows[0]?.amountBase).toBe(2_000_000_000n);
  });

  it("reports a required field with no column", () => {
    const r = parseContainerCsv("Name,Barcode,Amount,Unit\nWater,X,1,g\n");
    expect(r.issues).toEqual([{ row: 0, column: "cas", field: "cas", message: "no column is mapped to cas" }]);
  });
});

describe("CSV export", () => {
  it("neutralises cells that start a formula (=, +, -, −, @)", () => {
    // OWASP "CSV Injection": prefix such cells with a single quote.
    for (const s of ["=HYPERLINK(1)", "+1", "-2", "\u22123", "@SUM(A1)"]) expect(neutraliseCell(s)).toBe(`'${s}`);
    expect(neutraliseCell("Water")).toBe("Water");
  });
  it("round-trips ordinary text through papaparse", () => {
    const csv = toCsv(["name", "note"], [["1,4-dioxane", 'says "hi"'], ["=cmd", null]]);
    const back = Papa.parse<string[]>(csv).data;
    expect(back).toEqual([["name", "note"], ["1,4-dioxane", 'says "hi"'], ["'=cmd", ""]]);
  });
});

describe("safety data sheet check", () => {
  const pdf = new TextEncoder().encode("%PDF-1.7\n%âãÏÓ\n");
  it("accepts a PDF by its signature (ISO 32000-1 §7.5.2)", () => {
    expect(sdsProblem(pdf)).toBeNull();
  });
  it("refuses other content and oversize files", () => {
    expect(sdsProblem(new TextEncoder().encode("<html>"))).toContain("not a PDF");
    const big = new Uint8Array(SDS_MAX_BYTES + 1);
    big.set(pdf);
    expect(sdsProblem(big)).toContain("at most 10 MB");
  });
});
