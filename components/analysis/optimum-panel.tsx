"use client";

import type { AnalysisAnswer } from "@/lib/results/analysis";
import { Banner } from "@/components/ui/banner";
import { SAFETY_NOTICE } from "@/components/shell/safety-notice";
import { sig, withUnit } from "./format";

/**
 * The best conditions of the fitted model inside the studied region and the plan's safe
 * envelope (lib/surface `findOptimum` with the hazard engine's `pointSafety`), with the
 * prediction's confidence and prediction intervals and the optimiser's warnings.
 */
export function OptimumPanel({ a, factorUnits }: { a: AnalysisAnswer; factorUnits: Record<string, string> }) {
  const o = a.optimum;
  const unit = a.analysis.response.unit;
  const goal = a.analysis.response.goal === "minimize" ? "lowest" : a.analysis.response.goal === "target" ? "closest to target" : "highest";
  return (
    <section className="flex flex-col gap-2" aria-label="Best conditions" data-testid="optimum-panel">
      <h2>Best conditions ({goal} predicted {a.analysis.response.name})</h2>
      {!o ? (
        <Banner tone="info">{a.analysis.optimumNote ?? "No optimum."}</Banner>
      ) : (
        <div className="grid gap-3 rounded-lg border border-ink-line bg-paper-card p-3 md:grid-cols-[2fr_3fr]">
          <table className="text-sm">
            <tbody>
              {Object.entries(o.natural).map(([f, v]) => (
                <tr key={f}>
                  <td className="py-0.5 pr-3 font-mono text-xs">{f}</td>
                  <td className="num py-0.5 text-right">{withUnit(v, factorUnits[f])}</td>
                  <td className="num py-0.5 pl-3 text-right text-ink-faint">coded {sig(o.coded[f] ?? null, 3)}</td>
                </tr>
              ))}
            </tbody>
          </table>
          <div className="flex flex-col gap-1 text-sm">
            <p>
              Predicted {a.analysis.response.name}: <span className="num font-semibold">{withUnit(o.predicted, unit)}</span>
            </p>
            <p className="num text-ink-soft">
              95 % confidence interval {o.ci95 ? `${sig(o.ci95[0])} … ${sig(o.ci95[1])}` : "—"} · 95 % prediction interval for one run {o.pi95 ? `${sig(o.pi95[0])} … ${sig(o.pi95[1])}` : "—"}
            </p>
            <p className="text-ink-soft">
              {o.safety.checked
                ? `Checked against the safe envelope of ${a.analysis.envelopeOf?.name ?? "the plan"} (${o.safety.checks} point${o.safety.checks === 1 ? "" : "s"} judged by the hazard engine).`
                : "Not checked against a safe envelope."}
            </p>
            {a.analysis.optimumNote && <p className="text-caution">{a.analysis.optimumNote}</p>}
            {o.safety.checked && <p className="text-xs text-ink-faint">{SAFETY_NOTICE}</p>}
            {o.warnings.length > 0 && (
              <ul className="list-disc pl-4 text-caution" data-testid="optimum-warnings">
                {o.warnings.map((w) => (
                  <li key={w}>{w}</li>
                ))}
              </ul>
            )}
          </div>
        </div>
      )}
    </section>
  );
}
