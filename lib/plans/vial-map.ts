/**
 * The vial map: where each run of a plan sits in the heating blocks. One rule that the
 * plan page's map, the prep sheet's map and the dispense worklist's "vial position"
 * column all use, so the three always agree.
 *
 * Rule:
 * - runs are grouped by their set temperature (runs at the same set temperature share
 *   a block: temperature is the hard-to-change factor, PRODUCT.md "Design");
 * - groups are laid out coldest first, one block per temperature; a group with more runs
 *   than the block has positions continues in a second (third, …) block of the same
 *   temperature;
 * - within a group the runs are placed in run order (the seeded random order of the
 *   design; standard order breaks ties), filling the block row by row — A1, A2, … A6,
 *   B1, … — or, on request, column by column (A1, B1, …);
 * - block formats are the usual footprints of parallel-reaction blocks and microplates:
 *   24 positions = 4 rows × 6 columns, 48 = 6 × 8, 96 = 8 × 12, rows lettered from A,
 *   columns numbered from 1 (common practice: the ANSI/SLAS microplate footprint and its
 *   A1 well naming).
 *
 * Pure: imports nothing from the app's frameworks.
 */
import { AppError } from "../errors/app-error";

/** The block formats Tareline draws: positions → rows × columns (common practice). */
export const BLOCK_FORMATS = {
  24: { rows: 4, columns: 6 },
  48: { rows: 6, columns: 8 },
  96: { rows: 8, columns: 12 },
} as const;

export type BlockPositions = keyof typeof BLOCK_FORMATS;

/** What the rule needs of a run (a run sheet's run has all of it). */
export interface VialMapRun {
  /** The run's number in the run sheet (its standard order). */
  run: number;
  runOrder: number;
  temperatureC: number;
}

export interface VialMapOptions {
  /** Positions of one block: 24, 48 or 96. */
  positions: number;
  /** Fill order within a block (default "rows": A1, A2, …). */
  fill?: "rows" | "columns";
}

/** One position of a block. */
export interface VialPosition {
  /** "B3": row letter then column number. */
  label: string;
  /** 0-based row and column. */
  row: number;
  column: number;
  /** The run placed here, or null for an empty position. */
  run: number | null;
}

/** One physical block at one set temperature. */
export interface VialBlock {
  /** 1-based number of the block across the plan. */
  index: number;
  /** The set temperature of every run in the block (°C). */
  temperatureC: number;
  /** 0-based index of its temperature group (coldest first): the colour of the map. */
  group: number;
  /** 1-based count of this block within its temperature group, and how many blocks the group has. */
  part: number;
  parts: number;
  rows: number;
  columns: number;
  positions: VialPosition[];
}

/** Where one run sits. */
export interface RunPlacement {
  run: number;
  runOrder: number;
  temperatureC: number;
  /** The block's `index`. */
  block: number;
  /** The position label in that block, e.g. "B3". */
  position: string;
  /** Block and position together, unique in the plan: "B3" for a single block, "2:B3" otherwise. */
  vial: string;
}

export interface VialMap {
  format: { positions: BlockPositions; rows: number; columns: number };
  fill: "rows" | "columns";
  /** The set temperatures, coldest first (one temperature group each). */
  temperatures: number[];
  blocks: VialBlock[];
  /** Every run's place, in the order of the input runs. */
  placements: RunPlacement[];
}

/** Row letters beyond Z continue AA, AB, … (not needed for the formats above, kept total). */
export function rowLetter(row: number): string {
  let n = row;
  let s = "";
  do {
    s = String.fromCharCode(65 + (n % 26)) + s;
    n = Math.floor(n / 26) - 1;
  } while (n >= 0);
  return s;
}

/** The label of a position: "A1" for row 0, column 0. */
export function positionLabel(row: number, column: number): string {
  return `${rowLetter(row)}${column + 1}`;
}

/** Set temperatures equal to a thousandth of a kelvin are one group (float noise from decoding). */
function temperatureKey(t: number): number {
  return Math.round(t * 1000) / 1000;
}

/**
 * Places the runs of a plan in heating blocks (the rule in the module comment).
 * Example: vialMap(sheet.runs, { positions: 24 }).placements[0] → { run: 1, block: 1, position: "A3", vial: "A3", … }
 * @throws AppError("invalid_input") naming `positions` for a format other than 24, 48 or
 *   96, and `runs.<i>` for a repeated run number or a non-finite temperature.
 */
export function vialMap(runs: readonly VialMapRun[], options: VialMapOptions): VialMap {
  const positions = options.positions;
  if (!(positions in BLOCK_FORMATS)) throw AppError.field("positions", "must be 24, 48 or 96 positions");
  const format = BLOCK_FORMATS[positions as BlockPositions];
  const fill = options.fill ?? "rows";
  const seen = new Set<number>();
  runs.forEach((r, i) => {
    if (seen.has(r.run)) throw AppError.field(`runs.${i}.run`, `repeats run ${r.run}`);
    seen.add(r.run);
    if (!Number.isFinite(r.temperatureC)) throw AppError.field(`runs.${i}.temperatureC`, "must be a finite temperature");
  });

  const groups = new Map<number, VialMapRun[]>();
  for (const r of runs) {
    const key = temperatureKey(r.temperatureC);
    const g = groups.get(key) ?? [];
    g.push(r);
    groups.set(key, g);
  }
  const temperatures = [...groups.keys()].sort((a, b) => a - b);
  const perBlock = format.rows * format.columns;
  const blocks: VialBlock[] = [];
  const byRun = new Map<number, { block: number; position: string }>();

  temperatures.forEach((t, group) => {
    const ordered = [...groups.get(t)!].sort((a, b) => a.runOrder - b.runOrder || a.run - b.run);
    const parts = Math.ceil(ordered.length / perBlock);
    for (let part = 0; part < parts; part++) {
      const index = blocks.length + 1;
      const slice = ordered.slice(part * perBlock, (part + 1) * perBlock);
      const cells: VialPosition[] = [];
      for (let row = 0; row < format.rows; row++) {
        for (let column = 0; column < format.columns; column++) {
          const k = fill === "rows" ? row * format.columns + column : column * format.rows + row;
          const run = slice[k]?.run ?? null;
          const label = positionLabel(row, column);
          cells.push({ label, row, column, run });
          if (run !== null) byRun.set(run, { block: index, position: label });
        }
      }
      blocks.push({ index, temperatureC: t, group, part: part + 1, parts, rows: format.rows, columns: format.columns, positions: cells });
    }
  });

  const single = blocks.length <= 1;
  const placements: RunPlacement[] = runs.map((r) => {
    const p = byRun.get(r.run)!;
    return {
      run: r.run,
      runOrder: r.runOrder,
      temperatureC: r.temperatureC,
      block: p.block,
      position: p.position,
      vial: single ? p.position : `${p.block}:${p.position}`,
    };
  });
  return { format: { positions: positions as BlockPositions, ...format }, fill, temperatures, blocks, placements };
}

/** The placement of a run, by its run number. */
export function placementOf(map: VialMap, run: number): RunPlacement | undefined {
  return map.placements.find((p) => p.run === run);
}
