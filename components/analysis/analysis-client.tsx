"use client";

import { useMemo, useState } from "react";
import { postJson } from "@/lib/client/fetch-json";
import { useAnalysis, type AnalysisParams, type AnalysisSource } from "@/lib/hooks/use-analysis";
import type { AnalysisAnswer } from "@/lib/results/analysis";
import { flaggedRuns } from "@/lib/results/diagnostic-plots";
import type { StudyResponse } from "@/lib/studies/schemas";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { CoefficientTable, REFIT_MARKS } from "./coefficient-table";
import { DiagnosticPlots } from "./diagnostic-plots";
import { AnovaTable, CurvatureCheck, FitStats, PruningSteps } from "./fit-summary";
import { sig, termLabel, withUnit } from "./format";
import { OptimumPanel } from "./optimum-panel";
import { ReportLink } from "./surface-report-link";
import { SurfacePanel } from "./surface-panel";
import type { SurfaceParams } from "@/lib/hooks/use-surface";
import { ConfirmationPanel } from "./confirmation-panel";
import { NextDesignPanel } from "./next-design-panel";

const MODELS = [
  ["linear", "Linear"],
  ["interaction", "Two-factor interactions"],
  ["quadratic", "Quadratic"],
] as const;

/**
 * The analysis page's body: model choice (a named model or terms ticked one by one),
 * pruning at α with or without hierarchy, the ln transform; the coefficient table, fit
 * statistics, ANOVA, curvature check, pruning steps, the optimum, the diagnostics as plots,
 * flagged runs, and leaving a run out with a reason (or bringing it back). Every number is
 * the analysis route's (the `fit` verb's own functions on the server).
 */
export function AnalysisClient({ labSlug, source, responses, canExclude, factorUnits, initialModel = "quadratic", planning }: { labSlug: string; source: AnalysisSource; responses: StudyResponse[]; canExclude: boolean; factorUnits: Record<string, string>; initialModel?: AnalysisParams["model"]; /** The next design's panels (confirmation runs, steepest ascent, augmentation): the study, and whether the viewer may create plans. */ planning?: { studyId: string; canPlan: boolean } }) {
  const [params, setParams] = useState<AnalysisParams>({ response: responses[0]?.name ?? "", model: initialModel, alpha: null, hierarchy: true, transform: "none", region: "cube", combine: [] });
  const [surfaceParams, setSurfaceParams] = useState<SurfaceParams | null>(null);
  const [alphaText, setAlphaText] = useState("0.05");
  const { data, error, isLoading, isValidating, mutate } = useAnalysis(labSlug, source, params);
  const [selected, setSelected] = useState<number | null>(null);
  const [reason, setReason] = useState("");
  const [actionError, setActionError] = useState<string | null>(null);
  const [busy, setBusy] = useState(false);

  const a: AnalysisAnswer | undefined = data;
  const currentTerms = useMemo(() => new Set(a ? a.terms.map((t) => t.term).concat(a.dropped, a.aliased) : []), [a]);
  const kept = useMemo(() => new Set(a ? a.terms.map((t) => t.term) : []), [a]);

  const change = (p: Partial<AnalysisParams>) => setParams((q) => ({ ...q, ...p }));
  const toggleTerm = (term: string) => {
    if (!a) return;
    performance.mark(REFIT_MARKS.start);
    const base = Array.isArray(params.model) ? params.model : [...currentTerms];
    const next = base.includes(term) ? base.filter((t) => t !== term) : [...base, term];
    const ordered = a.analysis.candidateTerms.filter((t) => next.includes(t) && t !== "intercept");
    change({ model: ordered.length ? ordered : ["intercept"] });
  };
  const exclusionSource = source.kind === "plan" ? source.planId : null;
  const selectedRun = a && selected !== null ? a.analysis.runs[selected] : undefined;

  async function leaveOut() {
    if (!selectedRun) return;
    setBusy(true);
    setActionError(null);
    const res = await postJson(`/api/labs/${labSlug}/plans/${selectedRun.planId}/exclusions`, { run: selectedRun.run, reason });
    setBusy(false);
    if (!res.ok) return setActionError(res.error.issues[0]?.message ? `${res.error.message} (${res.error.issues[0].message})` : res.error.message);
    setSelected(null);
    setReason("");
    await mutate();
  }
  async function bringBack(planId: string, exclusionId: string) {
    setBusy(true);
    setActionError(null);
    const res = await postJson(`/api/labs/${labSlug}/plans/${planId}/exclusions/${exclusionId}`, undefined, "DELETE");
    setBusy(false);
    if (!res.ok) return setActionError(res.error.message);
    await mutate();
  }

  const leftOut = a ? a.analysis.runs.filter((r) => r.status !== "used") : [];
  const flags = a ? flaggedRuns(a.diagnostics, a.stats.p) : [];
  const unit = responses.find((r) => r.name === params.response)?.unit ?? "";

  return (
    <div className="flex flex-col gap-5">
      <section className="flex flex-col gap-3 rounded-lg border border-ink-line bg-paper-card p-4" aria-label="Model" data-testid="model-controls">
        <div className="flex flex-wrap items-end gap-4">
          <label className="flex flex-col gap-1 text-sm">
            <span className="text-ink-soft">Response</span>
            <select className="rounded-md border border-ink-edge bg-paper-card px-2 py-1.5" value={params.response} onChange={(e) => change({ response: e.target.value, combine: (params.combine ?? []).filter((n) => n !== e.target.value) })} data-testid="response-select">
              {responses.map((r) => (
                <option key={r.name} value={r.name}>
                  {r.name}
                  {r.unit ? ` (${r.unit})` : ""}
                </option>
              ))}
            </select>
          </label>
          <fieldset className="flex flex-wrap items-center gap-3 text-sm">
            <legend className="mb-1 text-ink-soft">Model</legend>
            {MODELS.map(([m, label]) => (
              <label key={m} className="flex items-center gap-1.5">
                <input type="radio" name="model" checked={params.model === m} onChange={() => change({ model: m })} data-testid={`model-${m}`} />
                {label}
              </label>
            ))}
            <label className="flex items-center gap-1.5">
              <input type="radio" name="model" checked={Array.isArray(params.model)} onChange={() => change({ model: [...currentTerms].filter((t) => t !== "intercept") })} data-testid="model-custom" />
              Terms ticked below
            </label>
          </fieldset>
          <label className="flex flex-col gap-1 text-sm">
            <span className="text-ink-soft">Transform</span>
            <select className="rounded-md border border-ink-edge bg-paper-card px-2 py-1.5" value={params.transform} onChange={(e) => change({ transform: e.target.value === "ln" ? "ln" : "none" })} data-testid="transform-select">
              <option value="none">none</option>
              <option value="ln">ln (response)</option>
            </select>
          </label>
          <div className="flex flex-wrap items-end gap-2 text-sm">
            <label className="flex items-center gap-1.5 pb-1.5">
              <input
                type="checkbox"
                checked={params.alpha !== null}
                onChange={(e) => change({ alpha: e.target.checked ? Number(alphaText) || 0.05 : null })}
                data-testid="prune-toggle"
              />
              Prune at α =
            </label>
            <input
              className="num w-20 rounded-md border border-ink-edge bg-paper-card px-2 py-1.5"
              inputMode="decimal"
              value={alphaText}
              aria-label="α for pruning"
              data-testid="alpha-input"
              onChange={(e) => {
                setAlphaText(e.target.value);
                const v = Number(e.target.value);
                if (params.alpha !== null && v > 0 && v < 1) change({ alpha: v });
              }}
            />
            <label className="flex items-center gap-1.5 pb-1.5">
              <input type="checkbox" checked={params.hierarchy} onChange={(e) => change({ hierarchy: e.target.checked })} data-testid="hierarchy-toggle" />
              keep hierarchy
            </label>
          </div>
        </div>
        {a && (
          <fieldset className="flex flex-wrap gap-x-4 gap-y-1 text-sm" data-testid="term-ticks">
            <legend className="mb-1 text-ink-soft">Terms (tick or untick to refit)</legend>
            {a.analysis.candidateTerms
              .filter((t) => t !== "intercept")
              .map((t) => (
                <label key={t} className={`flex items-center gap-1.5 font-mono text-xs ${kept.has(t) ? "" : currentTerms.has(t) ? "text-ink-faint line-through" : "text-ink-faint"}`}>
                  <input type="checkbox" checked={currentTerms.has(t)} onChange={() => toggleTerm(t)} data-testid={`term-${t}`} />
                  {termLabel(t)}
                </label>
              ))}
          </fieldset>
        )}
      </section>

      {error && <Banner tone="blocks" testId="analysis-error">{error instanceof Error ? error.message : String(error)}</Banner>}
      {actionError && <Banner tone="blocks" testId="action-error">{actionError}</Banner>}
      {!a && isLoading && <p className="text-sm text-ink-soft">Fitting…</p>}
      {a && (
        <>
          <section className="flex flex-col gap-2" aria-label="Runs used" data-testid="runs-used">
            <p className="text-sm text-ink-soft">
              {a.analysis.plans.map((p) => `${p.name}: ${p.used} of ${p.runs} runs`).join(" · ")}
              {isValidating && <span className="ml-2 text-ink-faint">refitting…</span>}
            </p>
            {leftOut.length > 0 && (
              <ul className="flex flex-col gap-1 text-sm" data-testid="left-out">
                {leftOut.map((r) => (
                  <li key={`${r.planId}-${r.run}`} className="flex flex-wrap items-center gap-2">
                    <span className="num">{a.analysis.plans.length > 1 ? `${r.planName}, run ${r.run}` : `Run ${r.run}`}</span>
                    <span className="text-ink-soft">left out: {r.reason}</span>
                    {r.status === "excluded" && r.exclusionId && canExclude && (
                      <Button variant="secondary" className="px-2 py-0.5 text-xs" disabled={busy} onClick={() => bringBack(r.planId, r.exclusionId!)} data-testid={`restore-run-${r.run}`}>
                        Bring back
                      </Button>
                    )}
                  </li>
                ))}
              </ul>
            )}
          </section>
          {a.warnings.length > 0 && (
            <Banner tone="caution" testId="fit-warnings">
              <ul className="list-disc pl-4">
                {a.warnings.map((w) => (
                  <li key={w}>{w}</li>
                ))}
              </ul>
            </Banner>
          )}
          <FitStats a={a} />
          <section className="flex flex-col gap-2" aria-label="Coefficients">
            <h2>
              Coefficients of {a.transform === "ln" ? `ln ${a.analysis.response.name}` : a.analysis.response.name}
              {a.dropped.length > 0 && <span className="ml-2 text-sm font-normal text-ink-soft">pruned: {a.dropped.map(termLabel).join(", ")}</span>}
            </h2>
            <CoefficientTable terms={a.terms} stamp={`${a.terms.map((t) => t.term).join(",")}|${a.stats.n}|${a.stats.rmse}`} />
            {a.aliased.length > 0 && <p className="text-sm text-caution">Not estimable from these runs (aliased): {a.aliased.map(termLabel).join(", ")}.</p>}
            {a.blocks && (
              <p className="text-sm text-ink-soft" data-testid="block-effects">
                Block effects (sum to zero): {a.blocks.effects.map((b) => `${b.label} ${sig(b.effect, 3)}`).join(" · ")}
              </p>
            )}
          </section>
          <PruningSteps a={a} />
          <section className="flex flex-col gap-2" aria-label="Analysis of variance">
            <h2>Analysis of variance</h2>
            <AnovaTable a={a} />
            <CurvatureCheck a={a} />
          </section>
          <OptimumPanel
            a={a}
            factorUnits={factorUnits}
            responses={responses}
            choice={{ region: params.region ?? "cube", combine: params.combine ?? [] }}
            onChoice={(c) => change({ region: c.region, combine: c.combine })}
          />
          <SurfacePanel key={`${params.response}|${a.analysis.plans.map((p) => p.id).join(",")}`} labSlug={labSlug} source={source} params={params} optimum={a.optimum} onParams={setSurfaceParams} />
          <ReportLink labSlug={labSlug} source={source} params={params} surface={surfaceParams} />
          {planning && source.kind === "plan" && <ConfirmationPanel labSlug={labSlug} studyId={planning.studyId} planId={source.planId} a={a} params={params} factorUnits={factorUnits} canPlan={planning.canPlan} />}
          {planning && <NextDesignPanel labSlug={labSlug} studyId={planning.studyId} planId={source.kind === "plan" ? source.planId : null} a={a} factorUnits={factorUnits} canPlan={planning.canPlan} />}
          <section className="flex flex-col gap-2" aria-label="Diagnostics">
            <h2>Diagnostics</h2>
            <p className="text-sm text-ink-soft">{canExclude && exclusionSource !== null ? "Click a point to leave its run out of the analysis." : canExclude ? "Click a point to leave its run out (recorded on its plan)." : ""}</p>
            {flags.length > 0 && (
              <ul className="flex flex-col gap-0.5 text-sm text-caution" data-testid="flagged-runs">
                {flags.map((f) => (
                  <li key={f.index}>
                    <button type="button" className="underline-offset-2 hover:underline" onClick={() => setSelected(f.index)}>
                      Run {f.run}
                    </button>
                    : {f.reasons.join("; ")}
                  </li>
                ))}
              </ul>
            )}
            {selectedRun && canExclude && (
              <form
                className="flex flex-wrap items-end gap-2 rounded-lg border border-accent/40 bg-accent-light/40 p-3 text-sm"
                data-testid="leave-out-form"
                onSubmit={(e) => {
                  e.preventDefault();
                  void leaveOut();
                }}
              >
                <p className="w-full">
                  Run {selectedRun.run}
                  {a.analysis.plans.length > 1 ? ` of ${selectedRun.planName}` : ""}: observed {withUnit(selectedRun.observed, unit)}
                  {(() => {
                    const d = a.diagnostics.find((x) => x.index === selectedRun.index);
                    return d ? `, fitted ${sig(d.fitted)}, studentized residual ${sig(d.studentized, 3)}, Cook's distance ${sig(d.cooksDistance, 3)}` : "";
                  })()}
                </p>
                <label className="flex min-w-64 flex-1 flex-col gap-1">
                  <span className="text-ink-soft">Why leave it out? (recorded)</span>
                  <input className="rounded-md border border-ink-edge bg-paper-card px-2 py-1.5" value={reason} onChange={(e) => setReason(e.target.value)} data-testid="leave-out-reason" />
                </label>
                <Button type="submit" disabled={busy || reason.trim().length < 3 || selectedRun.status !== "used"} data-testid="leave-out-submit">
                  Leave run {selectedRun.run} out
                </Button>
                <Button type="button" variant="secondary" onClick={() => setSelected(null)}>
                  Cancel
                </Button>
              </form>
            )}
            <DiagnosticPlots a={a} onSelect={setSelected} />
          </section>
        </>
      )}
    </div>
  );
}
