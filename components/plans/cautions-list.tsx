/**
 * A plan's cautions, worst first (the hazard engine's own order, `compareCautions`): per
 * caution its severity in words, code and title, what it found, the runs it touches and
 * the remedy; above them whether a caution blocks release and whether the plan needs a
 * safety officer's sign-off; below them the planning-aid notice (every screen that shows
 * cautions says it). Used by the editor's preview, the plan page and the review screen.
 */
import { CAUTION_RULES, PLANNING_NOTICE, compareCautions, type Caution, type Severity } from "@/lib/hazards/caution-rules";
import { runList } from "./run-list";

const SEVERITY: Record<Severity, { word: string; className: string }> = {
  blocking: { word: "Blocks release", className: "bg-blocks-bg text-blocks border-blocks/30" },
  warning: { word: "Caution", className: "bg-caution-bg text-caution border-caution/30" },
  info: { word: "Note", className: "bg-paper-deep text-ink-soft border-ink-line" },
};

export interface CautionsReport {
  cautions: readonly Caution[];
  releasable: boolean;
  signOffRequired: boolean;
  signOffReasons: readonly string[];
  notice?: string;
}

export function CautionsList({ report, testId = "cautions", onRunsClick }: { report: CautionsReport; testId?: string; onRunsClick?: (runs: number[]) => void }) {
  const sorted = [...report.cautions].sort(compareCautions);
  const blocking = sorted.filter((c) => c.severity === "blocking").length;
  const warnings = sorted.filter((c) => c.severity === "warning").length;
  return (
    <div className="flex flex-col gap-3" data-testid={testId}>
      <div className="flex flex-wrap gap-2 text-sm" data-testid={`${testId}-summary`}>
        {blocking > 0 ? (
          <span className="rounded-md border border-blocks/30 bg-blocks-bg px-2 py-1 font-medium text-blocks">
            {blocking} {blocking === 1 ? "caution blocks" : "cautions block"} release
          </span>
        ) : (
          <span className="rounded-md border border-ok/30 bg-ok-bg px-2 py-1 font-medium text-ok">Nothing blocks release</span>
        )}
        {warnings > 0 && (
          <span className="rounded-md border border-caution/30 bg-caution-bg px-2 py-1 font-medium text-caution">
            {warnings} {warnings === 1 ? "caution" : "cautions"} to act on
          </span>
        )}
        <span className={`rounded-md border px-2 py-1 ${report.signOffRequired ? "border-caution/30 bg-caution-bg text-caution" : "border-ink-line bg-paper-card text-ink-soft"}`} data-testid={`${testId}-signoff`}>
          {report.signOffRequired ? "Needs a safety officer's sign-off" : "No sign-off needed"}
        </span>
      </div>
      {report.signOffRequired && report.signOffReasons.length > 0 && (
        <p className="text-sm text-ink-soft">
          Sign-off because of {report.signOffReasons.map((r) => r.replace(/\.$/, "")).join("; ")}.
        </p>
      )}
      {sorted.length === 0 ? (
        <p className="text-sm text-ink-soft">No caution fired for this plan.</p>
      ) : (
        <ol className="flex flex-col gap-2">
          {sorted.map((c) => {
            const rule = (CAUTION_RULES as Record<string, { title: string } | undefined>)[c.code];
            const sev = SEVERITY[c.severity];
            return (
              <li key={`${c.code}-${c.component ?? ""}-${c.message}`} className="rounded-lg border border-ink-line bg-paper-card px-3 py-2" data-testid={`${testId}-item`} data-code={c.code} data-severity={c.severity}>
                <div className="flex flex-wrap items-baseline gap-x-2 gap-y-1">
                  <span className={`rounded border px-1.5 py-0.5 text-xs font-semibold ${sev.className}`}>{sev.word}</span>
                  <span className="font-mono text-xs text-ink-faint">{c.code}</span>
                  <span className="text-sm font-semibold">{rule?.title ?? c.code}</span>
                  {c.component && <span className="text-sm text-ink-soft">— {c.component}</span>}
                </div>
                <p className="mt-1 text-sm">{c.message}</p>
                <p className="mt-1 text-sm">
                  {onRunsClick && c.runs.length > 0 ? (
                    <button type="button" className="num text-accent underline-offset-2 hover:underline" onClick={() => onRunsClick(c.runs)}>
                      {runList(c.runs)}
                    </button>
                  ) : (
                    <span className="num text-ink-soft" data-testid={`${testId}-runs`}>
                      {runList(c.runs)}
                    </span>
                  )}
                </p>
                <p className="mt-1 text-xs text-ink-soft">
                  <span className="font-medium">Remedy:</span> {c.remedy}
                </p>
              </li>
            );
          })}
        </ol>
      )}
      <p className="rounded-md border border-caution/30 bg-caution-bg/60 px-3 py-2 text-xs text-ink" data-testid={`${testId}-notice`}>
        {report.notice ?? PLANNING_NOTICE}
      </p>
    </div>
  );
}
