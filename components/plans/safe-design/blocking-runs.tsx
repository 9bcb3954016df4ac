import type { BlockingRun } from "@/lib/plans/safe-design";
import { withUnit } from "./format";

/** The runs of the design that block: run number, run order, kind, factor values and what blocks each. */
export function BlockingRuns({ runs, units }: { runs: BlockingRun[]; units: Map<string, string | undefined> }) {
  return (
    <ul className="flex flex-col gap-2" data-testid="safe-design-blocking-runs">
      {runs.map((r) => (
        <li key={r.run} className="rounded-md border border-blocks/30 bg-paper-card px-3 py-2 text-sm" data-testid={`safe-design-run-${r.run}`}>
          <p className="font-medium text-ink">
            Run <span className="num">{r.run}</span> <span className="text-ink-soft">· run order <span className="num">{r.runOrder}</span> · {r.kind}</span>
          </p>
          <p className="num text-xs text-ink-soft">
            {Object.entries(r.natural)
              .map(([name, v]) => `${name} ${withUnit(v, units.get(name))}`)
              .join(" · ")}
          </p>
          <ul className="mt-1 flex flex-col gap-0.5">
            {r.findings.map((f, i) => (
              <li key={`${f.code}-${i}`} className="text-xs">
                <span className={`mr-1 rounded px-1 py-px font-mono text-[0.7rem] ${f.severity === "blocking" ? "bg-blocks-bg text-blocks" : "bg-caution-bg text-caution"}`}>
                  {f.severity === "blocking" ? "blocks" : "limit"} {f.code}
                </span>
                <span className="text-ink">{f.message}</span>
              </li>
            ))}
          </ul>
        </li>
      ))}
    </ul>
  );
}
