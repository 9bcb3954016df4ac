import "server-only";
import { requireLabAccess } from "@/lib/auth/access";
import { getPlanTimeline } from "@/lib/plans/server/get-plan-timeline";
import type { PlanView } from "@/lib/plans/view";
import { Timeline } from "./timeline";

/** The timeline on the plan page (a server component: it reads the audit log of this plan). */
export async function PlanTimelinePanel({ labSlug, plan }: { labSlug: string; plan: Pick<PlanView, "id"> }) {
  const { lab } = await requireLabAccess(labSlug, "plans.read");
  const items = await getPlanTimeline({ labId: lab.id, planId: plan.id });
  return (
    <section className="flex flex-col gap-2 rounded-lg border border-ink-line bg-paper-card p-3" aria-label="Timeline" data-testid="plan-timeline">
      <h2 className="text-base">Timeline</h2>
      <Timeline items={items} />
    </section>
  );
}
