/**
 * Per-run pressure estimates against the vessel's rating (issue 11, the review page): for
 * each run its set temperature, the estimated absolute pressure in the sealed vessel
 * (solvent vapour + heated headspace air + released gas; lib/hazards/sealed-vessel.ts via
 * the caution report's `perRun`) and the vapour part, against the rating × the lab's
 * safety factor — the limit above which the pressure caution blocks release — and the
 * rating itself; and the fill at temperature.
 */
import type { PlanView } from "@/lib/plans/view";

const bar = (x: number | null) => (x === null ? "—" : x.toFixed(2));

export function PressureTable({ plan }: { plan: Pick<PlanView, "perRun" | "runSheet" | "document"> }) {
  if (!plan.runSheet) return null;
  const vessel = plan.runSheet.vessel;
  const factor = plan.document.thresholds.safetyFactor;
  const limit = vessel.ratedBar * factor;
  const temperature = new Map(plan.runSheet.runs.map((r) => [r.run, r.temperatureC]));
  if (!vessel.sealed) return <p className="text-sm text-ink-soft">The vessel ({vessel.name}) is not sealed: no pressure builds up.</p>;
  const worst = Math.max(...plan.perRun.map((p) => p.totalBar ?? 0));
  return (
    <div className="flex flex-col gap-2">
      <p className="text-sm text-ink-soft">
        {vessel.name}: rated <span className="num">{vessel.ratedBar} bar</span>; with the lab&apos;s safety factor <span className="num">{factor}</span> the limit is{" "}
        <span className="num font-medium text-ink">{limit.toFixed(2)} bar</span>. Highest estimate <span className="num font-medium text-ink">{worst.toFixed(2)} bar</span> (absolute).
        {vessel.confirmWithSupplier && <span className="text-caution"> The rating is not confirmed by the supplier.</span>}
      </p>
      <div className="max-h-96 overflow-auto rounded-md border border-ink-line">
        <table className="w-full text-sm" data-testid="pressure-table">
          <thead className="sticky top-0 bg-paper-card">
            <tr className="border-b border-ink-line text-left text-ink-soft">
              <th className="px-2 py-1 text-right font-medium">Run</th>
              <th className="px-2 py-1 text-right font-medium">Temperature</th>
              <th className="px-2 py-1 text-right font-medium">Total</th>
              <th className="px-2 py-1 text-right font-medium">Vapour</th>
              <th className="px-2 py-1 font-medium">Against the limit</th>
              <th className="px-2 py-1 text-right font-medium">Fill hot</th>
            </tr>
          </thead>
          <tbody>
            {plan.perRun.map((p) => {
              const share = p.totalBar === null ? 0 : Math.min(1, p.totalBar / vessel.ratedBar);
              const over = p.totalBar !== null && p.totalBar > limit;
              const near = p.totalBar !== null && !over && p.totalBar > 0.8 * limit;
              const tone = over ? "bg-blocks" : near ? "bg-caution" : "bg-ok";
              return (
                <tr key={p.run} className="border-b border-ink-line/60 last:border-0" data-testid="pressure-row">
                  <td className="num px-2 py-1 text-right">{p.run}</td>
                  <td className="num px-2 py-1 text-right whitespace-nowrap">{temperature.get(p.run)?.toFixed(0) ?? "—"} °C</td>
                  <td className={`num px-2 py-1 text-right whitespace-nowrap ${over ? "font-medium text-blocks" : ""}`}>{bar(p.totalBar)} bar</td>
                  <td className="num px-2 py-1 text-right whitespace-nowrap">{bar(p.vaporBar)} bar</td>
                  <td className="px-2 py-1">
                    <div className="relative h-2.5 w-40 rounded bg-paper-deep" aria-hidden="true">
                      <div className={`absolute inset-y-0 left-0 rounded ${tone}`} style={{ width: `${(share * 100).toFixed(1)}%` }} />
                      <div className="absolute inset-y-[-2px] w-px bg-ink" style={{ left: `${(factor * 100).toFixed(1)}%` }} title="limit" />
                    </div>
                    <span className="sr-only">{over ? "over the limit" : near ? "near the limit" : "under the limit"}</span>
                    {over && <span className="ml-1 text-xs text-blocks">over the limit</span>}
                  </td>
                  <td className="num px-2 py-1 text-right">{p.fillFractionHot === null ? "—" : `${(p.fillFractionHot * 100).toFixed(0)} %`}</td>
                </tr>
              );
            })}
          </tbody>
        </table>
      </div>
      <p className="text-xs text-ink-faint">The bar runs from 0 to the vessel&apos;s rating; the black mark is the limit (rating × safety factor).</p>
    </div>
  );
}
