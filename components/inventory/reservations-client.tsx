"use client";

import Link from "next/link";
import { useState } from "react";
import type { ReservationRow } from "@/inventory/schemas";
import { useReservations } from "@/lib/hooks/use-inventory";
import { DataTable, tableColumns } from "@/components/ui/data-table";
import { Banner } from "@/components/ui/banner";
import { inputClass } from "@/components/ui/field";
import { Amount } from "./bits";
import { ReservationActions } from "./reservation-actions";

const col = tableColumns<ReservationRow>();
type Status = "held" | "consumed" | "released" | "all";

export function ReservationsClient({ labSlug, canManage, initial }: { labSlug: string; canManage: boolean; initial: ReservationRow[] }) {
  const [status, setStatus] = useState<Status>("held");
  const [message, setMessage] = useState<string | null>(null);
  const { data, error, mutate } = useReservations(labSlug, status, status === "held" ? initial : undefined);
  const rows = data?.reservations ?? [];
  const columns = col.columns([
    col.accessor("planRef", { header: "Plan", cell: (i) => <span className="whitespace-nowrap font-mono text-xs">{i.getValue()}</span> }),
    col.accessor("barcode", { header: "Container", cell: (i) => <Link className="font-mono text-xs" href={`/labs/${labSlug}/inventory/containers/${i.row.original.containerId}`}>{i.getValue()}</Link> }),
    col.accessor("chemicalName", { header: "Chemical" }),
    col.accessor("amount", { header: "Reserved", cell: (i) => <Amount value={i.getValue()} /> }),
    col.accessor("consumed", { header: "Used", cell: (i) => <Amount value={i.getValue()} /> }),
    col.accessor("status", { header: "Status" }),
    col.accessor("reservedBy", { header: "By" }),
    col.accessor("reservedAt", { header: "Since", cell: (i) => <span className="num whitespace-nowrap">{i.getValue().slice(0, 10)}</span> }),
    col.display({
      id: "actions",
      header: "",
      cell: ({ row }) =>
        canManage && row.original.status === "held" ? (
          <ReservationActions labSlug={labSlug} reservation={row.original} dimension={row.original.amount.dimension} onDone={(m) => (setMessage(m ?? null), void mutate())} />
        ) : null,
    }),
  ]);
  return (
    <div className="flex flex-col gap-3">
      <label className="flex max-w-xs flex-col gap-1 text-sm">
        <span className="font-medium text-ink-soft">Show</span>
        <select className={inputClass} value={status} onChange={(e) => setStatus(e.target.value as Status)}>
          <option value="held">Held now</option>
          <option value="consumed">Consumed</option>
          <option value="released">Released</option>
          <option value="all">All</option>
        </select>
      </label>
      {message && <Banner tone="ok">{message}</Banner>}
      {error && <Banner tone="blocks">{(error as Error).message}</Banner>}
      <DataTable columns={columns} data={rows} rowId={(r) => r.id} testId="reservations" empty={status === "held" ? "Nothing is held right now." : "No reservations with this status."} />
    </div>
  );
}
