import Link from "next/link";
import { orNotFound, pageLabAccess } from "@/lib/auth/page-access";
import { can } from "@/lib/auth/permissions";
import { getStudy } from "@/lib/studies/server/get-study";
import { RESPONSE_GOAL_LABELS } from "@/lib/studies/schemas";
import { SectionHeader, When } from "@/components/studies/bits";
import { StudyPlansTable } from "@/components/studies/study-plans-table";
import { buttonClass } from "@/components/ui/button";

export const metadata = { title: "Study" };

export default async function StudyPage({ params }: { params: Promise<{ lab: string; study: string }> }) {
  const { lab: slug, study: studyId } = await params;
  const access = await pageLabAccess(slug, "studies.read");
  const canEditPlans = can(access.role, "plans.edit");
  const data = await orNotFound(getStudy({ labId: access.lab.id, studyId }));
  const { study, plans } = data;
  const base = `/labs/${access.lab.slug}/studies`;
  return (
    <div className="flex flex-col gap-6">
      <SectionHeader
        kicker={<Link href={base}>Studies</Link>}
        title={<span data-testid="study-name">{study.name}</span>}
        actions={
          canEditPlans &&
          !study.archivedAt && (
            <Link href={`${base}/${study.id}/plans/new`} className={buttonClass("primary")} data-testid="new-plan">
              New plan
            </Link>
          )
        }
      >
        <p>
          Started by {study.authorName} · updated <When iso={study.updatedAt} /> UTC
          {study.archivedAt && <span className="ml-2 rounded bg-paper-deep px-1.5 py-0.5 text-xs">archived</span>}
        </p>
      </SectionHeader>

      <section className="grid gap-4 md:grid-cols-[3fr_2fr]">
        <div className="rounded-lg border border-ink-line bg-paper-card p-4">
          <h2 className="mb-1">Goal</h2>
          <p className="whitespace-pre-line text-sm" data-testid="study-goal">
            {study.goal ?? <span className="text-ink-faint">No goal written yet.</span>}
          </p>
          <h2 className="mb-1 mt-4">Target product</h2>
          <p className="text-sm">{study.targetProduct ?? <span className="text-ink-faint">Not given.</span>}</p>
        </div>
        <div className="rounded-lg border border-ink-line bg-paper-card p-4">
          <h2 className="mb-2">Responses</h2>
          <table className="w-full text-sm" data-testid="study-responses">
            <thead>
              <tr className="border-b border-ink-line text-left text-ink-soft">
                <th className="py-1 pr-2 font-medium">Name</th>
                <th className="py-1 pr-2 font-medium">Goal</th>
                <th className="py-1 pr-2 text-right font-medium">Target</th>
                <th className="py-1 text-right font-medium">Acceptable</th>
              </tr>
            </thead>
            <tbody>
              {study.responses.map((r) => (
                <tr key={r.name} className="border-b border-ink-line/60 last:border-0">
                  <td className="py-1 pr-2 font-mono">{r.name}</td>
                  <td className="py-1 pr-2">{RESPONSE_GOAL_LABELS[r.goal]}</td>
                  <td className="num py-1 pr-2 text-right">{r.target !== undefined ? `${r.target} ${r.unit}` : "—"}</td>
                  <td className="num py-1 text-right whitespace-nowrap">
                    {r.low !== undefined || r.high !== undefined ? `${r.low ?? "…"} – ${r.high ?? "…"} ${r.unit}` : "—"}
                  </td>
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      </section>

      <section className="flex flex-col gap-3">
        <h2>
          Plans <span className="num text-ink-faint">({study.planCount})</span>
        </h2>
        <StudyPlansTable labSlug={access.lab.slug} studyId={study.id} plans={plans} canEdit={canEditPlans && !study.archivedAt} />
      </section>
    </div>
  );
}
