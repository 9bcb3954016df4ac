import type { AmountView, ContainerRow } from "@/inventory/schemas";
import { isPeroxideTestDue } from "@/lib/hazards/peroxide-due";

/** An amount with its unit, in tabular figures, never wrapped between number and unit. */
export function Amount({ value, testId }: { value: AmountView | null | undefined; testId?: string }) {
  if (!value) return <span className="text-ink-faint">—</span>;
  return (
    <span className="num whitespace-nowrap" data-testid={testId} title={`${value.base} ${value.dimension === "mass" ? "µg" : "nL"}`}>
      {value.display}
    </span>
  );
}

const STATUS_TONE: Record<ContainerRow["status"], string> = {
  available: "bg-ok-bg text-ok",
  quarantined: "bg-caution-bg text-caution",
  empty: "bg-paper-deep text-ink-faint",
  disposed: "bg-paper-deep text-ink-faint line-through",
};

export function StatusBadge({ status }: { status: ContainerRow["status"] }) {
  return <span className={`rounded px-1.5 py-0.5 text-xs font-medium ${STATUS_TONE[status]}`}>{status}</span>;
}

/** Hazard flags as short labelled marks (not colour alone). */
export function HazardFlags({ flags, today }: { flags: ContainerRow["flags"]; today?: string }) {
  const due = !!flags.peroxideTestDue && !!today && isPeroxideTestDue(flags.peroxideTestDue, today);
  return (
    <span className="inline-flex flex-wrap gap-1">
      {flags.pyrophoric && <span className="rounded bg-blocks-bg px-1.5 py-0.5 text-xs font-medium text-blocks">pyrophoric</span>}
      {flags.waterReactive && <span className="rounded bg-blocks-bg px-1.5 py-0.5 text-xs font-medium text-blocks">water-reactive</span>}
      {flags.peroxideClass && (
        <span className={`rounded px-1.5 py-0.5 text-xs font-medium ${due ? "bg-blocks-bg text-blocks" : "bg-caution-bg text-caution"}`} title={flags.peroxideTestDue ? `test due ${flags.peroxideTestDue}` : undefined}>
          peroxide {flags.peroxideClass}
          {due ? " · test due" : ""}
        </span>
      )}
    </span>
  );
}

/** A date (YYYY-MM-DD) with a caution when it is past or within `soonDays`. */
export function ExpiryDate({ date, today, soonDays = 30 }: { date: string | null; today: string; soonDays?: number }) {
  if (!date) return <span className="text-ink-faint">—</span>;
  const soon = new Date(`${today}T00:00:00Z`);
  soon.setUTCDate(soon.getUTCDate() + soonDays);
  const limit = soon.toISOString().slice(0, 10);
  if (date < today) return <span className="num font-medium text-blocks">{date} · expired</span>;
  if (date <= limit) return <span className="num font-medium text-caution">{date} · soon</span>;
  return <span className="num">{date}</span>;
}

export function PageHeader({ title, children, actions }: { title: string; children?: React.ReactNode; actions?: React.ReactNode }) {
  return (
    <div className="flex flex-wrap items-end justify-between gap-3">
      <div>
        <p className="text-sm uppercase tracking-wide text-ink-faint">Inventory</p>
        <h1>{title}</h1>
        {children && <p className="mt-1 max-w-3xl text-sm text-ink-soft">{children}</p>}
      </div>
      {actions && <div className="flex flex-wrap gap-2">{actions}</div>}
    </div>
  );
}
