import Link from "next/link";
import { notFound } from "next/navigation";
import { AppError } from "@/lib/errors/app-error";
import { pageLabAccess } from "@/lib/auth/page-access";
import { getPlan } from "@/lib/plans/server/get-plan";
import { PlanStateBadge } from "@/components/studies/bits";

export const metadata = { title: "Plan" };

/**
 * Placeholder until the plan editor lands (issue 10 item 4, on GET/PUT
 * /api/labs/{lab}/plans/{plan}): keeps the study page's plan links valid.
 */
export default async function PlanPlaceholder({ params }: { params: Promise<{ lab: string; study: string; plan: string }> }) {
  const { lab: slug, study, plan: planId } = await params;
  const access = await pageLabAccess(slug, "plans.read");
  const plan = await getPlan({ labId: access.lab.id, planId }).catch((e: unknown) => {
    if (e instanceof AppError && e.code === "not_found") notFound();
    throw e;
  });
  if (plan.studyId !== study) notFound();
  return (
    <div className="flex max-w-2xl flex-col gap-3">
      <h1>{plan.name}</h1>
      <p className="text-sm">
        <PlanStateBadge state={plan.state} /> <span className="num">version {plan.version}</span> · <span className="num">{plan.runCount ?? "—"} runs</span> · by {plan.authorName}
      </p>
      <p className="text-sm text-ink-soft">
        The plan editor is being built. The plan, its run sheet and cautions are at <code className="font-mono text-xs">GET /api/labs/{access.lab.slug}/plans/{plan.id}</code>.
      </p>
      <p className="font-mono text-xs text-ink-faint">SHA-256 {plan.contentHash}</p>
      <Link href={`/labs/${access.lab.slug}/studies/${study}`}>Back to the study</Link>
    </div>
  );
}
