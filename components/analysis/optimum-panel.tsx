"use client";

import type { AnalysisAnswer } from "@/lib/results/analysis";
import { findingKind, findingTitle } from "@/lib/results/envelope-codes";
import type { StudyResponse } from "@/lib/studies/schemas";
import { Banner } from "@/components/ui/banner";
import { SAFETY_NOTICE } from "@/components/shell/safety-notice";
import { sig, withUnit } from "./format";

const GOAL_WORDS = { maximize: "highest", minimize: "lowest", target: "closest to target" } as const;

const interval = (v: [number, number] | null, unit?: string) => (v ? `${withUnit(v[0], unit)} … ${withUnit(v[1], unit)}` : "—");

/** Where the optimum is looked for, and which responses go into it. */
export interface OptimumChoice {
  region: "cube" | "sphere";
  combine: string[];
}

/**
 * The best conditions of the fitted model inside the studied region (cube or sphere) and
 * the plan's safe envelope — no blocking caution and inside the lab's limits, the hazard
 * engine's verdict (lib/results/envelope.ts) — with the prediction's confidence and
 * prediction intervals, the optimiser's warnings (on an edge, outside the studied range, a
 * yield above 100 %), several responses at once through their desirability with the
 * study's goals, and the canonical analysis of the surface in words.
 */
export function OptimumPanel({ a, factorUnits, responses, choice, onChoice }: { a: AnalysisAnswer; factorUnits: Record<string, string>; responses: StudyResponse[]; choice: OptimumChoice; onChoice: (c: OptimumChoice) => void }) {
  const o = a.optimum;
  const r = a.analysis.response;
  const unit = r.unit;
  const d = a.analysis.desirability;
  const several = d !== null && d.length > 1;
  const others = responses.filter((x) => x.name !== r.name);
  const outside = new Set((o?.warnings ?? []).flatMap((w) => Object.keys(o?.natural ?? {}).filter((f) => w.startsWith(`${f} = `) && w.includes("outside the range of the runs"))));
  const edge = (f: string) => {
    if (!o || !o.onBoundary.includes(f) || o.region !== "cube") return null;
    return (o.coded[f] ?? 0) > 0 ? "at its high limit" : "at its low limit";
  };
  return (
    <section className="flex flex-col gap-2" aria-label="Best conditions" data-testid="optimum-panel">
      <h2>
        Best conditions{" "}
        <span className="font-normal">
          ({several ? `overall desirability of ${d.map((x) => x.name).join(", ")}` : `${GOAL_WORDS[r.goal]} predicted ${r.name}`})
        </span>
      </h2>
      <div className="flex flex-wrap items-center gap-x-5 gap-y-1 text-sm" data-testid="optimum-controls">
        <fieldset className="flex flex-wrap items-center gap-3">
          <legend className="sr-only">Region</legend>
          <span className="text-ink-soft">Look in</span>
          <label className="flex items-center gap-1.5">
            <input type="radio" name="optimum-region" checked={choice.region === "cube"} onChange={() => onChoice({ ...choice, region: "cube" })} data-testid="optimum-region-cube" />
            the cube of the factor ranges
          </label>
          <label className="flex items-center gap-1.5">
            <input type="radio" name="optimum-region" checked={choice.region === "sphere"} onChange={() => onChoice({ ...choice, region: "sphere" })} data-testid="optimum-region-sphere" />
            the design&apos;s sphere
          </label>
        </fieldset>
        {others.length > 0 && (
          <fieldset className="flex flex-wrap items-center gap-3" data-testid="optimum-combine">
            <legend className="sr-only">Optimise together with</legend>
            <span className="text-ink-soft">together with</span>
            {others.map((x) => (
              <label key={x.name} className="flex items-center gap-1.5">
                <input
                  type="checkbox"
                  checked={choice.combine.includes(x.name)}
                  onChange={(e) => onChoice({ ...choice, combine: e.target.checked ? [...choice.combine, x.name] : choice.combine.filter((n) => n !== x.name) })}
                  data-testid={`optimum-combine-${x.name}`}
                />
                {x.name} <span className="text-ink-faint">({GOAL_WORDS[x.goal]})</span>
              </label>
            ))}
          </fieldset>
        )}
      </div>
      {!o ? (
        <Banner tone="info" testId="optimum-none">{a.analysis.optimumNote ?? "No optimum."}</Banner>
      ) : (
        <div className="grid gap-3 rounded-lg border border-ink-line bg-paper-card p-3 md:grid-cols-[2fr_3fr]">
          <div className="flex flex-col gap-2">
            <table className="text-sm" data-testid="optimum-conditions">
              <tbody>
                {Object.entries(o.natural).map(([f, v]) => (
                  <tr key={f}>
                    <td className="py-0.5 pr-3 font-mono text-xs">{f}</td>
                    <td className="num py-0.5 text-right">{withUnit(v, factorUnits[f])}</td>
                    <td className="num py-0.5 pl-3 text-right text-ink-faint">coded {sig(o.coded[f] ?? null, 3)}</td>
                    <td className="py-0.5 pl-3 text-xs text-caution">{[edge(f), outside.has(f) ? "outside the runs" : null].filter(Boolean).join(", ")}</td>
                  </tr>
                ))}
              </tbody>
            </table>
            <p className="text-xs text-ink-faint">
              Searched in {o.region === "cube" ? "the cube of the factor ranges" : `the design's sphere (radius ${sig(o.radius, 3)} in coded units)`}
              {o.safety.checked ? ", inside the safe envelope and the lab's limits" : ""}.
            </p>
          </div>
          <div className="flex flex-col gap-1.5 text-sm">
            {d ? (
              <>
                <table className="text-sm" data-testid="optimum-responses">
                  <thead>
                    <tr className="text-left text-xs text-ink-soft">
                      <th className="pr-3 font-normal">response</th>
                      <th className="pr-3 text-right font-normal">predicted</th>
                      <th className="pr-3 text-right font-normal">95 % confidence</th>
                      <th className="pr-3 text-right font-normal">95 % prediction (one run)</th>
                      <th className="text-right font-normal">d</th>
                    </tr>
                  </thead>
                  <tbody>
                    {(o.responses ?? []).map((x) => {
                      const u = d?.find((y) => y.name === x.name)?.unit ?? undefined;
                      return (
                        <tr key={x.name} data-testid={`optimum-response-${x.name}`}>
                          <td className="py-0.5 pr-3 font-mono text-xs">{x.name}</td>
                          <td className="num py-0.5 pr-3 text-right font-semibold">{withUnit(x.predicted, u)}</td>
                          <td className="num py-0.5 pr-3 text-right text-ink-soft">{interval(x.ci95)}</td>
                          <td className="num py-0.5 pr-3 text-right text-ink-soft">{interval(x.pi95)}</td>
                          <td className="num py-0.5 text-right">{sig(x.desirability, 3)}</td>
                        </tr>
                      );
                    })}
                  </tbody>
                </table>
                <p>
                  Overall desirability D = <span className="num font-semibold" data-testid="optimum-desirability">{sig(o.desirability, 3)}</span>{" "}
                  <span className="text-ink-soft">(geometric mean of each response&apos;s d, 0 unacceptable … 1 fully satisfied)</span>
                </p>
                {d && (
                  <ul className="text-xs text-ink-soft">
                    {d.map((x) => (
                      <li key={x.name}>
                        {x.name}: {x.goal === "target" ? `target ${withUnit(x.target, x.unit ?? undefined)}, acceptable ${withUnit(x.low, x.unit ?? undefined)} … ${withUnit(x.high, x.unit ?? undefined)}` : `${x.goal === "maximize" ? "d = 0 at or below" : "d = 1 at or below"} ${withUnit(x.low, x.unit ?? undefined)}, ${x.goal === "maximize" ? "d = 1 at or above" : "d = 0 at or above"} ${withUnit(x.high, x.unit ?? undefined)}`}
                        {x.bounds === "observed" ? " (the study gives no bounds: the lowest and highest result)" : " (the study's bounds)"}
                      </li>
                    ))}
                  </ul>
                )}
              </>
            ) : (
              <>
                <p>
                  Predicted {r.name}: <span className="num font-semibold" data-testid="optimum-predicted">{withUnit(o.predicted, unit)}</span>
                </p>
                <p className="num text-ink-soft" data-testid="optimum-intervals">
                  95 % confidence interval {interval(o.ci95, unit)} · 95 % prediction interval for one run {interval(o.pi95, unit)}
                </p>
              </>
            )}
            <p className="text-ink-soft">
              {o.safety.checked
                ? `Checked against the safe envelope of ${a.analysis.envelopeOf?.name ?? "the plan"} (${o.safety.checks} point${o.safety.checks === 1 ? "" : "s"} judged by the hazard engine).`
                : "Not checked against a safe envelope."}
            </p>
            {o.safety.blockedWithoutEnvelope.length > 0 && (
              <div className="rounded-md border border-blocks/30 bg-blocks-bg px-2 py-1.5 text-blocks" data-testid="optimum-envelope">
                Without the envelope the best point would be:
                <ul className="list-disc pl-4">
                  {o.safety.blockedWithoutEnvelope.map((c) => (
                    <li key={c.code}>
                      <span className="font-mono text-xs font-semibold">{c.code}</span> {findingKind(c.code) === "limit" ? "outside the lab's limits: " : ""}
                      {findingTitle(c.code)} — {c.message}
                    </li>
                  ))}
                </ul>
              </div>
            )}
            {a.analysis.optimumNote && <p className="text-caution">{a.analysis.optimumNote}</p>}
            {o.warnings.length > 0 && (
              <ul className="list-disc pl-4 text-caution" data-testid="optimum-warnings">
                {o.warnings.map((w) => (
                  <li key={w}>{w}</li>
                ))}
              </ul>
            )}
            {o.safety.checked && <p className="text-xs text-ink-faint">{SAFETY_NOTICE}</p>}
          </div>
        </div>
      )}
      <div className="rounded-lg border border-ink-line bg-paper-card p-3 text-sm" data-testid="canonical">
        <h3 className="mb-1 text-sm font-semibold">The shape of the surface</h3>
        {a.canonical ? (
          <>
            <p data-testid="canonical-words">{a.canonical.description}</p>
            <ul className="mt-1 text-xs text-ink-soft">
              {a.canonical.directions.map((x, i) => (
                <li key={i} className="num">
                  eigenvalue {sig(x.eigenvalue, 3)}: along {x.words}
                </li>
              ))}
            </ul>
          </>
        ) : (
          <p className="text-ink-soft">The canonical analysis needs a model with square terms (a quadratic): this model is {a.terms.some((t) => t.term.includes("*")) ? "linear with interactions" : "linear"}, so the surface is a plane{a.terms.some((t) => t.term.includes("*")) ? " twisted by the interactions" : ""}, and the best conditions lie on the region&apos;s boundary.</p>
        )}
      </div>
    </section>
  );
}
