import { displayUnit } from "@/lib/units/display-unit";
import type { ConfirmationCheck } from "@/lib/results/confirmation-check";
import { sig } from "./format";

/**
 * Observed confirmation results against the prediction, on one axis of the response: the
 * 95 % prediction interval of one run (light band), the interval for the mean of the runs
 * (darker band), the prediction (a line), each observed run (dots) and their mean (a
 * diamond, teal when the confirmation holds, brick red when it does not). Plain SVG: no
 * plotting library for five marks.
 */
export function ConfirmationChart({ c, unit }: { c: ConfirmationCheck; unit: string }) {
  if (c.predicted === null) return null;
  const observed = c.runs.flatMap((r) => (r.observed === null ? [] : [r.observed]));
  const values = [c.predicted, ...observed, ...(c.pi95 ?? []), ...(c.meanInterval95 ?? [])];
  let lo = Math.min(...values);
  let hi = Math.max(...values);
  const pad = (hi - lo || Math.abs(hi) || 1) * 0.12;
  lo -= pad;
  hi += pad;
  const W = 520;
  const H = 74;
  const left = 12;
  const right = W - 12;
  const x = (v: number) => left + ((v - lo) / (hi - lo)) * (right - left);
  const axisY = 52;
  const ticks = niceTicks(lo, hi, 5);
  const holds = c.verdict?.holds;
  const meanColor = holds === false ? "fill-blocks" : holds === true ? "fill-ok" : "fill-ink-faint";
  const u = displayUnit(unit);
  return (
    <svg viewBox={`0 0 ${W} ${H}`} className="w-full max-w-xl" role="img" aria-label={`Observed against predicted ${sig(c.predicted)} ${u}`} data-testid="confirmation-chart">
      {c.pi95 && <rect x={x(c.pi95[0])} y={18} width={Math.max(1, x(c.pi95[1]) - x(c.pi95[0]))} height={24} className="fill-accent-light" />}
      {c.meanInterval95 && <rect x={x(c.meanInterval95[0])} y={22} width={Math.max(1, x(c.meanInterval95[1]) - x(c.meanInterval95[0]))} height={16} className="fill-accent/30" />}
      <line x1={x(c.predicted)} x2={x(c.predicted)} y1={14} y2={46} className="stroke-accent" strokeWidth={2} />
      <text x={x(c.predicted)} y={10} textAnchor="middle" className="fill-accent text-[10px]">
        predicted {sig(c.predicted)}
      </text>
      {observed.map((v, i) => (
        <circle key={i} cx={x(v)} cy={30} r={3.5} className="fill-ink" opacity={0.75} />
      ))}
      {c.verdict && (
        <path d={`M ${x(c.verdict.observedMean)} 23 l 6 7 l -6 7 l -6 -7 z`} className={`${meanColor} stroke-paper-card`} strokeWidth={1} />
      )}
      <line x1={left} x2={right} y1={axisY} y2={axisY} className="stroke-ink-edge" />
      {ticks.map((t) => (
        <g key={t}>
          <line x1={x(t)} x2={x(t)} y1={axisY} y2={axisY + 4} className="stroke-ink-edge" />
          <text x={x(t)} y={axisY + 15} textAnchor="middle" className="num fill-ink-soft text-[10px]">
            {sig(t, 3)}
          </text>
        </g>
      ))}
      <text x={right} y={axisY + 15} textAnchor="end" className="fill-ink-faint text-[10px]">
        {u}
      </text>
    </svg>
  );
}

/** About `n` round tick values between lo and hi. */
function niceTicks(lo: number, hi: number, n: number): number[] {
  const raw = (hi - lo) / n;
  const mag = 10 ** Math.floor(Math.log10(raw));
  const step = [1, 2, 5, 10].map((m) => m * mag).find((s) => s >= raw) ?? raw;
  const out: number[] = [];
  for (let t = Math.ceil(lo / step) * step; t <= hi; t += step) out.push(Number(t.toPrecision(12)));
  return out;
}
