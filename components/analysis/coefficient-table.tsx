"use client";

import { useLayoutEffect } from "react";
import type { TermEstimate } from "@/lib/stats/fit";
import { pValue, sig, termLabel } from "./format";

/** Marks the moment the coefficient table of a new fit is in the DOM (bench/analysis-page.bench.ts reads it). */
export const REFIT_MARKS = { start: "tareline:refit-start", drawn: "tareline:refit-drawn", measure: "tareline:refit" } as const;

/**
 * The coefficient table (coded units): estimate, standard error, t, p and the 95 %
 * interval drawn as a bar on a common scale with zero marked; an interval that crosses
 * zero is marked in words and colour.
 */
export function CoefficientTable({ terms, stamp }: { terms: TermEstimate[]; stamp: string }) {
  useLayoutEffect(() => {
    if (performance.getEntriesByName(REFIT_MARKS.start, "mark").length === 0) return;
    performance.mark(REFIT_MARKS.drawn);
    performance.measure(REFIT_MARKS.measure, REFIT_MARKS.start, REFIT_MARKS.drawn);
    performance.clearMarks(REFIT_MARKS.start);
  }, [stamp]);
  const rows = terms.filter((t) => t.term !== "intercept");
  const span = Math.max(1e-12, ...rows.flatMap((t) => (t.ci95 ? [Math.abs(t.ci95[0]), Math.abs(t.ci95[1])] : [Math.abs(t.estimate)])));
  const W = 280;
  const x = (v: number) => W / 2 + (v / span) * (W / 2 - 6);
  return (
    <div className="overflow-x-auto rounded-lg border border-ink-line bg-paper-card" data-testid="coefficient-table" data-stamp={stamp}>
      <table className="w-full text-sm">
        <caption className="px-3 pt-2 text-left text-xs text-ink-faint">Estimates in coded units (−1 … +1 over each factor&apos;s range); bars are 95 % intervals on one scale, the line is zero.</caption>
        <thead>
          <tr className="border-b border-ink-line text-left text-ink-soft">
            <th className="px-3 py-1.5 font-medium">Term</th>
            <th className="px-2 py-1.5 text-right font-medium">Estimate</th>
            <th className="px-2 py-1.5 text-right font-medium">Std. error</th>
            <th className="px-2 py-1.5 text-right font-medium">t</th>
            <th className="px-2 py-1.5 text-right font-medium">p</th>
            <th className="px-2 py-1.5 text-right font-medium">95 % interval</th>
            <th className="px-3 py-1.5 font-medium">
              <span className="sr-only">Interval drawn</span>
            </th>
          </tr>
        </thead>
        <tbody>
          {terms.map((t) => {
            const crosses = t.ci95 !== null && t.ci95[0] < 0 && t.ci95[1] > 0;
            return (
              <tr key={t.term} className="border-b border-ink-line/60 last:border-0" data-term={t.term} data-crosses-zero={crosses ? "true" : "false"}>
                <td className="px-3 py-1 font-mono text-xs">{termLabel(t.term)}</td>
                <td className="num px-2 py-1 text-right">{sig(t.estimate)}</td>
                <td className="num px-2 py-1 text-right">{sig(t.stdError, 3)}</td>
                <td className="num px-2 py-1 text-right">{sig(t.t, 3)}</td>
                <td className={`num px-2 py-1 text-right ${t.p !== null && t.p <= 0.05 ? "font-semibold" : ""}`}>{pValue(t.p)}</td>
                <td className="num whitespace-nowrap px-2 py-1 text-right">{t.ci95 ? `${sig(t.ci95[0], 3)} … ${sig(t.ci95[1], 3)}` : "—"}</td>
                <td className="px-3 py-1">
                  {t.term === "intercept" || !t.ci95 ? null : (
                    <span className="flex items-center gap-2">
                      <svg width={W} height={14} role="img" aria-label={`interval ${sig(t.ci95[0], 3)} to ${sig(t.ci95[1], 3)}${crosses ? ", crosses zero" : ""}`}>
                        <line x1={W / 2} x2={W / 2} y1={0} y2={14} stroke="#8f8676" strokeWidth={1} />
                        <rect x={Math.min(x(t.ci95[0]), x(t.ci95[1]))} y={3} width={Math.max(3, Math.abs(x(t.ci95[1]) - x(t.ci95[0])))} height={8} rx={2} fill={crosses ? "#f7e8c8" : "#dfe5ee"} stroke={crosses ? "#8a5607" : "#2f4a6d"} strokeWidth={1} />
                        <circle cx={x(t.estimate)} cy={7} r={2.5} fill={crosses ? "#8a5607" : "#2f4a6d"} />
                      </svg>
                      {crosses && <span className="whitespace-nowrap text-xs text-caution">crosses 0</span>}
                    </span>
                  )}
                </td>
              </tr>
            );
          })}
        </tbody>
      </table>
    </div>
  );
}
