import type { AlternativeKind } from "@/lib/doe/safe-alternatives";
import { ALTERNATIVE_LABELS } from "@/lib/plans/safe-design-labels";
import type { SafeDesignAlternative } from "@/lib/plans/safe-design";
import { Button } from "@/components/ui/button";

/** One row of the comparison: an alternative, or one still being searched for. */
export type AlternativeRow = SafeDesignAlternative | { kind: AlternativeKind; pending: true; failed: boolean };

const isPending = (r: AlternativeRow): r is Extract<AlternativeRow, { pending: true }> => "pending" in r;

/**
 * The alternatives side by side: what each changes, its run count, whether anything still
 * blocks, its D-efficiency relative to the plan's design, and one click to apply it.
 */
export function AlternativesTable({ rows, originalRuns, onApply }: { rows: AlternativeRow[]; originalRuns: number; onApply: (alt: SafeDesignAlternative) => void }) {
  return (
    <table className="w-full border-collapse text-sm" data-testid="safe-design-alternatives">
      <thead>
        <tr className="border-b border-ink-line text-left text-xs uppercase tracking-wide text-ink-faint">
          <th className="py-1 pr-2 font-medium">Alternative</th>
          <th className="py-1 pr-2 text-right font-medium">Runs</th>
          <th className="py-1 pr-2 font-medium">Blocks?</th>
          <th className="whitespace-nowrap py-1 pr-2 text-right font-medium" title="D-efficiency relative to the plan's design for the model">D-eff.</th>
          <th className="py-1 font-medium">
            <span className="sr-only">Apply</span>
          </th>
        </tr>
      </thead>
      <tbody>
        {rows.map((a) => {
          const label = ALTERNATIVE_LABELS[a.kind];
          if (isPending(a)) {
            return (
              <tr key={a.kind} className="border-b border-ink-line/60 align-top" data-testid={`safe-design-alt-${a.kind}`}>
                <td className="py-2 pr-2" colSpan={5}>
                  <p className="font-medium text-ink">{label}</p>
                  <p className="text-xs text-ink-soft">{a.failed ? "The search could not be completed; change the plan to try again." : "Searching the candidate points the hazard engine allows…"}</p>
                </td>
              </tr>
            );
          }
          if (!a.available) {
            return (
              <tr key={a.kind} className="border-b border-ink-line/60 align-top text-ink-faint" data-testid={`safe-design-alt-${a.kind}`}>
                <td className="py-2 pr-2" colSpan={5}>
                  <p className="font-medium">{label}</p>
                  <p className="text-xs">Not offered: {a.summary}.</p>
                </td>
              </tr>
            );
          }
          const eff = a.dEfficiency === null ? "—" : `${(100 * a.dEfficiency).toFixed(0)} %`;
          return (
            <tr key={a.kind} className="border-b border-ink-line/60 align-top" data-testid={`safe-design-alt-${a.kind}`}>
              <td className="py-2 pr-2">
                <p className="font-medium text-ink">{label}</p>
                <ul className="num text-xs text-ink-soft">
                  {a.changes.map((c) => (
                    <li key={c}>{c}</li>
                  ))}
                </ul>
              </td>
              <td className="num py-2 pr-2 text-right">
                {a.runCount}
                {a.runCount !== originalRuns ? <span className="block text-xs text-ink-faint">was {originalRuns}</span> : null}
              </td>
              <td className="py-2 pr-2">
                {a.nothingBlocks ? (
                  <span className="rounded bg-ok-bg px-1.5 py-0.5 text-xs font-medium text-ok">none</span>
                ) : (
                  <span className="rounded bg-blocks-bg px-1.5 py-0.5 text-xs font-medium text-blocks" title={`runs ${a.stillBlocking.join(", ")}`}>
                    <span className="num">{a.stillBlocking.length}</span> run{a.stillBlocking.length === 1 ? "" : "s"}
                  </span>
                )}
              </td>
              <td className="num whitespace-nowrap py-2 pr-2 text-right">{eff}</td>
              <td className="py-2 text-right">
                <Button type="button" variant={a.nothingBlocks ? "primary" : "secondary"} className="px-2 py-1 text-xs" onClick={() => onApply(a)} data-testid={`apply-${a.kind}`} aria-label={`Apply ${label}`}>
                  Apply
                </Button>
              </td>
            </tr>
          );
        })}
      </tbody>
    </table>
  );
}
