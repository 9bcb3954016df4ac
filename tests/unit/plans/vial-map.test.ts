import { describe, expect, it } from "vitest";
import { AppError } from "@/lib/errors/app-error";
import { BLOCK_FORMATS, positionLabel, vialMap, type VialMapRun } from "@/lib/plans/vial-map";

// Invented plans. Block formats: 24 = 4 × 6, 48 = 6 × 8, 96 = 8 × 12, rows lettered A…,
// columns numbered 1… (common practice: the ANSI/SLAS microplate footprint and its A1 naming).

/** Runs 1…n at the given temperatures, with run orders given (default: reversed). */
function runs(temps: number[], runOrders?: number[]): VialMapRun[] {
  return temps.map((t, i) => ({ run: i + 1, runOrder: runOrders?.[i] ?? temps.length - i, temperatureC: t }));
}

describe("vial map: formats and labels", () => {
  it("has the rows × columns of the usual block formats (common practice)", () => {
    expect(BLOCK_FORMATS[24]).toEqual({ rows: 4, columns: 6 });
    expect(BLOCK_FORMATS[48]).toEqual({ rows: 6, columns: 8 });
    expect(BLOCK_FORMATS[96]).toEqual({ rows: 8, columns: 12 });
    expect(positionLabel(0, 0)).toBe("A1");
    expect(positionLabel(1, 2)).toBe("B3");
    expect(positionLabel(7, 11)).toBe("H12");
  });

  it("lists every position of a 96 block once, A1 … H12", () => {
    const m = vialMap(runs([80]), { positions: 96 });
    const labels = m.blocks[0]!.positions.map((p) => p.label);
    expect(labels).toHaveLength(96);
    expect(new Set(labels).size).toBe(96);
    expect(labels[0]).toBe("A1");
    expect(labels[12]).toBe("B1");
    expect(labels[95]).toBe("H12");
  });

  it("refuses a format that is not 24, 48 or 96, naming positions", () => {
    const err = (() => {
      try {
        vialMap(runs([80]), { positions: 30 });
      } catch (e) {
        return e;
      }
    })();
    expect(err).toBeInstanceOf(AppError);
    expect((err as AppError).issues[0]?.path).toBe("positions");
  });

  it("refuses a repeated run number", () => {
    expect(() => vialMap([{ run: 1, runOrder: 1, temperatureC: 60 }, { run: 1, runOrder: 2, temperatureC: 60 }], { positions: 24 })).toThrow(/repeats run 1/);
  });
});

describe("vial map: grouping, order, overflow", () => {
  it("puts runs at one set temperature in one block, coldest block first", () => {
    // Eight runs at 100, 60 and 80 °C, interleaved.
    const r = runs([100, 60, 80, 60, 100, 80, 60, 100], [1, 2, 3, 4, 5, 6, 7, 8]);
    const m = vialMap(r, { positions: 24 });
    expect(m.temperatures).toEqual([60, 80, 100]);
    expect(m.blocks.map((b) => [b.index, b.temperatureC, b.group, b.parts])).toEqual([
      [1, 60, 0, 1],
      [2, 80, 1, 1],
      [3, 100, 2, 1],
    ]);
    for (const p of m.placements) expect(m.blocks[p.block - 1]!.temperatureC).toBe(p.temperatureC);
  });

  it("places the runs of a group in run order, row by row", () => {
    // Runs 1…5 at 60 °C with run orders 5, 3, 1, 4, 2: run 3 goes first (A1), then 5, 2, 4, 1.
    const m = vialMap(runs([60, 60, 60, 60, 60], [5, 3, 1, 4, 2]), { positions: 24 });
    const pos = Object.fromEntries(m.placements.map((p) => [p.run, p.position]));
    expect(pos).toEqual({ 3: "A1", 5: "A2", 2: "A3", 4: "A4", 1: "A5" });
    // A single block: the vial label is the position alone.
    expect(m.placements.every((p) => p.vial === p.position)).toBe(true);
  });

  it("fills column by column when asked", () => {
    const m = vialMap(runs([60, 60, 60, 60, 60, 60], [1, 2, 3, 4, 5, 6]), { positions: 24, fill: "columns" });
    expect(m.placements.map((p) => p.position)).toEqual(["A1", "B1", "C1", "D1", "A2", "B2"]);
  });

  it("continues a group in a second block of the same temperature when the first is full", () => {
    // 30 runs at 90 °C and 2 at 40 °C in 24-position blocks: 40 °C block, then 90 °C 1 of 2 and 2 of 2.
    const temps = [...Array.from({ length: 30 }, () => 90), 40, 40];
    const order = temps.map((_, i) => i + 1);
    const m = vialMap(runs(temps, order), { positions: 24 });
    expect(m.blocks.map((b) => [b.temperatureC, b.part, b.parts, b.positions.filter((p) => p.run !== null).length])).toEqual([
      [40, 1, 1, 2],
      [90, 1, 2, 24],
      [90, 2, 2, 6],
    ]);
    // Run 24 (the 24th in run order at 90 °C) is the last position of block 2; run 25 is A1 of block 3.
    const at = (run: number) => m.placements.find((p) => p.run === run)!;
    expect([at(24).block, at(24).position]).toEqual([2, "D6"]);
    expect([at(25).block, at(25).position, at(25).vial]).toEqual([3, "A1", "3:A1"]);
    // Every run is placed exactly once, and no position holds two runs.
    const vials = m.placements.map((p) => p.vial);
    expect(new Set(vials).size).toBe(32);
  });

  it("places 96 runs at two temperatures into two 96-position blocks without overflow", () => {
    const temps = Array.from({ length: 96 }, (_, i) => (i % 2 === 0 ? 70 : 110));
    const m = vialMap(runs(temps), { positions: 96 });
    expect(m.blocks).toHaveLength(2);
    expect(m.blocks.map((b) => b.positions.filter((p) => p.run !== null).length)).toEqual([48, 48]);
    // 48 runs fill rows A–D (12 columns each): the last filled position is D12.
    expect(m.blocks[0]!.positions.filter((p) => p.run !== null).at(-1)!.label).toBe("D12");
  });

  it("treats decoded temperatures equal to a thousandth of a kelvin as one set point", () => {
    const m = vialMap(
      [
        { run: 1, runOrder: 1, temperatureC: 61.71572875253809 },
        { run: 2, runOrder: 2, temperatureC: 61.7157287525381 },
      ],
      { positions: 24 },
    );
    expect(m.blocks).toHaveLength(1);
  });
});
