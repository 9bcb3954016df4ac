import Link from "next/link";
import { notFound } from "next/navigation";
import type { ReactNode } from "react";
import { AppError } from "@/lib/errors/app-error";
import { can } from "@/lib/auth/permissions";
import { pageLabAccess } from "@/lib/auth/page-access";
import { resolveRuns } from "@/lib/chemistry/design-runs";
import { getPlan } from "@/lib/plans/server/get-plan";
import { DELETABLE_STATES, EDITABLE_STATES } from "@/lib/plans/states";
import { CautionsList } from "@/components/plans/cautions-list";
import { DesignTable, type DesignRow } from "@/components/plans/design-table";
import { PlanActions } from "@/components/plans/plan-actions";
import { PLAN_PAGE_ASIDE } from "@/components/plans/plan-page-slots";
import { PlanVialMap } from "@/components/plans/plan-vial-map";
import { RunSheetTable } from "@/components/plans/run-sheet-table";
import { StocksTable } from "@/components/plans/stocks-table";
import { ValuesUsed } from "@/components/plans/values-used";
import { PlanStateBadge, When } from "@/components/studies/bits";
import { Banner } from "@/components/ui/banner";

export const metadata = { title: "Plan" };

function Section({ title, id, children, note }: { title: string; id: string; children: ReactNode; note?: ReactNode }) {
  return (
    <section className="flex min-w-0 flex-col gap-2" aria-labelledby={`${id}-heading`} data-testid={`plan-${id}`}>
      <div className="flex flex-wrap items-baseline justify-between gap-2">
        <h2 id={`${id}-heading`}>{title}</h2>
        {note && <p className="text-sm text-ink-soft">{note}</p>}
      </div>
      {children}
    </section>
  );
}

/**
 * A plan (read view): who, what state, which version and content hash; the cautions with
 * the planning-aid notice; the design table, the run sheet per vial, the stocks and master
 * mixes, the vial map and the values the plan is computed with. Its actions and the aside
 * slot (components/plans/plan-page-slots.tsx) for the review and release panels.
 */
export default async function PlanPage({ params, searchParams }: { params: Promise<{ lab: string; study: string; plan: string }>; searchParams: Promise<{ saved?: string }> }) {
  const { lab: slug, study, plan: planId } = await params;
  const { saved } = await searchParams;
  const access = await pageLabAccess(slug, "plans.read");
  const plan = await getPlan({ labId: access.lab.id, planId }).catch((e: unknown) => {
    if (e instanceof AppError && (e.code === "not_found" || e.code === "invalid_input")) notFound();
    throw e;
  });
  if (plan.studyId !== study) notFound();
  const labSlug = access.lab.slug;
  const studyHref = `/labs/${labSlug}/studies/${study}`;
  const factors = plan.document.factors.map((f) => ({ name: f.name, unit: f.unit }));
  let designRows: readonly DesignRow[] | null = plan.runSheet?.runs ?? null;
  if (!designRows) {
    try {
      designRows = resolveRuns(plan.document);
    } catch {
      designRows = [];
    }
  }
  const blockedRuns = new Set(plan.cautions.filter((c) => c.severity === "blocking").flatMap((c) => c.runs));
  const asideProps = { plan, labSlug, role: access.role, userId: access.userId };

  return (
    <div className="flex flex-col gap-6" data-testid="plan-page">
      <div className="flex flex-col gap-1">
        <p className="text-sm uppercase tracking-wide text-ink-faint">
          <Link href={studyHref} data-testid="plan-study">
            {plan.studyName}
          </Link>{" "}
          · plan
        </p>
        <h1 data-testid="plan-name">{plan.name}</h1>
        <p className="flex flex-wrap items-center gap-x-3 gap-y-1 text-sm text-ink-soft">
          <span data-testid="plan-state">
            <PlanStateBadge state={plan.state} />
          </span>
          <span className="num" data-testid="plan-version">
            version {plan.version}
          </span>
          <span className="num">
            {plan.runCount ?? "—"} {plan.runCount === 1 ? "run" : "runs"}
          </span>
          <span>by {plan.authorName}</span>
          <span>
            updated <When iso={plan.updatedAt} /> UTC
          </span>
        </p>
        <p className="break-all font-mono text-xs text-ink-faint" data-testid="plan-hash" title="SHA-256 of the plan document's canonical JSON (RFC 8785); a signature binds to it">
          Content hash (SHA-256) {plan.contentHash}
        </p>
      </div>

      {saved && Number(saved) === plan.version && (
        <Banner tone="ok" testId="plan-saved">
          Saved: version <span className="num">{plan.version}</span>.
        </Banner>
      )}
      {plan.problem && (
        <Banner tone="blocks" testId="plan-problem">
          {plan.problem.message}
        </Banner>
      )}
      {plan.inventoryIssues.length > 0 && (
        <Banner tone="caution" testId="plan-inventory-issues">
          <p>The plan disagrees with the inventory (its hazards come from the inventory):</p>
          <ul className="mt-1 list-disc pl-5">
            {plan.inventoryIssues.map((i) => (
              <li key={`${i.path}-${i.message}`}>
                <span className="font-mono text-xs">{i.path.replace(/^document\./, "")}</span>: {i.message}
              </li>
            ))}
          </ul>
        </Banner>
      )}

      <div className="grid items-start gap-6 xl:grid-cols-[minmax(0,1fr)_18rem]">
        <div className="flex min-w-0 flex-col gap-8">
          <Section title="Cautions" id="cautions">
            <CautionsList report={plan} testId="plan-cautions-list" />
          </Section>
          <Section title="Design" id="design">
            <DesignTable runs={designRows} factors={factors} testId="plan-design-table" highlight={blockedRuns} />
          </Section>
          <Section title="Run sheet" id="run-sheet" note="per vial, in run order; masses corrected for assay">
            {plan.runSheet ? <RunSheetTable sheet={plan.runSheet} testId="plan-run-sheet-table" highlight={blockedRuns} /> : <p className="text-sm text-ink-soft">No run sheet: the amounts cannot be planned (see above).</p>}
          </Section>
          <Section title="Stocks and master mixes" id="stocks">
            {plan.runSheet ? <StocksTable stocks={plan.runSheet.stocks} notes={plan.runSheet.notes} testId="plan-stocks-list" /> : <p className="text-sm text-ink-soft">None: the amounts cannot be planned.</p>}
          </Section>
          <Section title="Vial map" id="vial-map">
            <PlanVialMap runSheet={plan.runSheet} document={plan.document} highlightRuns={[...blockedRuns]} />
          </Section>
          <Section title="Values used" id="values">
            <ValuesUsed computedWith={plan.computedWith} settingsHref={`/labs/${labSlug}/settings`} testId="plan-values-used" />
          </Section>
        </div>
        <aside className="flex flex-col gap-4 xl:sticky xl:top-4 xl:max-h-[calc(100vh-2rem)] xl:overflow-y-auto print:hidden" aria-label="Plan actions and review" data-testid="plan-aside">
          <PlanActions labSlug={labSlug} plan={plan} canEdit={can(access.role, "plans.edit")} editable={EDITABLE_STATES[plan.state] !== undefined} deletable={DELETABLE_STATES.includes(plan.state)} />
          {/* The aside slot (components/plans/plan-page-slots.tsx): state actions, signature, timeline, downloads. */}
          {PLAN_PAGE_ASIDE.map(({ id, Component }) => (
            <div key={id} data-testid={`plan-aside-${id}`}>
              <Component {...asideProps} />
            </div>
          ))}
        </aside>
      </div>
    </div>
  );
}
