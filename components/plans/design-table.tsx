"use client";

/**
 * The design table of a plan: every run with its standard order, run order, kind, block,
 * and each factor's coded and natural value (with its unit). Sorted by run order (the
 * order the vials are set up) or by standard order. Used by the editor's preview, the plan
 * page, and the review and prep screens.
 */
import { useMemo, useState } from "react";
import { significant, withUnit } from "./format";

export interface DesignRow {
  standardOrder: number;
  runOrder: number;
  kind: string;
  block: number | string | null;
  coded: Record<string, number>;
  natural: Record<string, number>;
}

export interface DesignFactor {
  name: string;
  unit?: string;
}

const KIND_WORD: Record<string, string> = { factorial: "factorial", axial: "axial", center: "centre", optimal: "optimal" };

export function DesignTable({ runs, factors, testId = "design-table", highlight }: { runs: readonly DesignRow[]; factors: readonly DesignFactor[]; testId?: string; highlight?: ReadonlySet<number> }) {
  const [order, setOrder] = useState<"run" | "standard">("run");
  const rows = useMemo(() => [...runs].sort((a, b) => (order === "run" ? a.runOrder - b.runOrder : a.standardOrder - b.standardOrder)), [runs, order]);
  const blocks = new Set(runs.map((r) => r.block ?? 1)).size;
  if (runs.length === 0) return <p className="text-sm text-ink-soft">No runs yet: add factors and choose a design.</p>;
  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap items-center gap-3 text-sm text-ink-soft">
        <span className="num" data-testid={`${testId}-count`}>
          {runs.length} {runs.length === 1 ? "run" : "runs"}
          {blocks > 1 ? ` in ${blocks} blocks` : ""}
        </span>
        <label className="flex items-center gap-1.5">
          <span>Sorted by</span>
          <select className="rounded-md border border-ink-edge bg-paper-card px-1.5 py-0.5 text-sm text-ink" value={order} onChange={(e) => setOrder(e.target.value as "run" | "standard")}>
            <option value="run">run order</option>
            <option value="standard">standard order</option>
          </select>
        </label>
      </div>
      <div className="relative overflow-x-auto rounded-lg border border-ink-line bg-paper-card">
        <table className="w-full border-collapse text-sm" data-testid={testId}>
          <thead>
            <tr className="border-b border-ink-line bg-paper-deep/60 text-left text-ink-soft">
              <th scope="col" rowSpan={2} className="px-2 py-1.5 font-medium">Run order</th>
              <th scope="col" rowSpan={2} className="px-2 py-1.5 font-medium">Std order</th>
              <th scope="col" rowSpan={2} className="px-2 py-1.5 font-medium">Kind</th>
              <th scope="col" rowSpan={2} className="px-2 py-1.5 font-medium">Block</th>
              {factors.map((f) => (
                <th key={f.name} scope="colgroup" colSpan={2} className="border-l border-ink-line px-2 pt-1.5 text-center font-medium">
                  <span className="font-mono text-xs">{f.name}</span>
                </th>
              ))}
            </tr>
            <tr className="border-b border-ink-line bg-paper-deep/60 text-ink-soft">
              {factors.map((f) => [
                <th key={`${f.name}-c`} scope="col" className="border-l border-ink-line px-2 pb-1.5 text-right text-xs font-normal">coded</th>,
                <th key={`${f.name}-n`} scope="col" className="px-2 pb-1.5 text-right text-xs font-normal">value</th>,
              ])}
            </tr>
          </thead>
          <tbody>
            {rows.map((r) => (
              <tr key={r.standardOrder} className={`border-b border-ink-line/60 last:border-0 ${highlight?.has(r.standardOrder) ? "bg-blocks-bg/60" : ""}`} data-testid={`${testId}-run-${r.standardOrder}`}>
                <td className="num px-2 py-1 text-right">{r.runOrder}</td>
                <td className="num px-2 py-1 text-right">{r.standardOrder}</td>
                <td className="px-2 py-1">{KIND_WORD[r.kind] ?? r.kind}</td>
                <td className="num px-2 py-1 text-right">{r.block ?? 1}</td>
                {factors.map((f) => [
                  <td key={`${f.name}-c`} className="num border-l border-ink-line/60 px-2 py-1 text-right text-ink-soft">
                    {r.coded[f.name] === undefined ? "—" : significant(r.coded[f.name]!, 4)}
                  </td>,
                  <td key={`${f.name}-n`} className="num whitespace-nowrap px-2 py-1 text-right">
                    {r.natural[f.name] === undefined ? "—" : withUnit(r.natural[f.name]!, f.unit)}
                  </td>,
                ])}
              </tr>
            ))}
          </tbody>
        </table>
      </div>
    </div>
  );
}
