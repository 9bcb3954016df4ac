/**
 * The results grid's keyboard and paste rules, pure (tested in tests/unit/results):
 * where a key moves the focus, and how a block pasted from a spreadsheet (tab-separated
 * cells, newline-separated rows) lands from the focused cell.
 */

export interface GridPos {
  row: number;
  col: number;
}

/**
 * The cell a key moves to in a grid of `rows` × `cols`, or null when the key does not
 * move. Arrows move one cell (Left/Right only when the caret is at the text's start/end);
 * Enter moves down (Shift+Enter up); Tab moves right and wraps to the next row (Shift+Tab
 * left, wrapping back). Never leaves the grid.
 */
export function moveFocus(pos: GridPos, key: string, opts: { shift: boolean; caretAtStart: boolean; caretAtEnd: boolean }, rows: number, cols: number): GridPos | null {
  const clamp = (p: GridPos): GridPos => ({ row: Math.max(0, Math.min(rows - 1, p.row)), col: Math.max(0, Math.min(cols - 1, p.col)) });
  switch (key) {
    case "ArrowDown":
      return clamp({ row: pos.row + 1, col: pos.col });
    case "ArrowUp":
      return clamp({ row: pos.row - 1, col: pos.col });
    case "ArrowLeft":
      return opts.caretAtStart ? clamp({ row: pos.row, col: pos.col - 1 }) : null;
    case "ArrowRight":
      return opts.caretAtEnd ? clamp({ row: pos.row, col: pos.col + 1 }) : null;
    case "Enter":
      return clamp({ row: pos.row + (opts.shift ? -1 : 1), col: pos.col });
    case "Tab": {
      if (opts.shift) return pos.col > 0 ? { row: pos.row, col: pos.col - 1 } : pos.row > 0 ? { row: pos.row - 1, col: cols - 1 } : pos;
      return pos.col < cols - 1 ? { row: pos.row, col: pos.col + 1 } : pos.row < rows - 1 ? { row: pos.row + 1, col: 0 } : pos;
    }
    default:
      return null;
  }
}

/** Splits pasted text into rows of cells (spreadsheets copy tab-separated cells, newline-separated rows). */
export function pastedBlock(text: string): string[][] {
  const lines = text.replace(/\r\n?/g, "\n").replace(/\n+$/, "").split("\n");
  return lines.map((l) => l.split("\t"));
}

/** Whether pasted text is more than one cell (so the grid spreads it instead of the input taking it). */
export const isBlock = (text: string): boolean => /[\t\n\r]/.test(text.replace(/[\r\n]+$/, ""));

/**
 * Where each pasted cell lands, from `from`: row by row down, cell by cell right. Cells
 * that would fall outside the grid are counted, not placed.
 */
export function placeBlock(block: string[][], from: GridPos, rows: number, cols: number): { placed: Array<GridPos & { text: string }>; outside: number } {
  const placed: Array<GridPos & { text: string }> = [];
  let outside = 0;
  block.forEach((cells, i) =>
    cells.forEach((text, j) => {
      const row = from.row + i;
      const col = from.col + j;
      if (row < rows && col < cols) placed.push({ row, col, text });
      else outside++;
    }),
  );
  return { placed, outside };
}
