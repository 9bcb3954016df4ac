"use client";
/**
 * The vial map of a plan: one SVG block per set temperature, each vial filled with its
 * temperature group's colour and pattern (legend below), the run number in the vial.
 * Pointing at, tapping or tabbing to a vial shows its run's conditions and amounts in
 * the panel beside the map. Prints cleanly: the panel and the focus ring are hidden,
 * outlines turn black, the legend stays.
 *
 * Where the runs go is the rule of lib/plans/vial-map.ts (the same the prep sheet and
 * the worklist use); how they are drawn is lib/reports/vial-map-drawing.ts.
 */
import { useId, useMemo, useState } from "react";
import type { Dispense } from "@/lib/chemistry";
import { vialMap, type VialBlock } from "@/lib/plans/vial-map";
import { celsius, microlitres, milligrams, withUnit } from "@/lib/reports/format";
import { blockGeometry, blockTitle, groupFill, groupStyle, legendEntries, patternElements, patternId, SHEET_COLORS } from "@/lib/reports/vial-map-drawing";

/** What the map shows of a run (a run sheet's run has all of it). */
export interface VialMapRun {
  run: number;
  runOrder: number;
  kind: string;
  temperatureC: number;
  natural: Record<string, number>;
  finalVolumeUl: number;
  dispense: ReadonlyArray<Pick<Dispense, "step" | "kind" | "name" | "volumeUl" | "massMg">>;
}

export interface VialMapProps {
  runs: readonly VialMapRun[];
  /** Positions of the lab's block: 24, 48 or 96. */
  positions: number;
  /** Units of the factors, by name (e.g. { temperature: "degC", baseEquiv: "equiv" }). */
  factorUnits?: Record<string, string>;
  fill?: "rows" | "columns";
  /** The run whose details show first (controlled with `onSelectRun`). */
  selectedRun?: number | null;
  onSelectRun?: (run: number | null) => void;
  /** Runs to ring (e.g. those a caution touches). */
  highlightRuns?: readonly number[];
}

const SELECT = "#2f4a6d"; // accent (tailwind.config.ts): the deep slate blue of actions and focus

/** The fill patterns of the given temperature groups. */
function Patterns({ groups, suffix }: { groups: readonly number[]; suffix: string }) {
  return (
    <defs>
      {groups.map((g) => {
        const els = patternElements(g);
        if (els.length === 0) return null;
        return (
          <pattern key={g} id={patternId(g, suffix)} patternUnits="userSpaceOnUse" width={6} height={6}>
            <rect width={6} height={6} fill={groupStyle(g).fill} />
            {els.map((e, i) =>
              e.tag === "circle" ? (
                <circle key={i} cx={e.cx} cy={e.cy} r={e.r} fill={e.fill} stroke={e.stroke} strokeWidth={e.strokeWidth} />
              ) : (
                <path key={i} d={e.d} stroke={e.stroke} strokeWidth={e.strokeWidth} fill="none" />
              ),
            )}
          </pattern>
        );
      })}
    </defs>
  );
}

function Block(props: {
  block: VialBlock;
  suffix: string;
  active: number | null;
  highlight: ReadonlySet<number>;
  describe: (run: number) => string;
  onPick: (run: number) => void;
}) {
  const { block, suffix, active, highlight } = props;
  const g = blockGeometry(block.rows, block.columns, 34);
  const fs = g.cell * 0.36;
  const title = blockTitle(block);
  return (
    <figure className="m-0">
      <figcaption className="mb-1 text-sm font-semibold text-ink">{title}</figcaption>
      <svg viewBox={`0 0 ${g.width} ${g.height}`} width={g.width} height={g.height} className="max-w-full h-auto" role="group" aria-label={title}>
        <Patterns groups={[block.group]} suffix={suffix} />
        <rect
          x={g.gridX - g.cell * 0.15}
          y={g.gridY - g.cell * 0.15}
          width={block.columns * g.cell + g.cell * 0.3}
          height={block.rows * g.cell + g.cell * 0.3}
          rx={g.cell * 0.3}
          fill={SHEET_COLORS.paper}
          className="stroke-ink-faint print:stroke-black"
          strokeWidth={1}
        />
        {Array.from({ length: block.columns }, (_, c) => (
          <text key={`c${c}`} x={g.centre(0, c).cx} y={g.gridY - g.cell * 0.3} textAnchor="middle" fontSize={fs} fill={SHEET_COLORS.soft}>
            {c + 1}
          </text>
        ))}
        {Array.from({ length: block.rows }, (_, r) => (
          <text key={`r${r}`} x={g.gridX * 0.45} y={g.centre(r, 0).cy + fs * 0.35} textAnchor="middle" fontSize={fs} fill={SHEET_COLORS.soft}>
            {String.fromCharCode(65 + r)}
          </text>
        ))}
        {block.positions.map((p) => {
          const { cx, cy } = g.centre(p.row, p.column);
          if (p.run === null) {
            return <circle key={p.label} cx={cx} cy={cy} r={g.radius} fill={SHEET_COLORS.empty} stroke={SHEET_COLORS.faint} strokeWidth={0.6} strokeDasharray="1.5 1.5" aria-hidden />;
          }
          const run = p.run;
          const isActive = active === run;
          return (
            <g
              key={p.label}
              role="button"
              tabIndex={0}
              aria-label={props.describe(run)}
              aria-pressed={isActive}
              data-run={run}
              data-position={p.label}
              className="cursor-pointer outline-none"
              onMouseEnter={() => props.onPick(run)}
              onFocus={() => props.onPick(run)}
              onClick={() => props.onPick(run)}
              onKeyDown={(e) => {
                if (e.key === "Enter" || e.key === " ") {
                  e.preventDefault();
                  props.onPick(run);
                }
              }}
            >
              <title>{props.describe(run)}</title>
              <circle cx={cx} cy={cy} r={g.radius} fill={groupFill(block.group, suffix)} className="stroke-ink print:stroke-black" strokeWidth={1} />
              <circle cx={cx} cy={cy} r={g.radius * 0.66} fill="#ffffff" stroke={groupStyle(block.group).fill} strokeWidth={0.6} />
              <text x={cx} y={cy + fs * 0.36} textAnchor="middle" fontSize={fs * (run >= 100 ? 0.8 : 1)} fontWeight={600} fill={SHEET_COLORS.ink} className="num">
                {run}
              </text>
              {highlight.has(run) ? <circle cx={cx} cy={cy} r={g.radius + 2.5} fill="none" stroke={SHEET_COLORS.ink} strokeWidth={1.2} strokeDasharray="2 1.5" /> : null}
              {isActive ? <circle cx={cx} cy={cy} r={g.radius + 3} fill="none" stroke={SELECT} strokeWidth={2.5} className="print:hidden" /> : null}
            </g>
          );
        })}
      </svg>
    </figure>
  );
}

function amount(d: VialMapRun["dispense"][number]): string {
  if (d.kind === "solid") return d.massMg === null ? "—" : milligrams(d.massMg);
  return d.volumeUl === null ? "—" : microlitres(d.volumeUl);
}

function RunPanel({ run, vial, factorUnits }: { run: VialMapRun | undefined; vial: string | undefined; factorUnits: Record<string, string> }) {
  if (!run) {
    return <p className="text-sm text-ink-soft">Point at, tap or tab to a vial to see its run.</p>;
  }
  return (
    <div className="text-sm">
      <p className="font-semibold text-ink">
        Run {run.run} · vial {vial} · {run.kind}
      </p>
      <p className="text-ink-soft">
        Run order {run.runOrder} · {celsius(run.temperatureC)} · final volume {microlitres(run.finalVolumeUl)}
      </p>
      <dl className="mt-2 grid grid-cols-[auto_auto] gap-x-3 gap-y-0.5">
        {Object.entries(run.natural).map(([k, v]) => (
          <div key={k} className="contents">
            <dt className="text-ink-soft">{k}</dt>
            <dd className="num m-0 text-right">{withUnit(v, factorUnits[k])}</dd>
          </div>
        ))}
      </dl>
      <table className="mt-2 w-full text-left">
        <caption className="sr-only">What to add to run {run.run}, in order</caption>
        <thead>
          <tr className="text-ink-soft">
            <th className="pr-2 font-normal">Step</th>
            <th className="pr-2 font-normal">Add</th>
            <th className="text-right font-normal">Amount</th>
          </tr>
        </thead>
        <tbody>
          {run.dispense.map((d) => (
            <tr key={d.step}>
              <td className="pr-2">{d.step}</td>
              <td className="pr-2">{d.name}</td>
              <td className="text-right whitespace-nowrap">{amount(d)}</td>
            </tr>
          ))}
        </tbody>
      </table>
    </div>
  );
}

export function VialMap(props: VialMapProps) {
  const { runs, positions, fill, factorUnits = {}, highlightRuns = [] } = props;
  const suffix = useId().replace(/[^A-Za-z0-9_-]/g, "");
  const map = useMemo(() => vialMap(runs, { positions, fill }), [runs, positions, fill]);
  const [own, setOwn] = useState<number | null>(props.selectedRun ?? null);
  const active = props.selectedRun !== undefined ? props.selectedRun : own;
  const pick = (run: number | null) => {
    setOwn(run);
    props.onSelectRun?.(run);
  };
  const byRun = useMemo(() => new Map(runs.map((r) => [r.run, r])), [runs]);
  const place = useMemo(() => new Map(map.placements.map((p) => [p.run, p])), [map]);
  const highlight = useMemo(() => new Set(highlightRuns), [highlightRuns]);
  const describe = (run: number) => {
    const p = place.get(run);
    const r = byRun.get(run);
    return `Run ${run}, vial ${p?.vial ?? "?"}, ${r ? celsius(r.temperatureC) : ""}`;
  };
  return (
    <section aria-label="Vial map" className="flex flex-col gap-4 lg:flex-row lg:items-start">
      <div className="flex min-w-0 flex-1 flex-col gap-4">
        <div className="flex flex-wrap gap-6">
          {map.blocks.map((b) => (
            <Block key={b.index} block={b} suffix={`${suffix}b${b.index}`} active={active} highlight={highlight} describe={describe} onPick={pick} />
          ))}
        </div>
        <ul className="m-0 flex list-none flex-wrap gap-x-5 gap-y-1 p-0 text-sm" aria-label="Legend: temperature groups">
          {legendEntries(map).map((e) => (
            <li key={e.group} className="flex items-center gap-1.5">
              <svg width={16} height={16} viewBox="0 0 16 16" aria-hidden>
                <Patterns groups={[e.group]} suffix={`${suffix}l`} />
                <circle cx={8} cy={8} r={6.5} fill={groupFill(e.group, `${suffix}l`)} stroke="#000" strokeWidth={0.8} />
              </svg>
              <span className="num">
                {e.label}
                <span className="text-ink-soft">
                  {" "}
                  — {e.blocks.length === 1 ? `block ${e.blocks[0]}` : `blocks ${e.blocks.join(", ")}`}, {e.runs} {e.runs === 1 ? "run" : "runs"} ({e.style.pattern})
                </span>
              </span>
            </li>
          ))}
        </ul>
      </div>
      {/* A fixed width beside the blocks: a panel that grew as it filled would rewrap them and put another vial under the pointer. */}
      <aside className="w-full max-w-sm rounded-md border border-ink-line bg-paper-card p-3 lg:w-64 lg:shrink-0 print:hidden" aria-live="polite">
        <RunPanel run={active === null ? undefined : byRun.get(active)} vial={active === null ? undefined : place.get(active)?.vial} factorUnits={factorUnits} />
      </aside>
    </section>
  );
}
