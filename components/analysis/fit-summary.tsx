"use client";

import type { AnalysisAnswer } from "@/lib/results/analysis";
import type { AnovaRow } from "@/lib/stats/fit";
import { pValue, sig, termLabel } from "./format";

/** R², adjusted R², predicted R², RMSE and the model's size. */
export function FitStats({ a }: { a: AnalysisAnswer }) {
  const s = a.stats;
  const item = (label: string, value: string, test: string) => (
    <div className="rounded-md border border-ink-line bg-paper-card px-3 py-2" data-testid={test}>
      <dt className="text-xs text-ink-faint">{label}</dt>
      <dd className="num text-lg font-semibold">{value}</dd>
    </div>
  );
  const unit = a.analysis.response.unit;
  return (
    <dl className="grid grid-cols-2 gap-2 sm:grid-cols-3 lg:grid-cols-6" data-testid="fit-stats">
      {item("R²", sig(s.r2, 4), "stat-r2")}
      {item("Adjusted R²", sig(s.adjR2, 4), "stat-adj-r2")}
      {item("Predicted R²", sig(s.predR2, 4), "stat-pred-r2")}
      {item(`RMSE${a.transform === "ln" ? " (ln scale)" : unit ? ` (${unit})` : ""}`, sig(s.rmse, 4), "stat-rmse")}
      {item("Runs used", `${s.n}`, "stat-n")}
      {item("Parameters · residual df", `${s.p} · ${s.dfResidual}`, "stat-p")}
    </dl>
  );
}

/** The ANOVA table: blocks, model, residual split into lack of fit and pure error, total. */
export function AnovaTable({ a }: { a: AnalysisAnswer }) {
  const rows: Array<[string, AnovaRow | { df: number; ss: number } | null, boolean]> = [
    ["Blocks (plans)", a.anova.blocks, false],
    ["Model", a.anova.model, false],
    ["Residual", a.anova.residual, false],
    ["Lack of fit", a.anova.lackOfFit, true],
    ["Pure error", a.anova.pureError, true],
    ["Total (corrected)", a.anova.total, false],
  ];
  return (
    <div className="overflow-x-auto rounded-lg border border-ink-line bg-paper-card" data-testid="anova-table">
      <table className="w-full text-sm">
        <thead>
          <tr className="border-b border-ink-line text-left text-ink-soft">
            <th className="px-3 py-1.5 font-medium">Source</th>
            <th className="px-2 py-1.5 text-right font-medium">df</th>
            <th className="px-2 py-1.5 text-right font-medium">Sum of squares</th>
            <th className="px-2 py-1.5 text-right font-medium">Mean square</th>
            <th className="px-2 py-1.5 text-right font-medium">F</th>
            <th className="px-3 py-1.5 text-right font-medium">p</th>
          </tr>
        </thead>
        <tbody>
          {rows.map(([label, r, indent]) =>
            r === null ? null : (
              <tr key={label} className="border-b border-ink-line/60 last:border-0">
                <td className={`px-3 py-1 ${indent ? "pl-7 text-ink-soft" : ""}`}>{label}</td>
                <td className="num px-2 py-1 text-right">{r.df}</td>
                <td className="num px-2 py-1 text-right">{sig(r.ss, 5)}</td>
                <td className="num px-2 py-1 text-right">{"ms" in r ? sig(r.ms, 4) : ""}</td>
                <td className="num px-2 py-1 text-right">{"f" in r ? sig(r.f ?? null, 4) : ""}</td>
                <td className="num px-3 py-1 text-right">{"p" in r ? pValue(r.p ?? null) : ""}</td>
              </tr>
            ),
          )}
        </tbody>
      </table>
      {a.anova.lackOfFit === null && <p className="px-3 pb-2 text-xs text-ink-faint">No replicated points: lack of fit cannot be separated from pure error.</p>}
    </div>
  );
}

/** The curvature check of a two-level factorial with centre points. */
export function CurvatureCheck({ a }: { a: AnalysisAnswer }) {
  const c = a.curvature;
  if (!c) return null;
  const curved = c.p !== null && c.p <= 0.05;
  return (
    <div className={`rounded-lg border px-3 py-2 text-sm ${curved ? "border-caution/30 bg-caution-bg text-caution" : "border-ink-line bg-paper-card"}`} data-testid="curvature">
      <p className="font-medium">Curvature check (centre points against the factorial points)</p>
      <p className="num">
        mean of {c.nFactorial} factorial runs {sig(c.meanFactorial)} · mean of {c.nCenter} centre runs {sig(c.meanCenter)} · SS {sig(c.ss)} on 1 df · F {sig(c.f)} · p {pValue(c.p)}
      </p>
      <p>{curved ? "The centre points sit off the plane of the factorial points: the surface is curved; a second-order design (add axial runs) can model it." : "No evidence of curvature at α = 0.05."}</p>
    </div>
  );
}

/** Backward elimination, step by step, with why each term left or stayed. */
export function PruningSteps({ a }: { a: AnalysisAnswer }) {
  if (!a.pruning) return null;
  return (
    <div className="rounded-lg border border-ink-line bg-paper-card px-3 py-2" data-testid="pruning-steps">
      <p className="text-sm font-medium">
        Pruning at α = {a.pruning.alpha}
        {a.pruning.hierarchy ? ", keeping the model hierarchical" : ", without hierarchy"}
      </p>
      <ol className="mt-1 flex flex-col gap-1 text-sm">
        {a.pruning.steps.map((s) => (
          <li key={s.step} className="flex gap-2" data-testid="pruning-step">
            <span className="num w-6 shrink-0 text-right text-ink-faint">{s.step}.</span>
            <span>
              {s.removed ? (
                <>
                  <span className="font-mono text-xs">{termLabel(s.removed)}</span> removed —{" "}
                </>
              ) : null}
              {s.reason}
              {s.removed !== null && s.heldByHierarchy.length > 0 && (
                <span className="text-ink-soft" title={s.heldByHierarchy.map((h) => `${termLabel(h.term)} (p ${pValue(h.p)}) is kept by ${h.heldBy.map(termLabel).join(", ")}`).join("\n")}>
                  {" "}
                  Above α but kept for hierarchy: {s.heldByHierarchy.map((h) => termLabel(h.term)).join(", ")}.
                </span>
              )}
              <span className="num text-ink-faint">
                {" "}
                · residual df {s.dfResidual}, RMSE {sig(s.rmse, 3)}
              </span>
            </span>
          </li>
        ))}
      </ol>
    </div>
  );
}
