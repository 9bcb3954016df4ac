"use client";

/**
 * The plan's moves on the plan page (issue 11): submit for review, release (reserving
 * stock), mark running and cancel — the moves of lib/plans/states.ts from the plan's
 * state that the viewer's role may make (lib/plans/actions.ts `movesFor`). A safety
 * officer gets a link to the review page instead of the review decisions. What would stop
 * a move (a blocking caution, a sign-off not yet given, a voided signature) is said next to
 * it; a refused release shows what stock is short.
 */
import Link from "next/link";
import { useRouter } from "next/navigation";
import { useState } from "react";
import type { Role } from "@/lib/auth/roles";
import { can } from "@/lib/auth/permissions";
import { postJson } from "@/lib/client/fetch-json";
import { movesFor } from "@/lib/plans/actions";
import type { PlanAction } from "@/lib/plans/states";
import type { PlanView } from "@/lib/plans/view";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";

interface Shortfall {
  chemicalId: string;
  name: string;
  needed: number;
  available: number;
  unit: string;
}

const LABELS: Partial<Record<PlanAction, string>> = {
  submit: "Submit for review",
  release: "Release and reserve stock",
  start: "Mark running",
  cancel: "Cancel plan",
};
const ROUTES: Partial<Record<PlanAction, string>> = { submit: "submit", release: "release", start: "start", cancel: "cancel" };
const DONE: Partial<Record<PlanAction, string>> = {
  submit: "Submitted: the lab's safety officers have been e-mailed.",
  release: "Released: the stock is reserved and the prep sheet is on its way to the author.",
  start: "Marked running.",
  cancel: "Cancelled; any held reservations were released.",
};

/** Amounts as the sheets print them: 2 decimals below 10, 1 below 100, none from 100. */
const amount = (x: number) => (Math.abs(x) >= 100 ? x.toFixed(0) : Math.abs(x) >= 10 ? x.toFixed(1) : x.toFixed(2));

export function PlanStateActions({
  labSlug,
  plan,
  role,
  userId,
}: {
  labSlug: string;
  plan: Pick<PlanView, "id" | "state" | "authorId" | "releasable" | "signOffRequired" | "signature" | "problem" | "cautions">;
  role: Role;
  userId: string;
}) {
  const router = useRouter();
  const [busy, setBusy] = useState<PlanAction | null>(null);
  const [confirmCancel, setConfirmCancel] = useState(false);
  const [message, setMessage] = useState<{ tone: "ok" | "blocks"; text: string } | null>(null);
  const [shortfalls, setShortfalls] = useState<Shortfall[]>([]);

  const moves = movesFor(plan.state, role).filter((m) => ROUTES[m.action]);
  const blocking = plan.cautions.filter((c) => c.severity === "blocking");
  const reviewable = plan.state === "in_review" && can(role, "plans.review");

  /** Why a move cannot succeed now, in words (the server refuses it for the same reason). */
  const reason = (action: PlanAction): string | null => {
    if ((action === "submit" || action === "release") && plan.problem) return "The amounts cannot work yet: fix the plan first.";
    if ((action === "submit" || action === "release") && blocking.length > 0) return `A caution blocks (${blocking.map((c) => c.code).join(", ")}): change the plan first.`;
    if (action === "release" && plan.state === "draft" && plan.signOffRequired) return "A rule of the lab asks for a safety officer's sign-off: submit it for review.";
    if (action === "release" && plan.state === "approved" && !plan.signature?.valid) return "The approval no longer applies: submit it for review again.";
    return null;
  };

  const run = async (action: PlanAction) => {
    setBusy(action);
    setMessage(null);
    setShortfalls([]);
    const res = await postJson<{ plan: PlanView }>(`/api/labs/${labSlug}/plans/${plan.id}/${ROUTES[action]}`, undefined);
    setBusy(null);
    setConfirmCancel(false);
    if (!res.ok) {
      const short = res.details?.shortfalls;
      if (Array.isArray(short)) setShortfalls(short as Shortfall[]);
      setMessage({ tone: "blocks", text: res.error.message });
      return;
    }
    setMessage({ tone: "ok", text: DONE[action] ?? "Done." });
    router.refresh();
  };

  if (moves.length === 0 && !reviewable && !message) return null;
  return (
    <section className="flex flex-col gap-2 rounded-lg border border-ink-line bg-paper-card p-3" aria-label="Review and release" data-testid="plan-state-actions">
      <h2 className="text-base">Review and release</h2>
      {reviewable &&
        (plan.authorId === userId ? (
          <p className="text-sm text-ink-soft">You wrote this plan: another safety officer must review it.</p>
        ) : (
          <Link href={`/labs/${labSlug}/review/${plan.id}`} className="text-sm font-medium" data-testid="open-review">
            Review and sign this plan →
          </Link>
        ))}
      {moves
        .filter((m) => m.action !== "cancel")
        .map((m) => {
          const why = reason(m.action);
          return (
            <div key={`${m.from}-${m.action}`} className="flex flex-col gap-1">
              <Button type="button" variant="primary" onClick={() => void run(m.action)} disabled={busy !== null || why !== null} data-testid={`plan-${m.action}`}>
                {busy === m.action ? "Working…" : LABELS[m.action]}
              </Button>
              {why && <p className="text-xs text-ink-faint">{why}</p>}
            </div>
          );
        })}
      {moves.some((m) => m.action === "cancel") &&
        (confirmCancel ? (
          <div className="flex flex-col gap-2 rounded-md border border-blocks/30 bg-blocks-bg p-2 text-sm text-blocks" data-testid="cancel-confirm">
            <p>Cancel this plan? {plan.state === "released" ? "Its reservations are released. " : ""}It stays in the study's history.</p>
            <div className="flex gap-2">
              <Button type="button" variant="danger" onClick={() => void run("cancel")} disabled={busy !== null} data-testid="plan-cancel-confirm">
                {busy === "cancel" ? "Cancelling…" : "Cancel plan"}
              </Button>
              <Button type="button" variant="secondary" onClick={() => setConfirmCancel(false)}>
                Keep it
              </Button>
            </div>
          </div>
        ) : (
          <Button type="button" variant="danger" onClick={() => setConfirmCancel(true)} disabled={busy !== null} data-testid="plan-cancel">
            Cancel plan
          </Button>
        ))}
      {message && (
        <Banner tone={message.tone} testId="plan-state-result">
          {message.text}
        </Banner>
      )}
      {shortfalls.length > 0 && (
        <table className="w-full text-sm" data-testid="shortfalls">
          <caption className="pb-1 text-left text-xs text-ink-soft">Short stock (nothing was reserved; the stockkeepers were told)</caption>
          <thead>
            <tr className="border-b border-ink-line text-left text-ink-soft">
              <th className="py-1 pr-2 font-medium">Chemical</th>
              <th className="py-1 pr-2 text-right font-medium">Needed</th>
              <th className="py-1 text-right font-medium">Available</th>
            </tr>
          </thead>
          <tbody>
            {shortfalls.map((s) => (
              <tr key={`${s.chemicalId}-${s.unit}`} className="border-b border-ink-line/60 last:border-0">
                <td className="py-1 pr-2">{s.name}</td>
                <td className="num py-1 pr-2 text-right whitespace-nowrap">
                  {amount(s.needed)} {s.unit}
                </td>
                <td className="num py-1 text-right whitespace-nowrap text-blocks">
                  {amount(s.available)} {s.unit}
                </td>
              </tr>
            ))}
          </tbody>
        </table>
      )}
    </section>
  );
}
