"use client";

import { useState } from "react";
import { useForm } from "react-hook-form";
import { zodResolver } from "@hookform/resolvers/zod";
import type { z } from "zod";
import { adjustAmountSchema, type AdjustAmountInput, type LedgerRow, type ReservationRow } from "@/inventory/schemas";
import { useContainer, type ContainerDetail, type LocationRow } from "@/lib/hooks/use-inventory";
import { postJson } from "@/lib/client/fetch-json";
import { STOCK_UNITS } from "@/inventory/units";
import { DataTable, tableColumns } from "@/components/ui/data-table";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { Field, inputClass } from "@/components/ui/field";
import { Amount, ExpiryDate, HazardFlags, StatusBadge } from "./bits";
import { ReservationActions } from "./reservation-actions";

const ledgerCol = tableColumns<LedgerRow>();
const resCol = tableColumns<ReservationRow>();

const KIND_LABEL: Record<string, string> = { received: "Received", imported: "Imported", adjusted: "Adjusted", reserved: "Reserved", consumed: "Consumed", released: "Released", status: "Status" };

function signed(v: LedgerRow["delta"]) {
  if (v.base === "0") return <span className="text-ink-faint">—</span>;
  const neg = v.base.startsWith("-");
  return <span className={`num whitespace-nowrap ${neg ? "text-blocks" : "text-ok"}`}>{neg ? v.display.replace("-", "− ") : `+ ${v.display}`}</span>;
}

export function ContainerDetailClient({ labSlug, canManage, initial, locations, today }: { labSlug: string; canManage: boolean; initial: ContainerDetail; locations: LocationRow[]; today: string }) {
  const { data, mutate } = useContainer(labSlug, initial.container.id, initial);
  const d = data ?? initial;
  const c = d.container;
  const [message, setMessage] = useState<{ tone: "ok" | "blocks"; text: string } | null>(null);

  const ledgerColumns = ledgerCol.columns([
    ledgerCol.accessor("at", { header: "When (UTC)", cell: (i) => <span className="num whitespace-nowrap">{i.getValue().slice(0, 16).replace("T", " ")}</span> }),
    ledgerCol.accessor("kind", { header: "What", cell: (i) => KIND_LABEL[i.getValue()] ?? i.getValue() }),
    ledgerCol.accessor("delta", { header: "Amount change", cell: (i) => signed(i.getValue()) }),
    ledgerCol.accessor("heldDelta", { header: "Held change", cell: (i) => signed(i.getValue()) }),
    ledgerCol.accessor("balance", { header: "In container after", cell: (i) => <Amount value={i.getValue()} /> }),
    ledgerCol.accessor("reason", { header: "Reason" }),
    ledgerCol.accessor("actor", { header: "Who", cell: (i) => i.getValue() ?? "system" }),
  ]);
  const resColumns = resCol.columns([
    resCol.accessor("planRef", { header: "Plan", cell: (i) => <span className="whitespace-nowrap font-mono text-xs">{i.getValue()}</span> }),
    resCol.accessor("amount", { header: "Reserved", cell: (i) => <Amount value={i.getValue()} /> }),
    resCol.accessor("consumed", { header: "Used", cell: (i) => <Amount value={i.getValue()} /> }),
    resCol.accessor("status", { header: "Status" }),
    resCol.accessor("reservedBy", { header: "By" }),
    resCol.accessor("reservedAt", { header: "When", cell: (i) => <span className="num whitespace-nowrap">{i.getValue().slice(0, 10)}</span> }),
    resCol.display({ id: "actions", header: "", cell: ({ row }) => (canManage && row.original.status === "held" ? <ReservationActions labSlug={labSlug} reservation={row.original} dimension={c.amount.dimension} onDone={() => void mutate()} /> : null) }),
  ]);

  async function patch(body: Record<string, unknown>, done: string) {
    setMessage(null);
    const res = await postJson(`/api/labs/${labSlug}/containers/${c.id}`, { ...body, version: c.version }, "PATCH");
    setMessage(res.ok ? { tone: "ok", text: done } : { tone: "blocks", text: res.error.message });
    await mutate();
  }

  const facts: Array<[string, React.ReactNode]> = [
    ["Chemical", <span key="c">{c.chemicalName}</span>],
    ["CAS", <span key="cas" className="num">{c.cas ?? "—"}</span>],
    ["In container", <Amount key="a" value={c.amount} testId="container-amount" />],
    ["Held by reservations", <Amount key="h" value={c.held} />],
    ["Free", <Amount key="f" value={c.available} testId="container-free" />],
    ["Solution", c.concentration ? <span key="s" className="num">{Number(c.concentration)} {c.concentrationUnit} in {c.solvent ?? "—"}</span> : "neat"],
    ["Purity", c.purityPercent ? <span key="p" className="num">{Number(c.purityPercent)} %</span> : "—"],
    ["Location", c.location ?? "—"],
    ["Lot", c.lot ?? "—"],
    ["Received", <span key="r" className="num">{c.receivedOn ?? "—"}</span>],
    ["Opened", <span key="o" className="num">{c.openedOn ?? "sealed"}</span>],
    ["Expiry", <ExpiryDate key="e" date={c.expiresOn} today={today} />],
    ["Peroxide test due", <span key="pt" className="num">{c.flags.peroxideTestDue ?? "—"}</span>],
    ["Status", <StatusBadge key="st" status={c.status} />],
  ];

  return (
    <div className="flex flex-col gap-5">
      {message && <Banner tone={message.tone}>{message.text}</Banner>}
      <section className="grid gap-x-6 gap-y-2 rounded-lg border border-ink-line bg-paper-card p-4 text-sm sm:grid-cols-2 lg:grid-cols-3">
        {facts.map(([k, v]) => (
          <div key={k} className="flex justify-between gap-3 border-b border-ink-line/50 py-1">
            <span className="text-ink-soft">{k}</span>
            <span className="text-right">{v}</span>
          </div>
        ))}
        <div className="sm:col-span-2 lg:col-span-3">
          <HazardFlags flags={c.flags} today={today} />
        </div>
      </section>

      {canManage && (
        <section className="grid gap-4 lg:grid-cols-2">
          <AdjustForm labSlug={labSlug} containerId={c.id} defaultUnit={c.displayUnit} onDone={(text, ok) => (setMessage({ tone: ok ? "ok" : "blocks", text }), void mutate())} />
          <div className="flex flex-col gap-3 rounded-lg border border-ink-line bg-paper-card p-4">
            <h2>Container record</h2>
            <div className="grid gap-3 sm:grid-cols-2">
              <Field label="Location" htmlFor="cd-location">
                <select id="cd-location" className={inputClass} defaultValue={c.locationId ?? ""} onChange={(e) => void patch({ locationId: e.target.value }, "Location changed.")}>
                  <option value="">None</option>
                  {locations.map((l) => (
                    <option key={l.id} value={l.id}>
                      {l.name}
                    </option>
                  ))}
                </select>
              </Field>
              <Field label="Status" htmlFor="cd-status">
                <select id="cd-status" className={inputClass} value={c.status} onChange={(e) => void patch({ status: e.target.value }, "Status changed.")}>
                  <option value="available">available</option>
                  <option value="quarantined">quarantined</option>
                  <option value="empty">empty</option>
                  <option value="disposed">disposed</option>
                </select>
              </Field>
            </div>
            <div className="flex flex-wrap gap-2">
              {!c.openedOn && (
                <Button variant="secondary" onClick={() => void patch({ openedOn: today }, "Marked as opened today.")}>
                  Mark opened today
                </Button>
              )}
              {c.flags.peroxideClass && (
                <Button variant="secondary" onClick={() => void patch({ peroxideTestedOn: today }, "Peroxide test recorded for today.")}>
                  Record peroxide test (negative) today
                </Button>
              )}
            </div>
          </div>
        </section>
      )}

      <section className="flex flex-col gap-2">
        <h2>Ledger</h2>
        <p className="text-sm text-ink-soft">Every change of this container, oldest first. Lines cannot be edited or deleted.</p>
        <DataTable columns={ledgerColumns} data={d.ledger} rowId={(l) => l.id} testId="ledger" empty="No ledger lines yet." />
      </section>
      <section className="flex flex-col gap-2">
        <h2>Reservations</h2>
        <DataTable columns={resColumns} data={d.reservations} rowId={(r) => r.id} testId="container-reservations" empty="No plan has reserved this container." />
      </section>
    </div>
  );
}

function AdjustForm({ labSlug, containerId, defaultUnit, onDone }: { labSlug: string; containerId: string; defaultUnit: string; onDone: (text: string, ok: boolean) => void }) {
  const { register, handleSubmit, formState, setError, reset } = useForm<AdjustAmountInput, unknown, z.output<typeof adjustAmountSchema>>({
    resolver: zodResolver(adjustAmountSchema),
    defaultValues: { amount: "", unit: defaultUnit, reason: "" },
  });
  const onSubmit = handleSubmit(async (v) => {
    const res = await postJson(`/api/labs/${labSlug}/containers/${containerId}/adjust`, v);
    if (!res.ok) {
      for (const i of res.error.issues) if (i.path === "amount" || i.path === "unit" || i.path === "reason") setError(i.path, { message: i.message });
      onDone(res.error.message, false);
      return;
    }
    reset({ amount: "", unit: v.unit, reason: "" });
    onDone(`Amount set to ${v.amount} ${v.unit}.`, true);
  });
  return (
    <form onSubmit={onSubmit} noValidate className="flex flex-col gap-3 rounded-lg border border-ink-line bg-paper-card p-4">
      <h2>Stock-take</h2>
      <p className="text-sm text-ink-soft">Set the amount you counted or weighed; the difference goes in the ledger with your reason.</p>
      <div className="grid gap-3 sm:grid-cols-[1fr_6rem]">
        <Field label="Amount now in the container" htmlFor="adj-amount" error={formState.errors.amount?.message}>
          <input id="adj-amount" inputMode="decimal" className={`${inputClass} num`} {...register("amount")} />
        </Field>
        <Field label="Unit" htmlFor="adj-unit" error={formState.errors.unit?.message}>
          <select id="adj-unit" className={inputClass} {...register("unit")}>
            {STOCK_UNITS.map((u) => (
              <option key={u}>{u}</option>
            ))}
          </select>
        </Field>
      </div>
      <Field label="Reason" htmlFor="adj-reason" error={formState.errors.reason?.message}>
        <input id="adj-reason" className={inputClass} placeholder="e.g. weighed at stock-take" {...register("reason")} />
      </Field>
      <div>
        <Button type="submit" disabled={formState.isSubmitting}>
          Save amount
        </Button>
      </div>
    </form>
  );
}
