/**
 * The stock a plan holds (issue 11 "Release"): the reservations release made for it, tied
 * to the plan by `reservations.plan_id` — container, chemical, amount and whether each is
 * still held, consumed by the results or released (cancelled, or not used). Nothing shows
 * before the plan is released.
 */
import type { PlanView } from "@/lib/plans/view";

const STATUS: Record<PlanView["reservations"][number]["status"], { word: string; className: string }> = {
  held: { word: "held", className: "bg-ok-bg text-ok" },
  consumed: { word: "consumed", className: "bg-paper-deep text-ink-soft" },
  released: { word: "released", className: "bg-paper-deep text-ink-faint" },
};

export function PlanReservations({ labSlug, plan }: { labSlug: string; plan: Pick<PlanView, "reservations"> }) {
  if (plan.reservations.length === 0) return null;
  const held = plan.reservations.filter((r) => r.status === "held").length;
  return (
    <section className="flex flex-col gap-2 rounded-lg border border-ink-line bg-paper-card p-3 text-sm" aria-label="Stock for this plan" data-testid="plan-reservations">
      <h2 className="text-base">Stock for this plan</h2>
      <p className="text-xs text-ink-soft">
        <span className="num">{held}</span> of <span className="num">{plan.reservations.length}</span> reservations held (first to expire first, opened before sealed).
      </p>
      <ul className="flex flex-col gap-1.5">
        {plan.reservations.map((r) => (
          <li key={r.id} className="flex flex-col border-b border-ink-line/60 pb-1.5 last:border-0 last:pb-0" data-testid="plan-reservation">
            <span className="flex items-baseline justify-between gap-2">
              <a href={`/labs/${labSlug}/inventory/containers/${r.containerId}`} className="font-mono text-xs">
                {r.barcode}
              </a>
              <span className="num whitespace-nowrap">{r.amount.display}</span>
            </span>
            <span className="flex items-baseline justify-between gap-2 text-xs text-ink-soft">
              <span className="min-w-0 truncate" title={r.chemicalName}>
                {r.chemicalName}
              </span>
              <span className={`rounded px-1 py-0.5 text-[11px] font-medium ${STATUS[r.status].className}`}>{STATUS[r.status].word}</span>
            </span>
          </li>
        ))}
      </ul>
    </section>
  );
}
