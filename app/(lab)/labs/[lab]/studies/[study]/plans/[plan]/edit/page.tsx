import { randomInt } from "node:crypto";
import Link from "next/link";
import { notFound } from "next/navigation";
import { AppError } from "@/lib/errors/app-error";
import { pageLabAccess } from "@/lib/auth/page-access";
import { solventCatalogue } from "@/lib/hazards/solvents";
import { getLabSettings } from "@/lib/lab-settings/server/get-lab-settings";
import { getPlan } from "@/lib/plans/server/get-plan";
import { EDITABLE_STATES, PLAN_STATE_LABELS } from "@/lib/plans/states";
import { listChemicals } from "@/inventory/server/chemicals";
import { PlanEditor } from "@/components/plans/editor/plan-editor";

export const metadata = { title: "Edit plan" };

/** The plan editor on a saved plan (PUT /api/labs/{lab}/plans/{plan} with its version on save). */
export default async function EditPlanPage({ params }: { params: Promise<{ lab: string; study: string; plan: string }> }) {
  const { lab: slug, study: studyId, plan: planId } = await params;
  const access = await pageLabAccess(slug, "plans.edit");
  const plan = await getPlan({ labId: access.lab.id, planId }).catch((e: unknown) => {
    if (e instanceof AppError && (e.code === "not_found" || e.code === "invalid_input")) notFound();
    throw e;
  });
  if (plan.studyId !== studyId) notFound();
  const planHref = `/labs/${access.lab.slug}/studies/${studyId}/plans/${plan.id}`;
  if (EDITABLE_STATES[plan.state] === undefined) {
    return (
      <div className="flex max-w-2xl flex-col gap-3" data-testid="not-editable">
        <h1>{plan.name}</h1>
        <p className="text-sm text-ink-soft">
          This plan is {PLAN_STATE_LABELS[plan.state].toLowerCase()}: it can no longer be edited. Duplicate it to plan again from it.
        </p>
        <Link href={planHref}>Back to the plan</Link>
      </div>
    );
  }
  const [{ settings }, chemicals] = await Promise.all([getLabSettings({ labId: access.lab.id }), listChemicals({ labId: access.lab.id })]);
  const knownSolvents = solventCatalogue().records.map((r) => ({ name: r.name, cas: r.cas ?? null }));
  return (
    <PlanEditor
      labSlug={access.lab.slug}
      study={{ id: studyId, name: plan.studyName }}
      settings={settings}
      knownSolvents={knownSolvents}
      chemicals={chemicals}
      plan={{ id: plan.id, version: plan.version, state: plan.state, name: plan.name, document: plan.document }}
      seed={randomInt(0, 2 ** 31)}
    />
  );
}
