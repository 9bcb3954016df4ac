/**
 * The run sheet per vial: for every run (in run order) its temperature and final volume,
 * and for every component the amount (mmol), the mass of material as supplied (mg,
 * purity-corrected) and its volume (µL; solids have none). The header says how each
 * component is dispensed (stock, master mix, solid, neat). Used by the editor's preview,
 * the plan page and the prep screens.
 */
import type { RunSheet } from "@/lib/chemistry/run-sheet";
import { celsius, microlitres, millimoles, milligrams } from "./format";

const HOW: Record<string, string> = { stock: "stock", "master-mix": "master mix", solid: "solid, per vial", neat: "neat, as supplied" };

export function RunSheetTable({ sheet, testId = "run-sheet", highlight }: { sheet: Pick<RunSheet, "runs" | "components">; testId?: string; highlight?: ReadonlySet<number> }) {
  const runs = [...sheet.runs].sort((a, b) => a.runOrder - b.runOrder);
  return (
    <div className="relative overflow-x-auto rounded-lg border border-ink-line bg-paper-card">
      <table className="w-full border-collapse text-sm" data-testid={testId}>
        <thead>
          <tr className="border-b border-ink-line bg-paper-deep/60 text-left text-ink-soft">
            <th scope="col" rowSpan={2} className="px-2 py-1.5 font-medium">Run</th>
            <th scope="col" rowSpan={2} className="px-2 py-1.5 font-medium">Order</th>
            <th scope="col" rowSpan={2} className="px-2 py-1.5 text-right font-medium">Temperature</th>
            <th scope="col" rowSpan={2} className="px-2 py-1.5 text-right font-medium">Final volume</th>
            {sheet.components.map((c) => (
              <th key={c.id} scope="colgroup" colSpan={3} className="border-l border-ink-line px-2 pt-1.5 text-center font-medium">
                <span className="block max-w-56 truncate" title={c.name}>
                  {c.name}
                </span>
                <span className="block text-xs font-normal text-ink-faint">
                  {c.role} · {HOW[c.dispensedAs] ?? c.dispensedAs}
                  {c.dispensedAs === "stock" || c.dispensedAs === "master-mix" ? ` ${c.source}` : ""}
                </span>
              </th>
            ))}
          </tr>
          <tr className="border-b border-ink-line bg-paper-deep/60 text-ink-soft">
            {sheet.components.map((c) => [
              <th key={`${c.id}-n`} scope="col" className="border-l border-ink-line px-2 pb-1.5 text-right text-xs font-normal">amount</th>,
              <th key={`${c.id}-m`} scope="col" className="px-2 pb-1.5 text-right text-xs font-normal">mass</th>,
              <th key={`${c.id}-v`} scope="col" className="px-2 pb-1.5 text-right text-xs font-normal">volume</th>,
            ])}
          </tr>
        </thead>
        <tbody>
          {runs.map((r) => (
            <tr key={r.run} className={`border-b border-ink-line/60 last:border-0 ${highlight?.has(r.run) ? "bg-blocks-bg/60" : ""}`} data-testid={`${testId}-run-${r.run}`}>
              <td className="num px-2 py-1 text-right">{r.run}</td>
              <td className="num px-2 py-1 text-right">{r.runOrder}</td>
              <td className="num whitespace-nowrap px-2 py-1 text-right">{celsius(r.temperatureC)}</td>
              <td className="num whitespace-nowrap px-2 py-1 text-right">{microlitres(r.finalVolumeUl)}</td>
              {sheet.components.map((c) => {
                const a = r.components.find((x) => x.id === c.id);
                return [
                  <td key={`${c.id}-n`} className="num whitespace-nowrap border-l border-ink-line/60 px-2 py-1 text-right" data-testid={`${testId}-${r.run}-${c.id}-mmol`}>
                    {a ? millimoles(a.mmol) : "—"}
                  </td>,
                  <td key={`${c.id}-m`} className="num whitespace-nowrap px-2 py-1 text-right" data-testid={`${testId}-${r.run}-${c.id}-mg`}>
                    {a?.massMg == null ? "—" : milligrams(a.massMg)}
                  </td>,
                  <td key={`${c.id}-v`} className="num whitespace-nowrap px-2 py-1 text-right" data-testid={`${testId}-${r.run}-${c.id}-ul`}>
                    {a?.volumeUl == null ? "—" : microlitres(a.volumeUl)}
                  </td>,
                ];
              })}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}
