/**
 * THE PLAN PAGE'S ASIDE SLOT. The plan page (app/(lab)/labs/[lab]/studies/[study]/plans/
 * [plan]/page.tsx) renders, in its aside column under the plan's own actions (Edit,
 * Duplicate, Export JSON, Delete draft), every entry of `PLAN_PAGE_ASIDE` in order. Each
 * gets the plan as GET /plans/{plan} shows it and who is looking; it may be a server
 * component (async) or a client component, and renders null when it has nothing to show.
 *
 * Meant for the review and release stream: the state actions (submit, review, release,
 * cancel), the signature panel, the timeline and the downloads (prep sheet, worklist).
 */
import type { ReactNode } from "react";
import type { Role } from "@/lib/auth/roles";
import type { PlanView } from "@/lib/plans/view";
import { PlanDownloads } from "./plan-downloads";
import { PlanReservations } from "./plan-reservations";
import { PlanStateActions } from "./plan-state-actions";
import { PlanTimelinePanel } from "./plan-timeline-panel";
import { SignaturePanel } from "./signature-panel";

export interface PlanAsideProps {
  plan: PlanView;
  labSlug: string;
  /** The viewer's role in the lab (ask `can(role, permission)` of lib/auth/permissions.ts). */
  role: Role;
  /** The viewer's user id (no one approves their own plan: compare with `plan.authorId`). */
  userId: string;
}

export interface PlanAsideEntry {
  id: string;
  Component: (props: PlanAsideProps) => ReactNode | Promise<ReactNode>;
}

/** The aside's panels (see the module comment): review and release (issue 11, docs/review-and-release.md). */
export const PLAN_PAGE_ASIDE: readonly PlanAsideEntry[] = [
  // A client component: only what it reads crosses to the browser (not the run sheet).
  {
    id: "state-actions",
    Component: ({ plan, labSlug, role, userId }) => (
      <PlanStateActions
        labSlug={labSlug}
        plan={{ id: plan.id, state: plan.state, authorId: plan.authorId, releasable: plan.releasable, signOffRequired: plan.signOffRequired, signature: plan.signature, problem: plan.problem, cautions: plan.cautions }}
        role={role}
        userId={userId}
      />
    ),
  },
  { id: "signature", Component: ({ plan }) => <SignaturePanel plan={plan} /> },
  { id: "reservations", Component: ({ plan, labSlug }) => <PlanReservations labSlug={labSlug} plan={plan} /> },
  { id: "downloads", Component: ({ plan, labSlug }) => <PlanDownloads labSlug={labSlug} plan={plan} /> },
  { id: "timeline", Component: ({ plan, labSlug }) => <PlanTimelinePanel labSlug={labSlug} plan={plan} /> },
];
