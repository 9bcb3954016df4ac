/**
 * The look of Tareline's PDF sheets: A4 pages, graphite ink, the severity colours teal
 * (ok), amber (caution) and brick red (blocks) of tailwind.config.ts, table layouts with
 * hairlines. Pure (pdfmake types only).
 */
import type { CustomTableLayout, PageSize, StyleDictionary } from "pdfmake/interfaces";
import { SHEET_COLORS } from "./vial-map-drawing";

export const SHEET_PAGE: { pageSize: PageSize; pageMargins: [number, number, number, number] } = {
  pageSize: "A4",
  pageMargins: [36, 36, 36, 44],
};

export const SEVERITY_STYLE = {
  ok: { fg: "#1a6b64", bg: "#dcefeb" },
  warning: { fg: "#8a5607", bg: "#f7e8c8" },
  blocking: { fg: "#9c3324", bg: "#f4d9d3" },
} as const;

export const sheetStyles: StyleDictionary = {
  kicker: { fontSize: 8, color: SHEET_COLORS.faint, bold: true, characterSpacing: 0.6 },
  title: { fontSize: 15, bold: true, color: SHEET_COLORS.ink, margin: [0, 1, 0, 0] },
  h2: { fontSize: 11, bold: true, color: SHEET_COLORS.ink, margin: [0, 12, 0, 4] },
  label: { color: SHEET_COLORS.soft },
  th: { bold: true, color: SHEET_COLORS.ink, fontSize: 7.5 },
  muted: { color: SHEET_COLORS.soft, italics: true },
  small: { fontSize: 7.5, color: SHEET_COLORS.soft },
  footer: { fontSize: 7, color: SHEET_COLORS.faint },
  notice: { fontSize: 8.5, bold: true, color: SHEET_COLORS.ink, fillColor: "#f7e8c8" },
  sigOk: { bold: true, color: SEVERITY_STYLE.ok.fg },
  sigVoid: { bold: true, color: SEVERITY_STYLE.blocking.fg },
};

/** Table layouts: "rows" (a header rule, hairlines between rows), "list" (hairlines, no header), "zebra" (banded rows), "box" (one framed cell), "dispense" (a step heading, a header rule, hairlines). */
export function tableLayout(kind: "rows" | "list" | "zebra" | "box" | "dispense"): CustomTableLayout {
  const line = SHEET_COLORS.line;
  if (kind === "box") {
    return { hLineWidth: () => 0.8, vLineWidth: () => 0.8, hLineColor: () => line, vLineColor: () => line, paddingLeft: () => 6, paddingRight: () => 6, paddingTop: () => 4, paddingBottom: () => 4 };
  }
  if (kind === "dispense") {
    // A step heading, a header row, then the vials with hairlines.
    return {
      hLineWidth: (i) => (i === 2 ? 0.8 : i === 0 || i === 1 ? 0 : 0.3),
      vLineWidth: () => 0,
      hLineColor: (i) => (i === 2 ? SHEET_COLORS.ink : line),
      paddingLeft: () => 3,
      paddingRight: () => 3,
      paddingTop: () => 1.5,
      paddingBottom: () => 1.5,
    };
  }
  return {
    hLineWidth: (i) => (i === 1 && kind !== "list" ? 0.8 : kind === "zebra" ? 0 : 0.4),
    vLineWidth: () => 0,
    hLineColor: (i) => (i === 1 && kind !== "list" ? SHEET_COLORS.ink : line),
    fillColor: (i) => (kind === "zebra" && i > 0 && i % 2 === 0 ? "#f6f2ea" : null),
    paddingLeft: () => 3,
    paddingRight: () => 3,
    paddingTop: () => 2,
    paddingBottom: () => 2,
  };
}
