import { pageLabAccess } from "@/lib/auth/page-access";
import { PLANNING_NOTICE } from "@/lib/hazards/caution-rules";
import { listReviewQueue } from "@/lib/plans/server/list-review-queue";
import { ReviewQueueTable } from "@/components/review/review-queue-table";
import { SectionHeader } from "@/components/studies/bits";

export const metadata = { title: "Review queue" };

/** The safety officers' review queue (issue 11): plans waiting for review, worst caution first. */
export default async function ReviewQueuePage({ params }: { params: Promise<{ lab: string }> }) {
  const { lab: slug } = await params;
  const access = await pageLabAccess(slug, "plans.review");
  const items = await listReviewQueue({ labId: access.lab.id });
  return (
    <div className="flex flex-col gap-4">
      <SectionHeader kicker="Safety review" title="Review queue">
        <p>
          Plans submitted for your sign-off, worst caution first, then the longest waiting. <span className="num">{items.length}</span> waiting.
        </p>
      </SectionHeader>
      <ReviewQueueTable labSlug={access.lab.slug} items={items} now={new Date()} />
      <p className="text-xs text-ink-soft" data-testid="planning-notice">
        {PLANNING_NOTICE}
      </p>
    </div>
  );
}
