import Link from "next/link";
import { pageLabAccess } from "@/lib/auth/page-access";

export const metadata = { title: "New plan" };

/**
 * Placeholder until the plan editor lands (issue 10 item 4, built on
 * POST /api/labs/{lab}/studies/{study}/plans). Keeps the study page's "New plan" link valid.
 */
export default async function NewPlanPlaceholder({ params }: { params: Promise<{ lab: string; study: string }> }) {
  const { lab: slug, study } = await params;
  const access = await pageLabAccess(slug, "plans.edit");
  return (
    <div className="flex max-w-2xl flex-col gap-3">
      <h1>New plan</h1>
      <p className="text-sm text-ink-soft">
        The plan editor is being built. Until it arrives, a plan document can be created through the HTTP API: <code className="font-mono text-xs">POST /api/labs/{access.lab.slug}/studies/{study}/plans</code> with{" "}
        <code className="font-mono text-xs">{"{ \"document\": … }"}</code> (the <code className="font-mono text-xs">plan</code> verb&apos;s input).
      </p>
      <Link href={`/labs/${access.lab.slug}/studies/${study}`}>Back to the study</Link>
    </div>
  );
}
