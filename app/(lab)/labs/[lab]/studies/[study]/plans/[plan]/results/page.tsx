import Link from "next/link";
import { notFound } from "next/navigation";
import { orNotFound, pageLabAccess } from "@/lib/auth/page-access";
import { can } from "@/lib/auth/permissions";
import { getPlan } from "@/lib/plans/server/get-plan";
import { getResults } from "@/lib/results/server/get-results";
import { resultsGridRuns } from "@/lib/results/server/grid-runs";
import { PlanStateBadge, SectionHeader } from "@/components/studies/bits";
import { ResultsGrid } from "@/components/results/results-grid";
import type { StockLine } from "@/components/results/complete-panel";

export const metadata = { title: "Results" };

/** The results grid of a plan: one row per run, one column per response of the study. */
export default async function PlanResultsPage({ params }: { params: Promise<{ lab: string; study: string; plan: string }> }) {
  const { lab: slug, study, plan: planId } = await params;
  const access = await pageLabAccess(slug, "plans.read");
  const found = await orNotFound(Promise.all([getPlan({ labId: access.lab.id, planId }), getResults({ labId: access.lab.id, planId })]));
  const [plan, results] = found;
  if (plan.studyId !== study) notFound();
  const base = `/labs/${access.lab.slug}/studies/${study}`;
  const stock: StockLine[] = plan.reservations
    .filter((r) => r.status === "held")
    .map((r) => {
      const [amount = "0", unit = ""] = r.amount.display.split(" ");
      return { reservationId: r.id, label: `${r.chemicalId.slice(0, 8)} · reserved ${r.amount.display}`, amount, unit };
    });
  return (
    <div className="flex flex-col gap-5">
      <SectionHeader
        kicker={
          <>
            <Link href={base}>{plan.studyName}</Link> · <Link href={`${base}/plans/${plan.id}`}>{plan.name}</Link>
          </>
        }
        title="Results"
        actions={
          <Link href={`${base}/plans/${plan.id}/analysis`} className="text-sm" data-testid="open-analysis">
            Analysis
          </Link>
        }
      >
        <p>
          <PlanStateBadge state={plan.state} /> <span className="num">{results.runNumbers.length} runs</span> · rows in run order · who entered each value and when is in the audit log.
        </p>
      </SectionHeader>
      <ResultsGrid
        labSlug={access.lab.slug}
        planId={plan.id}
        runs={resultsGridRuns(plan)}
        factors={plan.document.factors.map((f) => ({ name: f.name, unit: f.unit ?? "" }))}
        initial={results}
        canEdit={can(access.role, "plans.execute")}
        stock={stock}
      />
    </div>
  );
}
