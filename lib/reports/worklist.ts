/**
 * The dispense worklist: one CSV row per dispense step of every vial, in the order of
 * addition (lib/reports/dispense-rows.ts), for the bench or a liquid handler. Written by
 * the inventory's CSV writer (`toCsv`: papaparse's `unparse`, every cell neutralised
 * against formula injection), never by hand. Pure.
 *
 * Columns (our own names): order, step, block, vial position, vial, run, add, amount,
 * unit, from, source. Amounts are written to 0.01 µL and 0.001 mg (finer than any
 * pipette or balance sets, so the file loses nothing that matters), with a point as the
 * decimal separator.
 */
import { toCsv } from "../../inventory/csv-export";
import type { RunSheet } from "../chemistry";
import type { VialMap } from "../plans/vial-map";
import { dispenseRows } from "./dispense-rows";

export const WORKLIST_COLUMNS = ["order", "step", "block", "vial position", "vial", "run", "add", "amount", "unit", "from", "source"] as const;

/** The worklist's amount as written: µL to 0.01, mg to 0.001. */
export function worklistAmount(amount: number | null, unit: "mg" | "µL"): string {
  if (amount === null) return "";
  return amount.toFixed(unit === "mg" ? 3 : 2);
}

/**
 * The worklist CSV of a run sheet placed on a vial map (header first, CRLF line ends).
 * Example: dispenseWorklistCsv(report, vialMap(report.runs, { positions: 24 }))
 */
export function dispenseWorklistCsv(sheet: Pick<RunSheet, "runs">, map: VialMap): string {
  const rows = dispenseRows(sheet, map).map((r, i) => [
    i + 1,
    r.step,
    r.block,
    r.position,
    r.vial,
    r.run,
    r.what,
    worklistAmount(r.amount, r.unit),
    r.unit,
    r.from,
    r.source,
  ]);
  return toCsv(WORKLIST_COLUMNS, rows);
}
