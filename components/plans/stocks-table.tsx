/**
 * The stock solutions and master mixes to prepare: per stock what to weigh or measure of
 * each component, its concentration, the volume to make up (what the vials take plus the
 * overage and the dead volume) and, for a master mix, the one volume dispensed into every
 * vial; then the run sheet's notes (solids weighed per vial, amounts below the weighing or
 * pipetting limits). Used by the editor's preview, the plan page and the prep screens.
 */
import type { ReactNode } from "react";
import type { PlanNote, Stock } from "@/lib/chemistry/dispensing";
import { microlitres, milligrams, significant } from "./format";
import { runList } from "./run-list";

function makeUp(s: Stock): string {
  return s.finalVolumeUl >= 1000 ? `${significant(s.finalVolumeUl / 1000, 3)} mL` : microlitres(s.finalVolumeUl);
}

/** What to take of a member: the mass to weigh, the volume to measure, or both (a neat liquid can be weighed or measured). */
function take(m: Stock["members"][number]): ReactNode {
  if (m.weighMg !== null && m.measureUl !== null) {
    return (
      <>
        weigh {milligrams(m.weighMg)} <span className="text-ink-soft">or measure {microlitres(m.measureUl)}</span>
      </>
    );
  }
  if (m.weighMg !== null) return <>weigh {milligrams(m.weighMg)}</>;
  if (m.measureUl !== null) return <>measure {microlitres(m.measureUl)}</>;
  return "—";
}

export function StocksTable({ stocks, notes, testId = "stocks" }: { stocks: readonly Stock[]; notes: readonly PlanNote[]; testId?: string }) {
  return (
    <div className="flex flex-col gap-3" data-testid={testId}>
      {stocks.length === 0 && <p className="text-sm text-ink-soft">No stocks or master mixes: every component is weighed or dispensed into each vial directly.</p>}
      {stocks.map((s) => (
        <section key={s.id} className="rounded-lg border border-ink-line bg-paper-card" data-testid={`${testId}-${s.id}`}>
          <header className="flex flex-wrap items-baseline justify-between gap-x-4 gap-y-1 border-b border-ink-line px-3 py-2">
            <h3 className="text-sm font-semibold">
              <span className="font-mono">{s.id}</span> {s.kind === "master-mix" ? "master mix" : "stock solution"} <span className="font-normal text-ink-soft">in {s.solvent}</span>
            </h3>
            <p className="num text-sm">
              Make up to <strong data-testid={`${testId}-${s.id}-volume`}>{makeUp(s)}</strong>
              <span className="text-ink-soft">
                {" "}
                (vials take {microlitres(s.neededVolumeUl)}, + {significant(s.overagePercent, 3)} % overage + {microlitres(s.deadVolumeUl)} dead volume)
              </span>
            </p>
          </header>
          <div className="overflow-x-auto">
            <table className="w-full border-collapse text-sm">
              <thead>
                <tr className="border-b border-ink-line text-left text-ink-soft">
                  <th scope="col" className="px-3 py-1.5 font-medium">Component</th>
                  <th scope="col" className="px-3 py-1.5 text-right font-medium">Take</th>
                  <th scope="col" className="px-3 py-1.5 text-right font-medium">Concentration</th>
                  <th scope="col" className="px-3 py-1.5 text-right font-medium">Amount</th>
                </tr>
              </thead>
              <tbody>
                {s.members.map((m) => (
                  <tr key={m.id} className="border-b border-ink-line/60 last:border-0">
                    <td className="min-w-40 px-3 py-1">{m.name}</td>
                    <td className="num whitespace-nowrap px-3 py-1 text-right" data-testid={`${testId}-${s.id}-${m.id}-take`}>
                      {take(m)}
                    </td>
                    <td className="num whitespace-nowrap px-3 py-1 text-right">
                      {significant(m.concentrationM, 3)} M <span className="text-ink-soft">({significant(m.concentrationMgPerMl, 4)} mg/mL)</span>
                    </td>
                    <td className="num whitespace-nowrap px-3 py-1 text-right">{significant(m.mmol, 4)} mmol</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          {(s.dispenseVolumeUl !== null || s.notes.length > 0) && (
            <div className="flex flex-col gap-0.5 border-t border-ink-line px-3 py-1.5 text-xs text-ink-soft">
              {s.dispenseVolumeUl !== null && <p className="num">Dispense {microlitres(s.dispenseVolumeUl)} into every vial.</p>}
              {s.notes.map((n) => (
                <p key={n}>{n}</p>
              ))}
            </div>
          )}
        </section>
      ))}
      {notes.length > 0 && (
        <section className="rounded-lg border border-ink-line bg-paper-card px-3 py-2" data-testid={`${testId}-notes`}>
          <h3 className="mb-1 text-sm font-semibold">Notes on weighing and dispensing</h3>
          <ul className="flex flex-col gap-1.5 text-sm">
            {notes.map((n) => (
              <li key={`${n.code}-${n.component ?? ""}-${n.message}`}>
                <span className={`mr-1.5 rounded px-1 py-0.5 text-xs font-medium ${n.severity === "warning" ? "bg-caution-bg text-caution" : "bg-paper-deep text-ink-soft"}`}>{n.severity === "warning" ? "Check" : "Note"}</span>
                {n.message} <span className="num text-ink-soft">({runList(n.runs)})</span>
                <span className="block text-xs text-ink-soft">{n.remedy}</span>
              </li>
            ))}
          </ul>
        </section>
      )}
    </div>
  );
}
