import { randomInt } from "node:crypto";
import Link from "next/link";
import { orNotFound, pageLabAccess } from "@/lib/auth/page-access";
import { solventCatalogue } from "@/lib/hazards/solvents";
import { getLabSettings } from "@/lib/lab-settings/server/get-lab-settings";
import { getStudy } from "@/lib/studies/server/get-study";
import { listChemicals } from "@/inventory/server/chemicals";
import { PlanEditor } from "@/components/plans/editor/plan-editor";

export const metadata = { title: "New plan" };

/** The plan editor for a new plan of a study (POST /api/labs/{lab}/studies/{study}/plans on save). */
export default async function NewPlanPage({ params }: { params: Promise<{ lab: string; study: string }> }) {
  const { lab: slug, study: studyId } = await params;
  const access = await pageLabAccess(slug, "plans.edit");
  const { study } = await orNotFound(getStudy({ labId: access.lab.id, studyId }));
  if (study.archivedAt) {
    return (
      <div className="flex max-w-2xl flex-col gap-3">
        <h1>New plan</h1>
        <p className="text-sm text-ink-soft">The study is archived; restore it before adding plans.</p>
        <Link href={`/labs/${access.lab.slug}/studies/${study.id}`}>Back to the study</Link>
      </div>
    );
  }
  const [{ settings }, chemicals] = await Promise.all([getLabSettings({ labId: access.lab.id }), listChemicals({ labId: access.lab.id })]);
  const knownSolvents = solventCatalogue().records.map((r) => ({ name: r.name, cas: r.cas ?? null }));
  return <PlanEditor labSlug={access.lab.slug} study={{ id: study.id, name: study.name }} settings={settings} knownSolvents={knownSolvents} chemicals={chemicals} plan={null} seed={randomInt(0, 2 ** 31)} />;
}
