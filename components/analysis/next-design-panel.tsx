"use client";

import Link from "next/link";
import { useState } from "react";
import { postJson } from "@/lib/client/fetch-json";
import type { AugmentationDetails } from "@/lib/plans/augmentation";
import type { PlanView } from "@/lib/plans/view";
import type { AnalysisAnswer } from "@/lib/results/analysis";
import { SAFETY_NOTICE } from "@/components/shell/safety-notice";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { sig, withUnit } from "./format";

const ALPHAS = [
  ["rotatable", "Rotatable (F^¼)"],
  ["orthogonal", "Blocks orthogonally"],
  ["face-centered", "Face-centred (1)"],
] as const;

/**
 * The next design (issue 13 item 4): from a first-order model, the path of steepest ascent
 * as a short list of proposed conditions stopped at the safe envelope; from a two-level
 * factorial plan, its augmentation to a central composite design (axial and centre runs in a
 * new block, `POST /plans/{plan}/augment`), with what the envelope made α give up. The new
 * plan is analysed with this one on the study analysis page.
 */
export function NextDesignPanel({ labSlug, studyId, planId, a, factorUnits, canPlan }: { labSlug: string; studyId: string; planId: string | null; a: AnalysisAnswer; factorUnits: Record<string, string>; canPlan: boolean }) {
  const next = a.nextDesign;
  const [alpha, setAlpha] = useState<(typeof ALPHAS)[number][0]>("rotatable");
  const [centre, setCentre] = useState("");
  const [busy, setBusy] = useState(false);
  const [error, setError] = useState<string | null>(null);
  const [made, setMade] = useState<{ plan: PlanView; augmentation: AugmentationDetails } | null>(null);
  if (!next) return null;
  const path = next.steepestAscent.path;
  const factors = Object.keys(factorUnits);
  const canAugment = planId !== null && next.augmentation.available && canPlan;

  async function augment() {
    setBusy(true);
    setError(null);
    const res = await postJson<{ plan: PlanView; augmentation: AugmentationDetails }>(`/api/labs/${labSlug}/plans/${planId}/augment`, { alpha, ...(centre.trim() ? { centerPoints: Number(centre) } : {}) });
    setBusy(false);
    if (!res.ok) return setError(`${res.error.message}${res.error.issues[0] ? ` (${res.error.issues.map((i) => i.message).join("; ")})` : ""}`);
    setMade(res.data);
  }

  if (!path && !next.augmentation.available && next.augmentation.plans.length === 0) return null;
  return (
    <section className="flex flex-col gap-3" aria-label="Next design" data-testid="next-design-panel">
      <h2>Next design</h2>
      {path ? (
        <div className="flex flex-col gap-2 rounded-lg border border-ink-line bg-paper-card p-3 text-sm" data-testid="steepest-ascent">
          <p>
            Path of steepest {a.analysis.response.goal === "minimize" ? "descent" : "ascent"} from the design centre: each step moves <span className="font-mono text-xs">{path.baseFactor}</span> by{" "}
            <span className="num">{withUnit(path.naturalStep[path.baseFactor] ?? null, factorUnits[path.baseFactor])}</span> and the others in proportion to their first-order effects.
          </p>
          <div className="overflow-x-auto">
            <table className="text-sm">
              <thead>
                <tr className="text-left text-ink-soft">
                  <th className="py-1 pr-3 font-normal">Step</th>
                  {factors.map((f) => (
                    <th key={f} className="py-1 pr-3 text-right font-mono text-xs font-normal">
                      {f}
                    </th>
                  ))}
                  <th className="py-1 pr-3 text-right font-normal">Predicted {a.analysis.response.name}</th>
                  <th className="py-1 font-normal" />
                </tr>
              </thead>
              <tbody>
                <tr className="border-t border-ink-line text-ink-faint">
                  <td className="num py-0.5 pr-3">Δ</td>
                  {factors.map((f) => (
                    <td key={f} className="num py-0.5 pr-3 text-right">
                      {sig(path.naturalStep[f] ?? null, 3)}
                    </td>
                  ))}
                  <td />
                  <td />
                </tr>
                {path.points.map((p) => (
                  <tr key={p.step} className="border-t border-ink-line" data-testid="path-step">
                    <td className="num py-0.5 pr-3">{p.step}</td>
                    {factors.map((f) => (
                      <td key={f} className="num py-0.5 pr-3 text-right">
                        {withUnit(p.natural[f] ?? null, factorUnits[f])}
                      </td>
                    ))}
                    <td className="num py-0.5 pr-3 text-right">{withUnit(p.predicted, a.analysis.response.unit)}</td>
                    <td className="py-0.5 text-xs text-caution">{p.extrapolated ? "outside the studied range" : ""}</td>
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          {path.stoppedAt ? (
            <p className="text-caution" data-testid="path-stop">
              Stops before step {path.stoppedAt.step}: {path.stoppedAt.reasons.map((r) => r.replace(/\.$/, "")).join("; ")}.
            </p>
          ) : (
            <p className="text-ink-soft">The path did not meet the envelope within {path.points.length} steps.</p>
          )}
          {path.warnings.filter((w) => !w.startsWith("The path stops")).map((w) => (
            <p key={w} className="text-ink-soft">
              {w}
            </p>
          ))}
          <p className="text-ink-soft">Predictions along the path extrapolate a first-order model: run a few of these conditions, and fit a new design where the response stops rising.</p>
        </div>
      ) : (
        next.steepestAscent.note && <p className="text-sm text-ink-soft">{next.steepestAscent.note}</p>
      )}
      {planId !== null && (next.augmentation.available || next.augmentation.plans.length > 0) && (
        <div className="flex flex-col gap-2 rounded-lg border border-ink-line bg-paper-card p-3 text-sm" data-testid="augment-panel">
          <p>Augment this two-level factorial to a central composite design: axial runs at ±α on each factor and centre runs in a new block, as a new draft plan analysed with this one.</p>
          {canAugment && (
            <form
              className="flex flex-wrap items-end gap-3"
              onSubmit={(e) => {
                e.preventDefault();
                void augment();
              }}
            >
              <label className="flex flex-col gap-1">
                <span className="text-ink-soft">Axial distance α</span>
                <select className="rounded-md border border-ink-edge bg-paper-card px-2 py-1.5" value={alpha} onChange={(e) => setAlpha(ALPHAS.find(([v]) => v === e.target.value)?.[0] ?? "rotatable")} data-testid="augment-alpha">
                  {ALPHAS.map(([v, label]) => (
                    <option key={v} value={v}>
                      {label}
                    </option>
                  ))}
                </select>
              </label>
              <label className="flex flex-col gap-1">
                <span className="text-ink-soft">Centre runs</span>
                <input className="num w-16 rounded-md border border-ink-edge bg-paper-card px-2 py-1.5" inputMode="numeric" placeholder="auto" value={centre} onChange={(e) => setCentre(e.target.value)} data-testid="augment-centre" />
              </label>
              <Button type="submit" disabled={busy} data-testid="augment-plan">
                {busy ? "Planning…" : "Plan axial and centre runs"}
              </Button>
            </form>
          )}
          {error && <Banner tone="blocks" testId="augment-error">{error}</Banner>}
          {made && (
            <Banner tone={made.augmentation.rotatable ? "ok" : "caution"} testId="augment-made">
              <p>
                New draft plan <Link href={`/labs/${labSlug}/studies/${studyId}/plans/${made.plan.id}`}>{made.plan.name}</Link>: {made.augmentation.axialRuns} axial runs at α = <span className="num">{sig(made.augmentation.alpha)}</span> and {made.augmentation.centerRuns} centre runs.
              </p>
              <ul className="mt-1 list-disc pl-5">
                {made.augmentation.notes.map((n) => (
                  <li key={n}>{n}</li>
                ))}
              </ul>
            </Banner>
          )}
          {next.augmentation.plans.length > 0 && (
            <p className="text-ink-soft">
              Augmented already:{" "}
              {next.augmentation.plans.map((p, i) => (
                <span key={p.id}>
                  {i > 0 && ", "}
                  <Link href={`/labs/${labSlug}/studies/${studyId}/plans/${p.id}`}>{p.name}</Link>
                </span>
              ))}{" "}
              · <Link href={`/labs/${labSlug}/studies/${studyId}/analysis?plans=${[planId, ...next.augmentation.plans.map((p) => p.id)].join(",")}`}>analyse them together</Link>
            </p>
          )}
        </div>
      )}
      {(path || canAugment) && <p className="text-xs text-ink-faint">{SAFETY_NOTICE}</p>}
    </section>
  );
}
