"use client";

import { displayUnit } from "@/lib/units/display-unit";
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import { postJson } from "@/lib/client/fetch-json";
import type { AnalysisParams } from "@/lib/hooks/use-analysis";
import { PLAN_STATE_LABELS } from "@/lib/plans/states";
import type { PlanView } from "@/lib/plans/view";
import type { AnalysisAnswer } from "@/lib/results/analysis";
import { SAFETY_NOTICE } from "@/components/shell/safety-notice";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { ConfirmationChart } from "./confirmation-chart";
import { sig, withUnit } from "./format";

/**
 * Confirmation runs (issue 13 item 3): "Plan confirmation runs" makes a draft plan of
 * replicate runs at the optimum shown, rounded to settable steps (the defaults by unit,
 * adjustable per factor) and checked again against the envelope after rounding
 * (`POST /plans/{plan}/confirmation` with the page's analysis parameters), and opens it.
 * Below, each confirmation plan derived from this one: observed against predicted with the
 * prediction interval, and whether the confirmation holds.
 */
export function ConfirmationPanel({ labSlug, studyId, planId, a, params, factorUnits, canPlan }: { labSlug: string; studyId: string; planId: string; a: AnalysisAnswer; params: AnalysisParams; factorUnits: Record<string, string>; canPlan: boolean }) {
  const router = useRouter();
  const factors = Object.keys(factorUnits);
  const defaultStep = (f: string) => String(a.nextDesign?.settableSteps[f] ?? 0);
  const [replicates, setReplicates] = useState("3");
  const [steps, setSteps] = useState<Record<string, string>>(() => Object.fromEntries(factors.map((f) => [f, defaultStep(f)])));
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<{ message: string; issues: { path: string; message: string }[] } | null>(null);
  const checks = a.nextDesign?.confirmations ?? [];
  const unit = a.analysis.response.unit;
  const o = a.optimum;

  async function plan() {
    setBusy(true);
    setError(null);
    const body = {
      response: params.response,
      model: params.model,
      alpha: params.alpha,
      hierarchy: params.hierarchy,
      transform: params.transform,
      region: params.region ?? "cube",
      combine: params.combine ?? [],
      replicates: Number(replicates),
      steps: Object.fromEntries(factors.map((f) => [f, Number(steps[f])])),
    };
    const res = await postJson<{ plan: PlanView }>(`/api/labs/${labSlug}/plans/${planId}/confirmation`, body);
    if (!res.ok) {
      setBusy(false);
      return setError({ message: res.error.message, issues: res.error.issues });
    }
    router.push(`/labs/${labSlug}/studies/${res.data.plan.studyId}/plans/${res.data.plan.id}`);
  }

  return (
    <section className="flex flex-col gap-2" aria-label="Confirmation runs" data-testid="confirmation-panel">
      <h2>Confirmation runs</h2>
      {o && canPlan && (
        <form
          className="flex flex-col gap-3 rounded-lg border border-ink-line bg-paper-card p-3 text-sm"
          onSubmit={(e) => {
            e.preventDefault();
            void plan();
          }}
        >
          <p className="text-ink-soft">
            A few replicate runs at the best conditions above, each value rounded to what can be set at the bench and checked again against the safe envelope; a new draft plan, reviewed like any other.
          </p>
          <div className="flex flex-wrap items-end gap-3">
            <label className="flex flex-col gap-1">
              <span className="text-ink-soft">Replicates</span>
              <input className="num w-16 rounded-md border border-ink-edge bg-paper-card px-2 py-1.5" inputMode="numeric" value={replicates} onChange={(e) => setReplicates(e.target.value)} data-testid="confirmation-replicates" />
            </label>
            {factors.map((f) => (
              <label key={f} className="flex flex-col gap-1">
                <span className="text-ink-soft">
                  <span className="font-mono text-xs">{f}</span> step{displayUnit(factorUnits[f]) ? ` (${displayUnit(factorUnits[f])})` : ""}
                </span>
                <input
                  className="num w-20 rounded-md border border-ink-edge bg-paper-card px-2 py-1.5"
                  inputMode="decimal"
                  value={steps[f] ?? ""}
                  onChange={(e) => setSteps((s) => ({ ...s, [f]: e.target.value }))}
                  aria-label={`settable step of ${f}`}
                  data-testid={`confirmation-step-${f}`}
                />
              </label>
            ))}
            <Button type="submit" disabled={busy} data-testid="plan-confirmation">
              {busy ? "Planning…" : "Plan confirmation runs"}
            </Button>
          </div>
          <p className="text-xs text-ink-faint">A step of 0 leaves the factor unrounded.</p>
          {error && (
            <Banner tone="blocks" testId="confirmation-error">
              <p>{error.message}</p>
              {error.issues.length > 0 && (
                <ul className="mt-1 list-disc pl-5">
                  {error.issues.map((i) => (
                    <li key={`${i.path}-${i.message}`}>
                      <span className="font-mono text-xs">{i.path}</span>: {i.message}
                    </li>
                  ))}
                </ul>
              )}
            </Banner>
          )}
        </form>
      )}
      {!o && <p className="text-sm text-ink-soft">No best conditions to confirm in this analysis.</p>}
      {checks.length === 0 ? (
        <p className="text-sm text-ink-soft">No confirmation plan yet.</p>
      ) : (
        <ul className="flex flex-col gap-3" data-testid="confirmation-checks">
          {checks.map((c) => (
            <li key={`${c.plan.id}-${JSON.stringify(c.point.natural)}`} className="flex flex-col gap-1.5 rounded-lg border border-ink-line bg-paper-card p-3 text-sm" data-testid="confirmation-check">
              <p className="flex flex-wrap items-baseline gap-x-2">
                <Link href={`/labs/${labSlug}/studies/${studyId}/plans/${c.plan.id}`} className="font-medium">
                  {c.plan.name}
                </Link>
                <span className="text-ink-faint">{PLAN_STATE_LABELS[c.plan.state]}</span>
                <span className="num text-ink-soft">{Object.entries(c.point.natural).map(([f, v]) => withUnit(v, factorUnits[f])).join(" · ")}</span>
              </p>
              {c.predicted !== null && (
                <p className="num text-ink-soft">
                  Predicted {withUnit(c.predicted, unit)} · 95 % prediction interval for one run {c.pi95 ? `${sig(c.pi95[0])} … ${sig(c.pi95[1])}` : "—"} · for the mean of {Math.max(1, c.runs.filter((r) => r.observed !== null).length || c.runs.length)}{" "}
                  {c.meanInterval95 ? `${sig(c.meanInterval95[0])} … ${sig(c.meanInterval95[1])}` : "—"}
                </p>
              )}
              {c.runs.some((r) => r.observed !== null) && (
                <p className="num">
                  Observed: {c.runs.map((r) => (r.observed !== null ? `run ${r.run} ${withUnit(r.observed, unit)}` : `run ${r.run} ${r.status}`)).join(" · ")}
                </p>
              )}
              <ConfirmationChart c={c} unit={unit} />
              {c.predicted !== null && <p className="text-xs text-ink-faint">Light band: 95 % prediction interval for one run; dark band: for the mean of the runs; line: the prediction; dots: the runs; diamond: their mean.</p>}
              {c.verdict && (
                <p className={c.verdict.holds === false ? "font-medium text-blocks" : c.verdict.holds ? "font-medium text-ok" : "text-ink-soft"} data-testid="confirmation-verdict">
                  {c.verdict.message}
                </p>
              )}
              {c.note && <p className="text-ink-soft">{c.note}</p>}
            </li>
          ))}
        </ul>
      )}
      {o && <p className="text-xs text-ink-faint">{SAFETY_NOTICE}</p>}
    </section>
  );
}
