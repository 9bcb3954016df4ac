/**
 * How a vial map is drawn: the palette of temperature groups, the fill pattern that
 * repeats each colour's meaning without colour, and the geometry of a block. The plan
 * page's component (components/plans/vial-map.tsx) and the PDF sheets (`vialBlockSvg`,
 * `vialLegendSvg`) draw from this one module; where the runs go is the rule of
 * lib/plans/vial-map.ts.
 *
 * Palette: Tareline's own eight colours, ordered coldest group first (blues, then
 * yellow, orange, purple …), alternating dark and light so neighbouring groups differ in
 * lightness as well as hue — the difference that survives every common colour-vision
 * deficiency — and kept apart from the severity colours (teal, amber, brick red). Each
 * group also has its own fill pattern, and every block is titled with its temperature,
 * so nothing depends on colour alone. Pure.
 */
import type { VialBlock, VialMap } from "../plans/vial-map";
import { celsius } from "./format";

export interface GroupStyle {
  /** Fill colour of the vials. */
  fill: string;
  /** Colour of the pattern drawn over the fill (dark on light fills, light on dark ones). */
  ink: string;
  /** The pattern's name, also said in the legend's text. */
  pattern: "plain" | "dots" | "diagonal" | "horizontal" | "cross" | "vertical" | "rings" | "backslash";
}

export const GROUP_STYLES: readonly GroupStyle[] = [
  { fill: "#2b5c9e", ink: "#ffffff", pattern: "plain" },
  { fill: "#9cc3e8", ink: "#1d2f4a", pattern: "dots" },
  { fill: "#f0cf65", ink: "#4a3a08", pattern: "diagonal" },
  { fill: "#8e5ba8", ink: "#ffffff", pattern: "horizontal" },
  { fill: "#e59a52", ink: "#3d2208", pattern: "cross" },
  { fill: "#5e6b24", ink: "#ffffff", pattern: "vertical" },
  { fill: "#d7c4ec", ink: "#3a2450", pattern: "rings" },
  { fill: "#b65a7a", ink: "#ffffff", pattern: "backslash" },
];

/** The style of temperature group `g` (groups past eight reuse the palette). */
export function groupStyle(g: number): GroupStyle {
  return GROUP_STYLES[g % GROUP_STYLES.length]!;
}

/** Ink and paper of the sheets (tailwind.config.ts). */
export const SHEET_COLORS = { ink: "#2a2a2d", soft: "#4b4a4f", faint: "#625e57", line: "#d9cfbd", paper: "#fbf8f1", empty: "#ebe3d3" } as const;

/** Geometry of one block drawing (user units; points in the PDF, px on screen). */
export interface BlockGeometry {
  width: number;
  height: number;
  cell: number;
  radius: number;
  /** Top-left of the grid of positions. */
  gridX: number;
  gridY: number;
  /** Centre of position (row, column). */
  centre(row: number, column: number): { cx: number; cy: number };
}

/** The geometry of a block of `rows` × `columns` positions with cells `cell` units wide. */
export function blockGeometry(rows: number, columns: number, cell = 26): BlockGeometry {
  const gridX = cell * 0.8;
  const gridY = cell * 0.75;
  return {
    width: gridX + columns * cell + cell * 0.25,
    height: gridY + rows * cell + cell * 0.25,
    cell,
    radius: cell * 0.4,
    gridX,
    gridY,
    centre: (row, column) => ({ cx: gridX + (column + 0.5) * cell, cy: gridY + (row + 0.5) * cell }),
  };
}

/** The title of a block: "Block 2 · 80 °C" (and "· 1 of 2" when the temperature takes several blocks). */
export function blockTitle(block: VialBlock): string {
  return `Block ${block.index} · ${celsius(block.temperatureC)}${block.parts > 1 ? ` · ${block.part} of ${block.parts}` : ""}`;
}

/** One element of a fill pattern, in a 6 × 6 tile. */
export type PatternElement = { tag: "circle"; cx: number; cy: number; r: number; fill: string; stroke?: string; strokeWidth?: number } | { tag: "path"; d: string; stroke: string; strokeWidth: number };

/** The tile of a group's pattern over its fill colour (empty for a plain fill). */
export function patternElements(g: number): PatternElement[] {
  const s = groupStyle(g);
  const line = (d: string): PatternElement => ({ tag: "path", d, stroke: s.ink, strokeWidth: 1.1 });
  switch (s.pattern) {
    case "plain":
      return [];
    case "dots":
      return [{ tag: "circle", cx: 3, cy: 3, r: 1.1, fill: s.ink }];
    case "diagonal":
      return [line("M-1,1 L1,-1 M0,6 L6,0 M5,7 L7,5")];
    case "backslash":
      return [line("M-1,5 L1,7 M0,0 L6,6 M5,-1 L7,1")];
    case "horizontal":
      return [line("M0,3 H6")];
    case "vertical":
      return [line("M3,0 V6")];
    case "cross":
      return [line("M0,3 H6 M3,0 V6")];
    case "rings":
      return [{ tag: "circle", cx: 3, cy: 3, r: 1.6, fill: "none", stroke: s.ink, strokeWidth: 0.8 }];
  }
}

/** The id of a group's pattern (`idSuffix` keeps ids unique when several drawings share a page). */
export function patternId(g: number, idSuffix = ""): string {
  return `vm-p${g}${idSuffix}`;
}

/** The pattern of a group as an SVG <pattern> string, or null for a plain fill. */
export function patternDef(g: number, idSuffix = ""): string | null {
  const els = patternElements(g);
  if (els.length === 0) return null;
  const s = groupStyle(g);
  const inner = els
    .map((e) =>
      e.tag === "circle"
        ? `<circle cx="${e.cx}" cy="${e.cy}" r="${e.r}" fill="${e.fill}"${e.stroke ? ` stroke="${e.stroke}" stroke-width="${e.strokeWidth ?? 1}"` : ""}/>`
        : `<path d="${e.d}" stroke="${e.stroke}" stroke-width="${e.strokeWidth}" fill="none"/>`,
    )
    .join("");
  return `<pattern id="${patternId(g, idSuffix)}" patternUnits="userSpaceOnUse" width="6" height="6"><rect width="6" height="6" fill="${s.fill}"/>${inner}</pattern>`;
}

/** The fill attribute of a group's vials. */
export function groupFill(g: number, idSuffix = ""): string {
  return patternElements(g).length === 0 ? groupStyle(g).fill : `url(#${patternId(g, idSuffix)})`;
}

function esc(s: string): string {
  return s.replace(/&/g, "&amp;").replace(/</g, "&lt;").replace(/>/g, "&gt;").replace(/"/g, "&quot;");
}

export interface BlockSvgOptions {
  /** Cell size in user units (default 26). */
  cell?: number;
  /** Font family for labels (the PDF's registered font name). */
  font?: string;
  /** Draw for print: black outlines (default true for the PDF). */
  print?: boolean;
}

/**
 * One block as a standalone SVG document: its title, row letters and column numbers,
 * every position with the run number in it (empty positions pale), vials filled with
 * their group's colour and pattern, black outlines for print.
 */
export function vialBlockSvg(block: VialBlock, options: BlockSvgOptions = {}): string {
  const g = blockGeometry(block.rows, block.columns, options.cell ?? 26);
  const font = esc(options.font ?? "sans-serif");
  const titleH = g.cell * 0.9;
  const W = g.width;
  const H = g.height + titleH;
  const outline = options.print === false ? SHEET_COLORS.soft : "#000000";
  const def = patternDef(block.group);
  const fill = groupFill(block.group);
  const style = groupStyle(block.group);
  const fs = g.cell * 0.36;
  const parts: string[] = [];
  parts.push(`<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">`);
  if (def) parts.push(`<defs>${def}</defs>`);
  parts.push(`<text x="0" y="${titleH * 0.7}" font-family="${font}" font-size="${g.cell * 0.46}" font-weight="bold" fill="${SHEET_COLORS.ink}">${esc(blockTitle(block))}</text>`);
  parts.push(`<g transform="translate(0 ${titleH})">`);
  parts.push(`<rect x="${g.gridX - g.cell * 0.15}" y="${g.gridY - g.cell * 0.15}" width="${block.columns * g.cell + g.cell * 0.3}" height="${block.rows * g.cell + g.cell * 0.3}" rx="${g.cell * 0.3}" fill="none" stroke="${outline}" stroke-width="0.8"/>`);
  for (let c = 0; c < block.columns; c++) {
    const { cx } = g.centre(0, c);
    parts.push(`<text x="${cx}" y="${g.gridY - g.cell * 0.3}" text-anchor="middle" font-family="${font}" font-size="${fs}" fill="${SHEET_COLORS.soft}">${c + 1}</text>`);
  }
  for (let r = 0; r < block.rows; r++) {
    const { cy } = g.centre(r, 0);
    parts.push(`<text x="${g.gridX * 0.45}" y="${cy + fs * 0.35}" text-anchor="middle" font-family="${font}" font-size="${fs}" fill="${SHEET_COLORS.soft}">${String.fromCharCode(65 + r)}</text>`);
  }
  for (const p of block.positions) {
    const { cx, cy } = g.centre(p.row, p.column);
    if (p.run === null) {
      parts.push(`<circle cx="${cx}" cy="${cy}" r="${g.radius}" fill="${SHEET_COLORS.empty}" stroke="${SHEET_COLORS.faint}" stroke-width="0.6" stroke-dasharray="1.5 1.5"/>`);
      continue;
    }
    parts.push(`<circle cx="${cx}" cy="${cy}" r="${g.radius}" fill="${fill}" stroke="${outline}" stroke-width="1"/>`);
    // The run number on a paper disc so it reads on any fill and pattern.
    parts.push(`<circle cx="${cx}" cy="${cy}" r="${g.radius * 0.66}" fill="#ffffff" stroke="${style.fill}" stroke-width="0.6"/>`);
    parts.push(`<text x="${cx}" y="${cy + fs * 0.36}" text-anchor="middle" font-family="${font}" font-size="${fs * (p.run >= 100 ? 0.8 : 1)}" font-weight="bold" fill="${SHEET_COLORS.ink}">${p.run}</text>`);
  }
  parts.push(`</g></svg>`);
  return parts.join("");
}

/** The legend's entries: one per temperature group, with its colour, pattern and blocks. */
export function legendEntries(map: VialMap): Array<{ group: number; temperatureC: number; label: string; style: GroupStyle; blocks: number[]; runs: number }> {
  return map.temperatures.map((t, group) => {
    const blocks = map.blocks.filter((b) => b.group === group);
    return {
      group,
      temperatureC: t,
      label: celsius(t),
      style: groupStyle(group),
      blocks: blocks.map((b) => b.index),
      runs: blocks.reduce((a, b) => a + b.positions.filter((p) => p.run !== null).length, 0),
    };
  });
}

/** The legend as a standalone SVG document, one line per temperature group. */
export function vialLegendSvg(map: VialMap, options: { font?: string; width?: number } = {}): string {
  const font = esc(options.font ?? "sans-serif");
  const entries = legendEntries(map);
  const lineH = 16;
  const W = options.width ?? 360;
  const H = entries.length * lineH + 4;
  const defs = entries.map((e) => patternDef(e.group, "l")).filter((d): d is string => d !== null);
  const rows = entries.map((e, i) => {
    const y = 2 + i * lineH;
    const blocks = e.blocks.length === 1 ? `block ${e.blocks[0]}` : `blocks ${e.blocks.join(", ")}`;
    return (
      `<circle cx="8" cy="${y + 7}" r="6" fill="${groupFill(e.group, "l")}" stroke="#000000" stroke-width="0.8"/>` +
      `<text x="20" y="${y + 10.5}" font-family="${font}" font-size="9.5" fill="${SHEET_COLORS.ink}">${esc(`${e.label} — ${blocks}, ${e.runs} ${e.runs === 1 ? "run" : "runs"} (${e.style.pattern})`)}</text>`
    );
  });
  return `<svg xmlns="http://www.w3.org/2000/svg" width="${W}" height="${H}" viewBox="0 0 ${W} ${H}">${defs.length ? `<defs>${defs.join("")}</defs>` : ""}${rows.join("")}</svg>`;
}
