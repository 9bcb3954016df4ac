import Link from "next/link";
import { pageLabAccess } from "@/lib/auth/page-access";
import { StudyForm } from "@/components/studies/study-form";
import { SectionHeader } from "@/components/studies/bits";

export const metadata = { title: "New study" };

export default async function NewStudyPage({ params }: { params: Promise<{ lab: string }> }) {
  const { lab: slug } = await params;
  const access = await pageLabAccess(slug, "studies.manage");
  return (
    <div className="flex flex-col gap-5">
      <SectionHeader kicker={<Link href={`/labs/${access.lab.slug}/studies`}>Studies</Link>} title="New study">
        Name what you want to improve and how you will measure it. Plans come next, inside the study.
      </SectionHeader>
      <StudyForm labSlug={access.lab.slug} />
    </div>
  );
}
