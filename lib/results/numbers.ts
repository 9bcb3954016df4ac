/**
 * What a typed, pasted or uploaded cell of the results grid means: numbers only. The grid's
 * paste, the CSV import and the cell editor all read cells with `readResultCell`, so they
 * agree on what is a number.
 */

/** A plain decimal number, optionally signed, with an optional exponent ("72.1", "-0.5", "1e-3", ".5"). */
const NUMBER = /^[+-]?(?:\d+(?:\.\d*)?|\.\d+)(?:[eE][+-]?\d+)?$/;

export type CellReading = { kind: "empty" } | { kind: "number"; value: number } | { kind: "error"; message: string };

/**
 * Reads one cell: empty (blank), a number, or why it is not one. A trailing "%" is
 * accepted for a response measured in % ("72.1 %"); thousands separators, decimal commas
 * and words are refused with a hint.
 * Example: readResultCell(" 72.1 % ", "%") → { kind: "number", value: 72.1 }
 */
export function readResultCell(raw: string, unit = ""): CellReading {
  let s = raw.replace(/\u00a0/g, " ").trim();
  if (s === "") return { kind: "empty" };
  if (unit.trim() === "%" || unit.trim().endsWith("%")) s = s.replace(/\s*%$/, "");
  s = s.replace(/^\u2212/, "-");
  if (NUMBER.test(s)) {
    const value = Number(s);
    if (!Number.isFinite(value)) return { kind: "error", message: `"${clip(raw)}" is too large` };
    return { kind: "number", value: Object.is(value, -0) ? 0 : value };
  }
  if (/^[+-]?\d+,\d+$/.test(s)) return { kind: "error", message: `"${clip(raw)}" is not a number: use a point as the decimal mark (${s.replace(",", ".")})` };
  if (/^[+-]?\d{1,3}(,\d{3})+(\.\d+)?$/.test(s)) return { kind: "error", message: `"${clip(raw)}" is not a number: leave out the thousands separators` };
  return { kind: "error", message: `"${clip(raw)}" is not a number` };
}

const clip = (v: string) => (v.length > 30 ? `${v.slice(0, 30)}…` : v);

/** Whether a response is a percentage (0–100 % expected). */
export const isPercent = (unit: string): boolean => /%\s*$/.test(unit.trim());

/**
 * A warning for a value that is possible but suspicious: a percentage outside 0–100 %.
 * Warned, never refused (a yield by quantitative NMR can read 101 %).
 */
export function valueWarning(value: number, unit: string): string | null {
  if (!isPercent(unit)) return null;
  if (value < 0 || value > 100) return `${value} ${unit.trim()} is outside 0–100 ${unit.trim()}: check it (it is kept)`;
  return null;
}
