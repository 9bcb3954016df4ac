import Link from "next/link";
import { pageLabAccess } from "@/lib/auth/page-access";
import { can } from "@/lib/auth/permissions";
import { listStudies } from "@/lib/studies/server/list-studies";
import { StudiesClient } from "@/components/studies/studies-client";
import { SectionHeader } from "@/components/studies/bits";
import { buttonClass } from "@/components/ui/button";

export const metadata = { title: "Studies" };

export default async function StudiesPage({ params }: { params: Promise<{ lab: string }> }) {
  const { lab: slug } = await params;
  const access = await pageLabAccess(slug, "studies.read");
  const canCreate = can(access.role, "studies.manage");
  const { studies, total, page, pageSize } = await listStudies({ labId: access.lab.id, query: { pageSize: 25 } });
  return (
    <div className="flex flex-col gap-5">
      <SectionHeader
        kicker="Studies"
        title="Studies"
        actions={
          canCreate && (
            <Link href={`/labs/${access.lab.slug}/studies/new`} className={buttonClass("primary")} data-testid="new-study">
              New study
            </Link>
          )
        }
      >
        Each study is one line of optimisation in {access.lab.name}: a goal, the responses you measure, and the plans that test it.
      </SectionHeader>
      <StudiesClient labSlug={access.lab.slug} canCreate={canCreate} initial={{ studies, total, page, pageSize }} />
    </div>
  );
}
