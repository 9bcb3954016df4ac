import Link from "next/link";
import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { AppError } from "@/lib/errors/app-error";
import { pageLabAccess } from "@/lib/auth/page-access";
import { PLAN_STATE_LABELS } from "@/lib/plans/states";
import { getPlanReview } from "@/lib/plans/server/get-plan-review";
import { waitedFor } from "@/lib/plans/review-queue";
import { CautionsList } from "@/components/plans/cautions-list";
import { PlanVialMap } from "@/components/plans/plan-vial-map";
import { RunSheetTable } from "@/components/plans/run-sheet-table";
import { StocksTable } from "@/components/plans/stocks-table";
import { ValuesUsed } from "@/components/plans/values-used";
import { ChangesSinceReview } from "@/components/review/changes-since-review";
import { PressureTable } from "@/components/review/pressure-table";
import { ReviewHistory } from "@/components/review/review-history";
import { SignDialog } from "@/components/review/sign-dialog";
import { PlanStateBadge, When } from "@/components/studies/bits";
import { Banner } from "@/components/ui/banner";

export const metadata = { title: "Review a plan" };

function Section({ title, id, children, note }: { title: string; id: string; children: ReactNode; note?: ReactNode }) {
  return (
    <section className="flex min-w-0 flex-col gap-2" aria-labelledby={`review-${id}-heading`} data-testid={`review-${id}-section`}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id={`review-${id}-heading`}>{title}</h2>
        {note && <p className="text-sm text-ink-soft">{note}</p>}
      </div>
      {children}
    </section>
  );
}

/**
 * A plan under safety review (issue 11, safety officers only): the plan, every caution
 * with the runs it touches, the per-run pressure estimates against the vessel's rating,
 * the vial map, what changed since the last review, earlier reviews, and the sign dialog
 * (decision, the meaning shown before signing, comment, password again).
 */
export default async function ReviewPlanPage({ params }: { params: Promise<{ lab: string; planId: string }> }) {
  const { lab: slug, planId } = await params;
  const access = await pageLabAccess(slug, "plans.review");
  const review = await getPlanReview({ labId: access.lab.id, planId }).catch((e: unknown) => {
    if (e instanceof AppError && (e.code === "not_found" || e.code === "invalid_input")) notFound();
    throw e;
  });
  const { plan } = review;
  const labSlug = access.lab.slug;
  const inReview = plan.state === "in_review";
  const ownPlan = plan.authorId === access.userId;
  const blocking = plan.cautions.filter((c) => c.severity === "blocking");
  const blockedRuns = [...new Set(blocking.flatMap((c) => c.runs))];
  const planHref = `/labs/${labSlug}/studies/${plan.studyId}/plans/${plan.id}`;

  return (
    <div className="flex flex-col gap-6" data-testid="review-page">
      <div className="flex flex-col gap-1">
        <p className="text-sm uppercase tracking-wide text-ink-faint">
          <Link href={`/labs/${labSlug}/review`}>Review queue</Link> · {plan.studyName}
        </p>
        <h1 data-testid="review-plan-name">{plan.name}</h1>
        <p className="flex flex-wrap items-center gap-x-3 gap-y-1 text-sm text-ink-soft">
          <span data-testid="review-plan-state">
            <PlanStateBadge state={plan.state} />
          </span>
          <span>by {plan.authorName}</span>
          <span className="num">version {plan.version}</span>
          <span className="num">
            {plan.runCount ?? "—"} {plan.runCount === 1 ? "run" : "runs"}
          </span>
          {plan.submittedAt && (
            <span>
              submitted <When iso={plan.submittedAt} /> UTC (waiting <span className="num">{waitedFor(plan.submittedAt, new Date())}</span>)
            </span>
          )}
          <Link href={planHref} data-testid="review-plan-link">
            Open the plan page
          </Link>
        </p>
        <p className="break-all font-mono text-xs text-ink-faint" title="SHA-256 of the plan document's canonical JSON (RFC 8785): the signature binds to it">
          Content hash (SHA-256) {plan.contentHash}
        </p>
      </div>

      {!inReview && (
        <Banner tone={plan.signature?.valid && plan.signature.decision === "approve" ? "ok" : "info"} testId="review-not-waiting">
          This plan is {PLAN_STATE_LABELS[plan.state].toLowerCase()}
          {plan.signature ? `, last signed by ${plan.signature.signerName} (${plan.signature.meaning}${plan.signature.valid ? "" : "; no longer valid"})` : ""}. It does not wait for review: there is nothing to sign.
        </Banner>
      )}
      {plan.problem && (
        <Banner tone="blocks" testId="review-problem">
          {plan.problem.message}
        </Banner>
      )}

      <div className="grid items-start gap-6 xl:grid-cols-[minmax(0,1fr)_24rem]">
        <div className="flex min-w-0 flex-col gap-8">
          <Section title="Cautions" id="cautions" note="worst first, with the runs each touches">
            <CautionsList report={plan} testId="review-cautions" />
          </Section>
          <Section title="Pressure in the sealed vessel" id="pressure" note="estimated per run at its set temperature">
            <PressureTable plan={plan} />
          </Section>
          <Section title="Vials on the block" id="vial-map">
            <PlanVialMap runSheet={plan.runSheet} document={plan.document} highlightRuns={blockedRuns} />
          </Section>
          <Section title="Run sheet" id="run-sheet" note="per vial, in run order; masses corrected for assay">
            {plan.runSheet ? <RunSheetTable sheet={plan.runSheet} testId="review-run-sheet-table" highlight={new Set(blockedRuns)} /> : <p className="text-sm text-ink-soft">No run sheet: the amounts cannot be planned.</p>}
          </Section>
          <Section title="Stocks and master mixes" id="stocks">
            {plan.runSheet ? <StocksTable stocks={plan.runSheet.stocks} notes={plan.runSheet.notes} testId="review-stocks-list" /> : <p className="text-sm text-ink-soft">None.</p>}
          </Section>
          <Section title="Values used" id="values">
            <ValuesUsed computedWith={plan.computedWith} settingsHref={`/labs/${labSlug}/settings`} testId="review-values-used" />
          </Section>
        </div>
        <aside className="flex flex-col gap-6" aria-label="Sign-off" data-testid="review-aside">
          <section className="flex flex-col gap-2" aria-labelledby="review-sign-heading">
            <h2 id="review-sign-heading">Sign-off</h2>
            {plan.signOffReasons.length > 0 && (
              <div className="text-sm text-ink-soft">
                <p>A rule of the lab asks for it:</p>
                <ul className="mt-1 list-disc pl-5" data-testid="review-signoff-reasons">
                  {plan.signOffReasons.map((r) => (
                    <li key={r}>{r.replace(/\.$/, "")}</li>
                  ))}
                </ul>
              </div>
            )}
            {inReview && ownPlan && (
              <p className="text-sm text-ink-soft" data-testid="review-own-plan">
                You wrote this plan: another safety officer must sign it.
              </p>
            )}
            <SignDialog labSlug={labSlug} plan={{ id: plan.id, contentHash: plan.contentHash, name: plan.name, version: plan.version }} blocked={blocking.length > 0} signable={inReview && !ownPlan} />
          </section>
          <section className="flex flex-col gap-2" aria-labelledby="review-changes-heading">
            <h2 id="review-changes-heading">Since the last review</h2>
            <ChangesSinceReview since={review.sinceLastReview} currentVersion={plan.version} />
          </section>
          <section className="flex flex-col gap-2" aria-labelledby="review-history-heading">
            <h2 id="review-history-heading">Reviews</h2>
            <ReviewHistory history={review.history} />
          </section>
        </aside>
      </div>
    </div>
  );
}
