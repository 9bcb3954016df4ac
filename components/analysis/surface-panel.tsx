"use client";

import { displayUnit } from "@/lib/units/display-unit";
import dynamic from "next/dynamic";
import { useEffect, useMemo, useRef, useState } from "react";
import type { AnalysisParams, AnalysisSource } from "@/lib/hooks/use-analysis";
import { useSurface, type SurfaceParams } from "@/lib/hooks/use-surface";
import type { SurfaceAnswer, SurfaceFactor } from "@/lib/results/surface";
import type { OptimizeOutput } from "@/lib/surface/optimize";
import { SAFETY_NOTICE } from "@/components/shell/safety-notice";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { sig, withUnit } from "./format";
import { SurfaceContour } from "./surface-contour";

// The 3-D chart (and with it Plotly's WebGL bundle) is loaded only when the chemist asks for it.
const Surface3D = dynamic(() => import("./surface-3d").then((m) => m.Surface3D), { ssr: false, loading: () => <p className="text-sm text-ink-soft">Loading the 3-D view…</p> });

const STEPS = [41, 61, 101] as const;

/** Where a held factor's slider may go: the range of the runs and a quarter of it either side (never below zero for a factor that starts at or above zero). */
function sliderRange(f: SurfaceFactor): [number, number] {
  const [a, b] = f.studied;
  if (f.scale === "log") return [a / Math.sqrt(b / a), b * Math.sqrt(b / a)];
  const w = (b - a) * 0.25;
  return [Math.min(f.low, a) >= 0 ? Math.max(0, a - w) : a - w, b + w];
}

/** A number rounded for a slider or a range box (4 significant digits). */
const tidy = (v: number) => Number(v.toPrecision(4));

/** From–to boxes of one axis: applied on Enter or when the box loses focus. */
function RangeBoxes({ axis, f, range, onChange }: { axis: "x" | "y"; f: SurfaceFactor; range: [number, number]; onChange: (r: [number, number] | null) => void }) {
  const [text, setText] = useState<[string, string]>([String(tidy(range[0])), String(tidy(range[1]))]);
  const [bad, setBad] = useState(false);
  useEffect(() => setText([String(tidy(range[0])), String(tidy(range[1]))]), [range]);
  const apply = () => {
    const a = Number(text[0]);
    const b = Number(text[1]);
    if (!Number.isFinite(a) || !Number.isFinite(b) || !(a < b) || (f.scale === "log" && !(a > 0))) return setBad(true);
    setBad(false);
    if (a !== tidy(range[0]) || b !== tidy(range[1])) onChange([a, b]);
  };
  const box = (i: 0 | 1) => (
    <input
      className="num w-20 rounded-md border border-ink-edge bg-paper-card px-2 py-1"
      inputMode="decimal"
      value={text[i]}
      aria-label={`${f.name} axis ${i === 0 ? "from" : "to"}`}
      aria-invalid={bad}
      data-testid={`surface-${axis}-${i === 0 ? "from" : "to"}`}
      onChange={(e) => setText((t) => (i === 0 ? [e.target.value, t[1]] : [t[0], e.target.value]))}
      onBlur={apply}
      onKeyDown={(e) => e.key === "Enter" && apply()}
    />
  );
  const unit = displayUnit(f.unit);
  return (
    <span className="flex items-center gap-1 text-sm">
      {box(0)} to {box(1)} {unit && <span className="text-ink-soft">{unit}</span>}
      {bad && <span className="text-xs text-blocks">from must be below to</span>}
    </span>
  );
}

/**
 * The response surface of the analysis (issue 13 "Surfaces"): any two factors as the axes,
 * in natural units, the others held where the sliders set them; the axes can run past the
 * studied range (shaded and labelled "extrapolated"); the design points overlaid; the safe
 * envelope — the hazard engine evaluated at every point of the grid on the server — hatched
 * and labelled with each caution. A contour plot always, a 3-D surface on request.
 */
export function SurfacePanel({ labSlug, source, params, optimum, onParams }: { labSlug: string; source: AnalysisSource; params: AnalysisParams; optimum: OptimizeOutput | null; onParams?: (p: SurfaceParams) => void }) {
  const [axes, setAxes] = useState<{ x: string | null; y: string | null }>({ x: null, y: null });
  const [ranges, setRanges] = useState<{ x: [number, number] | null; y: [number, number] | null }>({ x: null, y: null });
  // Sliders start at the best conditions when there are some (else the server holds each factor at its centre).
  const [hold, setHold] = useState<Record<string, number>>(() => (optimum ? Object.fromEntries(Object.entries(optimum.natural).map(([k, v]) => [k, tidy(v)])) : {}));
  const [draft, setDraft] = useState<Record<string, number>>(hold);
  const [steps, setSteps] = useState<number>(41);
  const [show3d, setShow3d] = useState(false);
  const timer = useRef<ReturnType<typeof setTimeout> | null>(null);

  const sp: SurfaceParams = { x: axes.x, y: axes.y, xRange: ranges.x, yRange: ranges.y, hold, steps };
  const { data, error, isValidating } = useSurface(labSlug, source, params, sp);
  const s: SurfaceAnswer | undefined = data?.surface;

  useEffect(() => {
    if (s && (axes.x === null || axes.y === null)) setAxes({ x: s.x, y: s.y });
  }, [s, axes.x, axes.y]);
  useEffect(() => () => void (timer.current && clearTimeout(timer.current)), []);
  const report = useRef(onParams);
  report.current = onParams;
  const spKey = JSON.stringify(sp);
  useEffect(() => report.current?.(JSON.parse(spKey) as SurfaceParams), [spKey]);

  const factorOf = (name: string | null) => s?.factors.find((f) => f.name === name);
  const commit = (next: Record<string, number>) => {
    if (timer.current) clearTimeout(timer.current);
    setHold(next);
  };
  const slide = (name: string, v: number) => {
    const next = { ...draft, [name]: v };
    setDraft(next);
    if (timer.current) clearTimeout(timer.current);
    timer.current = setTimeout(() => setHold(next), 180);
  };
  const chooseAxis = (axis: "x" | "y", name: string) => {
    const other = axis === "x" ? axes.y : axes.x;
    const mine = axis === "x" ? axes.x : axes.y;
    setAxes(axis === "x" ? { x: name, y: name === other ? mine : other } : { y: name, x: name === other ? mine : other });
    setRanges({ x: null, y: null });
  };
  const extend = () => {
    if (!s) return;
    const wider = (f: SurfaceFactor | undefined, r: [number, number]): [number, number] => {
      const w = (r[1] - r[0]) / 2;
      const lo = r[0] - w;
      return [f?.scale === "log" || (f && f.low >= 0 && lo < 0) ? Math.max(lo, r[0] / 2) : lo, r[1] + w].map(tidy) as [number, number];
    };
    const xr: [number, number] = [s.grid.xNatural[0]!, s.grid.xNatural[s.grid.xNatural.length - 1]!];
    const yr: [number, number] = [s.grid.yNatural[0]!, s.grid.yNatural[s.grid.yNatural.length - 1]!];
    setRanges({ x: wider(factorOf(s.x), xr), y: wider(factorOf(s.y), yr) });
  };
  const held = s ? s.factors.filter((f) => f.name !== s.x && f.name !== s.y) : [];
  const optimumOnChart = optimum ? optimum.natural : null;
  const cautions = s?.envelope.findings.filter((f) => f.kind === "caution") ?? [];
  const limits = s?.envelope.findings.filter((f) => f.kind === "limit") ?? [];
  const xRange = useMemo((): [number, number] | null => (s ? [s.grid.xNatural[0]!, s.grid.xNatural[s.grid.xNatural.length - 1]!] : null), [s]);
  const yRange = useMemo((): [number, number] | null => (s ? [s.grid.yNatural[0]!, s.grid.yNatural[s.grid.yNatural.length - 1]!] : null), [s]);

  return (
    <section className="flex flex-col gap-3" aria-label="Response surface" data-testid="surface-panel">
      <h2>Response surface and safe envelope</h2>
      <div className="flex flex-col gap-3 rounded-lg border border-ink-line bg-paper-card p-3 text-sm" data-testid="surface-controls">
        {s && (
          <div className="flex flex-wrap items-end gap-x-6 gap-y-2">
            {(["x", "y"] as const).map((axis) => {
              const name = axis === "x" ? s.x : s.y;
              const f = factorOf(name);
              const r = axis === "x" ? xRange : yRange;
              return (
                <div key={axis} className="flex flex-col gap-1">
                  <label className="flex items-center gap-2">
                    <span className="w-14 text-ink-soft">{axis === "x" ? "Across" : "Up"}</span>
                    <select className="rounded-md border border-ink-edge bg-paper-card px-2 py-1" value={name} onChange={(e) => chooseAxis(axis, e.target.value)} data-testid={`surface-${axis}`}>
                      {s.factors.map((g) => (
                        <option key={g.name} value={g.name}>
                          {g.name}
                        </option>
                      ))}
                    </select>
                  </label>
                  {f && r && (
                    <span className="flex items-center gap-2">
                      <span className="w-14" />
                      <RangeBoxes axis={axis} f={f} range={r} onChange={(v) => setRanges((q) => ({ ...q, [axis]: v }))} />
                    </span>
                  )}
                </div>
              );
            })}
            <div className="flex flex-wrap items-center gap-2">
              <Button variant="secondary" className="px-2 py-1 text-xs" onClick={extend} data-testid="surface-extend">
                Extend the axes
              </Button>
              <Button variant="secondary" className="px-2 py-1 text-xs" onClick={() => setRanges({ x: null, y: null })} disabled={!ranges.x && !ranges.y}>
                Range of the runs
              </Button>
              <label className="flex items-center gap-1.5 text-ink-soft">
                grid
                <select className="rounded-md border border-ink-edge bg-paper-card px-1.5 py-1 text-ink" value={steps} onChange={(e) => setSteps(Number(e.target.value))} data-testid="surface-steps">
                  {STEPS.map((n) => (
                    <option key={n} value={n}>
                      {n} × {n}
                    </option>
                  ))}
                </select>
              </label>
            </div>
          </div>
        )}
        {held.length > 0 && (
          <fieldset className="flex flex-col gap-1.5" data-testid="surface-sliders">
            <legend className="mb-1 text-ink-soft">The other factors are held at</legend>
            {held.map((f) => {
              const [lo, hi] = sliderRange(f);
              const v = draft[f.name] ?? s!.grid.fixed[f.name] ?? (f.studied[0] + f.studied[1]) / 2;
              const outside = v < f.studied[0] - 1e-9 || v > f.studied[1] + 1e-9;
              return (
                <label key={f.name} className="grid grid-cols-[9rem_minmax(8rem,22rem)_9rem] items-center gap-3">
                  <span className="font-mono text-xs">{f.name}</span>
                  <input
                    type="range"
                    min={lo}
                    max={hi}
                    step={(hi - lo) / 200}
                    value={v}
                    onChange={(e) => slide(f.name, tidy(Number(e.target.value)))}
                    onPointerUp={() => commit(draft)}
                    onKeyUp={() => commit(draft)}
                    className="accent-accent"
                    aria-label={`Hold ${f.name} at`}
                    data-testid={`surface-hold-${f.name}`}
                  />
                  <span className={`num ${outside ? "text-caution" : ""}`} data-testid={`surface-hold-value-${f.name}`}>
                    {withUnit(v, f.unit)}
                    {outside && <span className="ml-1 text-xs">(extrapolated)</span>}
                  </span>
                </label>
              );
            })}
            <div className="flex flex-wrap gap-2 pt-1">
              {optimum && (
                <Button variant="secondary" className="px-2 py-1 text-xs" onClick={() => { const h = Object.fromEntries(Object.entries(optimum.natural).map(([k, v]) => [k, tidy(v)])); setDraft(h); commit(h); }} data-testid="surface-hold-optimum">
                  At the best conditions
                </Button>
              )}
              <Button variant="secondary" className="px-2 py-1 text-xs" onClick={() => { const h = Object.fromEntries(held.map((f) => [f.name, tidy(f.scale === "log" ? Math.sqrt(f.low * f.high) : (f.low + f.high) / 2)])); setDraft(h); commit(h); }}>
                At the centre
              </Button>
            </div>
          </fieldset>
        )}
      </div>
      {error && <Banner tone="blocks" testId="surface-error">{error instanceof Error ? error.message : String(error)}</Banner>}
      {!s && !error && <p className="text-sm text-ink-soft">Computing the surface and the safe envelope…</p>}
      {s && (
        <div className="flex flex-col gap-3" data-testid="surface-body" data-x={s.x} data-y={s.y} data-held={Object.entries(s.grid.fixed).map(([k, v]) => `${k}:${v}`).join(",")}>
          <div className="grid gap-3 lg:grid-cols-[minmax(0,3fr)_minmax(0,2fr)]">
            <SurfaceContour surface={s} optimum={optimumOnChart} />
            <div className="flex min-w-0 flex-col gap-2 break-words text-sm" data-testid="surface-legend">
              {isValidating && <p className="text-xs text-ink-faint">updating…</p>}
              {s.envelope.checked ? (
                cautions.length + limits.length === 0 ? (
                  <p className="text-ok" data-testid="surface-envelope-clear">No blocking caution fires anywhere on this grid, and every point is inside the lab&apos;s limits.</p>
                ) : (
                  <>
                    {cautions.length > 0 && (
                      <div className="flex flex-col gap-1" data-testid="surface-cautions">
                        <p className="flex items-center gap-2 font-medium text-blocks">
                          <span aria-hidden className="inline-block h-3.5 w-5 rounded-sm border border-blocks bg-[repeating-linear-gradient(135deg,#9c3324_0_1.5px,#f4d9d3_1.5px_6px)]" /> Hatched: a blocking caution fires
                        </p>
                        <ul className="flex flex-col gap-1 pl-1">
                          {cautions.map((f) => (
                            <li key={f.code} data-testid={`surface-caution-${f.code}`}>
                              <span className="font-mono text-xs font-semibold text-blocks">{f.code}</span> {f.title} <span className="num text-ink-faint">({sig(f.share * 100, 3)} % of the grid)</span>
                              <span className="block text-xs text-ink-soft">e.g. {f.message}</span>
                            </li>
                          ))}
                        </ul>
                      </div>
                    )}
                    {limits.length > 0 && (
                      <div className="flex flex-col gap-1" data-testid="surface-limits">
                        <p className="flex items-center gap-2 font-medium">
                          <span aria-hidden className="inline-block h-3.5 w-5 rounded-sm border border-dashed border-ink bg-[repeating-linear-gradient(45deg,#3d3c40_0_1px,#ece8e0_1px_6px)]" /> Hatched grey the other way, dashed edge: outside the lab&apos;s limits
                        </p>
                        <ul className="flex flex-col gap-1 pl-1">
                          {limits.map((f) => (
                            <li key={f.code} data-testid={`surface-limit-${f.code}`}>
                              <span className="font-mono text-xs font-semibold">{f.code}</span> {f.title} <span className="num text-ink-faint">({sig(f.share * 100, 3)} % of the grid)</span>
                              <span className="block text-xs text-ink-soft">e.g. {f.message}</span>
                            </li>
                          ))}
                        </ul>
                      </div>
                    )}
                  </>
                )
              ) : (
                <Banner tone="caution">{s.envelope.note ?? "The safe envelope was not evaluated."}</Banner>
              )}
              {s.extrapolated.rings.length > 0 && <p className="text-ink-soft">Shaded with a dotted edge: extrapolated, outside the range of the runs — the model is a guess there.</p>}
              <p className="text-ink-soft">
                Filled dots: runs on this slice (the held factors where the run was); rings: runs elsewhere, shown where they sit on these two axes.{optimum ? " The cross marks the best conditions." : ""}
              </p>
              <p className="text-xs text-ink-faint">
                The envelope is the hazard engine&apos;s verdict at each of the {s.grid.xNatural.length} × {s.grid.yNatural.length} grid points for the recipe, solvent, vessel and scale of {s.envelope.of?.name ?? "the plan"}.
              </p>
              <p className="text-xs text-ink-faint" data-testid="surface-notice">{SAFETY_NOTICE}</p>
            </div>
          </div>
          <div className="flex items-center gap-2">
            <Button variant="secondary" onClick={() => setShow3d((v) => !v)} data-testid="surface-toggle-3d">
              {show3d ? "Hide the 3-D surface" : "Show the 3-D surface"}
            </Button>
            {show3d && <span className="text-xs text-ink-faint">Drag to turn it; red: a blocking caution fires, dark grey: outside the lab&apos;s limits, light grey: extrapolated.</span>}
          </div>
          {show3d && <Surface3D surface={s} optimum={optimumOnChart} optimumPredicted={optimum?.predicted ?? null} />}
        </div>
      )}
    </section>
  );
}
