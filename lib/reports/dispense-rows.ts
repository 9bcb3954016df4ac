/**
 * The dispense steps of a run sheet as rows, in the order of addition: every vial's
 * first step, then every vial's second step, …, the vials of a step in map order
 * (block, then A1, A2, …). One list that the prep sheet's dispense table and the
 * worklist CSV both print, so the two never disagree; the vial position is the vial
 * map's (lib/plans/vial-map.ts). Pure.
 */
import type { Dispense, RunSheet } from "../chemistry";
import type { VialMap } from "../plans/vial-map";

export interface DispenseRow {
  /** Position in the order of addition within the vial (1-based). */
  step: number;
  /** The block's number and the position in it ("B3"); `vial` is unique in the plan ("B3" or "2:B3"). */
  block: number;
  position: string;
  vial: string;
  run: number;
  kind: Dispense["kind"];
  /** What to add, as the run sheet names it. */
  what: string;
  /** The amount to add and its unit: mg for solids weighed into the vial, µL for every liquid. */
  amount: number | null;
  unit: "mg" | "µL";
  /** Where it comes from: a stock or master mix id (S1, M1), a component id, or a solvent name. */
  source: string;
  /** The source in words: "stock S1", "master mix M1", "solid as supplied", "neat liquid as supplied", "solvent". */
  from: string;
}

const FROM: Record<Dispense["kind"], (source: string) => string> = {
  stock: (s) => `stock ${s}`,
  "master-mix": (s) => `master mix ${s}`,
  solid: () => "solid as supplied",
  neat: () => "neat liquid as supplied",
  solvent: (s) => `solvent ${s}`,
};

/** Every dispense of every vial as one row, sorted by step, then block and position. */
export function dispenseRows(sheet: Pick<RunSheet, "runs">, map: VialMap): DispenseRow[] {
  const place = new Map(map.placements.map((p) => [p.run, p]));
  const order = new Map<string, number>();
  for (const b of map.blocks) b.positions.forEach((p, i) => order.set(`${b.index}:${p.label}`, b.index * 10000 + i));
  const rows: Array<DispenseRow & { rank: number }> = [];
  for (const r of sheet.runs) {
    const p = place.get(r.run);
    if (!p) throw new Error(`run ${r.run} is not on the vial map`);
    for (const d of r.dispense) {
      const solid = d.kind === "solid";
      rows.push({
        step: d.step,
        block: p.block,
        position: p.position,
        vial: p.vial,
        run: r.run,
        kind: d.kind,
        what: d.name,
        amount: solid ? d.massMg : d.volumeUl,
        unit: solid ? "mg" : "µL",
        source: d.source,
        from: FROM[d.kind](d.source),
        rank: order.get(`${p.block}:${p.position}`) ?? 0,
      });
    }
  }
  rows.sort((a, b) => a.step - b.step || a.rank - b.rank);
  return rows.map(({ rank: _rank, ...row }) => row);
}
