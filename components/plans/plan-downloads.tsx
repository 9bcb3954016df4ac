/**
 * The plan's sheets to download (issue 11): the prep sheet PDF and the dispense worklist
 * CSV, rendered by the server from the plan as it is now (state, signature and hash are
 * printed on the sheet). Only plans whose amounts work have sheets.
 */
import type { PlanView } from "@/lib/plans/view";

export function PlanDownloads({ labSlug, plan }: { labSlug: string; plan: Pick<PlanView, "id" | "runSheet" | "state"> }) {
  if (!plan.runSheet) return null;
  const base = `/api/labs/${labSlug}/plans/${plan.id}`;
  const released = ["released", "running", "results_entered", "closed"].includes(plan.state);
  return (
    <section className="flex flex-col gap-2 rounded-lg border border-ink-line bg-paper-card p-3 text-sm" aria-label="Sheets" data-testid="plan-downloads">
      <h2 className="text-base">Sheets</h2>
      {!released && <p className="text-xs text-ink-faint">Not released yet: the sheets print the plan's state, so a draft cannot pass for an issued one.</p>}
      <a href={`${base}/prep-sheet.pdf`} download data-testid="download-prep-sheet">
        Prep sheet (PDF)
      </a>
      <a href={`${base}/worklist.csv`} download data-testid="download-worklist">
        Dispense worklist (CSV)
      </a>
    </section>
  );
}
