import Link from "next/link";
import { notFound } from "next/navigation";
import { orNotFound, pageLabAccess } from "@/lib/auth/page-access";
import { can } from "@/lib/auth/permissions";
import { getPlan } from "@/lib/plans/server/get-plan";
import { getResults } from "@/lib/results/server/get-results";
import { resolveRuns } from "@/lib/chemistry/design-runs";
import { defaultModel } from "@/lib/results/default-model";
import { PlanStateBadge, SectionHeader } from "@/components/studies/bits";
import { AnalysisClient } from "@/components/analysis/analysis-client";
import { Banner } from "@/components/ui/banner";

export const metadata = { title: "Analysis" };

/** The analysis of a plan's results: model, pruning, coefficients, ANOVA, diagnostics, best conditions. */
export default async function PlanAnalysisPage({ params }: { params: Promise<{ lab: string; study: string; plan: string }> }) {
  const { lab: slug, study, plan: planId } = await params;
  const access = await pageLabAccess(slug, "plans.read");
  const found = await orNotFound(Promise.all([getPlan({ labId: access.lab.id, planId }), getResults({ labId: access.lab.id, planId })]));
  const [plan, results] = found;
  if (plan.studyId !== study) notFound();
  const base = `/labs/${access.lab.slug}/studies/${study}`;
  const entered = results.cells.filter((c) => !c.failed).length;
  const names = plan.document.factors.map((f) => f.name);
  const initialModel = defaultModel(resolveRuns(plan.document).map((r) => names.map((n) => r.coded[n] ?? 0)));
  const factorUnits = Object.fromEntries(plan.document.factors.map((f) => [f.name, f.unit ?? ""]));
  return (
    <div className="flex flex-col gap-5">
      <SectionHeader
        kicker={
          <>
            <Link href={base}>{plan.studyName}</Link> · <Link href={`${base}/plans/${plan.id}`}>{plan.name}</Link>
          </>
        }
        title="Analysis"
        actions={
          <>
            <Link href={`${base}/plans/${plan.id}/results`} className="text-sm">
              Results
            </Link>
            <Link href={`${base}/analysis?plans=${plan.id}`} className="text-sm">
              Analyse with other plans
            </Link>
          </>
        }
      >
        <p>
          <PlanStateBadge state={plan.state} /> <span className="num">{results.runNumbers.length} runs</span> · models fitted in coded units by least squares (QR); the same functions as the <code className="font-mono text-xs">fit</code> command.
        </p>
      </SectionHeader>
      {entered === 0 ? (
        <Banner tone="info" testId="no-results">
          No results yet. <Link href={`${base}/plans/${plan.id}/results`}>Enter them</Link> to analyse the plan.
        </Banner>
      ) : (
        <AnalysisClient labSlug={access.lab.slug} source={{ kind: "plan", planId: plan.id }} responses={results.responses} canExclude={can(access.role, "plans.execute")} factorUnits={factorUnits} initialModel={initialModel} planning={{ studyId: plan.studyId, canPlan: can(access.role, "plans.edit") }} />
      )}
    </div>
  );
}
