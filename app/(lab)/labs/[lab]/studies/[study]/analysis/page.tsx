import Link from "next/link";
import { orNotFound, pageLabAccess } from "@/lib/auth/page-access";
import { can } from "@/lib/auth/permissions";
import { defaultModel } from "@/lib/results/default-model";
import { loadPlanForResults } from "@/lib/results/server/common";
import { getStudy } from "@/lib/studies/server/get-study";
import { SectionHeader } from "@/components/studies/bits";
import { StudyAnalysisClient } from "@/components/analysis/study-analysis-client";

export const metadata = { title: "Study analysis" };

const WITH_RESULTS = new Set(["released", "running", "results_entered", "closed"]);

/** Several plans of a study analysed together with a block term; says which plans and runs were used. */
export default async function StudyAnalysisPage({ params, searchParams }: { params: Promise<{ lab: string; study: string }>; searchParams: Promise<{ plans?: string }> }) {
  const { lab: slug, study: studyId } = await params;
  const { plans: picked } = await searchParams;
  const access = await pageLabAccess(slug, "plans.read");
  const data = await orNotFound(getStudy({ labId: access.lab.id, studyId }));
  const plans = data.plans.filter((p) => WITH_RESULTS.has(p.state)).sort((a, b) => a.createdAt.localeCompare(b.createdAt));
  const initial = picked ? picked.split(",").filter(Boolean) : plans.map((p) => p.id);
  const loaded = await Promise.all(plans.filter((p) => initial.includes(p.id)).map((p) => loadPlanForResults({ labId: access.lab.id, planId: p.id })));
  const factors = loaded[0]?.plan.document.factors ?? [];
  const factorUnits = Object.fromEntries(factors.map((f) => [f.name, f.unit ?? ""]));
  const initialModel = defaultModel(loaded.flatMap((p) => p.runs.map((r) => factors.map((f) => r.coded[f.name] ?? 0))));
  return (
    <div className="flex flex-col gap-5">
      <SectionHeader kicker={<Link href={`/labs/${access.lab.slug}/studies/${data.study.id}`}>{data.study.name}</Link>} title="Plans analysed together">
        <p>Each plan is a block (its own day, batch or design stage), coded with the first plan&apos;s factor ranges; the block effects add up to zero. The safe envelope of the best conditions is the first plan&apos;s.</p>
      </SectionHeader>
      <StudyAnalysisClient labSlug={access.lab.slug} studyId={data.study.id} plans={plans.map((p) => ({ id: p.id, name: p.name, state: p.state, runCount: p.runCount }))} initial={initial} responses={data.study.responses} canExclude={can(access.role, "plans.execute")} factorUnits={factorUnits} initialModel={initialModel} />
    </div>
  );
}
