"use client";

import Link from "next/link";
import { useEffect, useMemo, useState } from "react";
import type { ContainerRow, ContainerQuery } from "@/inventory/schemas";
import { useContainers, useLocations, type ContainerPage, type LocationRow } from "@/lib/hooks/use-inventory";
import { DataTable, tableColumns } from "@/components/ui/data-table";
import { Banner } from "@/components/ui/banner";
import { Button } from "@/components/ui/button";
import { inputClass } from "@/components/ui/field";
import { Amount, ExpiryDate, HazardFlags, StatusBadge } from "./bits";
import { ReceiveContainerForm } from "./receive-container-form";
import { LocationForm } from "./location-form";

const col = tableColumns<ContainerRow>();
const SORTABLE = ["name", "barcode", "amount", "location", "expiresOn"] as const;

export function ContainersClient({
  labSlug,
  canManage,
  initial,
  locations: initialLocations,
  chemicals,
  today,
}: {
  labSlug: string;
  canManage: boolean;
  initial: ContainerPage;
  locations: LocationRow[];
  chemicals: Array<{ id: string; name: string }>;
  today: string;
}) {
  const { data: locationData, mutate: refreshLocations } = useLocations(labSlug, initialLocations);
  const locations = locationData?.locations ?? initialLocations;
  const [search, setSearch] = useState("");
  const [q, setQ] = useState("");
  const [status, setStatus] = useState<ContainerQuery["status"]>("all");
  const [locationId, setLocationId] = useState("");
  const [chemicalId, setChemicalId] = useState("");
  const [sort, setSort] = useState<{ id: ContainerQuery["sort"]; desc: boolean }>({ id: "name", desc: false });
  const [page, setPage] = useState(1);
  const pageSize = 25;

  useEffect(() => {
    const t = setTimeout(() => {
      setQ(search.trim());
      setPage(1);
    }, 250);
    return () => clearTimeout(t);
  }, [search]);

  const query = useMemo(() => {
    const p = new URLSearchParams({ sort: sort.id, dir: sort.desc ? "desc" : "asc", page: String(page), pageSize: String(pageSize), status });
    if (q) p.set("q", q);
    if (locationId) p.set("locationId", locationId);
    if (chemicalId) p.set("chemicalId", chemicalId);
    return p.toString();
  }, [q, status, locationId, chemicalId, sort, page]);
  const isInitial = query === new URLSearchParams({ sort: "name", dir: "asc", page: "1", pageSize: String(pageSize), status: "all" }).toString();
  const { data, error, isLoading, mutate } = useContainers(labSlug, query, isInitial ? initial : undefined);
  const rows = data?.rows ?? [];
  const total = data?.total ?? 0;
  const pages = Math.max(1, Math.ceil(total / pageSize));

  const columns = col.columns([
    col.accessor("barcode", {
      header: "Barcode",
      cell: (info) => (
        <Link href={`/labs/${labSlug}/inventory/containers/${info.row.original.id}`} className="font-mono text-xs" data-testid={`open-${info.getValue()}`}>
          {info.getValue()}
        </Link>
      ),
    }),
    col.accessor("chemicalName", {
      id: "name",
      header: "Chemical",
      cell: (info) => (
        <div>
          <div>{info.getValue()}</div>
          <div className="num text-xs text-ink-faint">
            {info.row.original.cas ?? "no CAS"}
            {info.row.original.concentration ? ` · ${Number(info.row.original.concentration)} ${info.row.original.concentrationUnit} in ${info.row.original.solvent ?? "solution"}` : ""}
          </div>
        </div>
      ),
    }),
    col.accessor("location", { id: "location", header: "Location", cell: (info) => info.getValue() ?? <span className="text-ink-faint">—</span> }),
    col.accessor("amount", { id: "amount", header: "In container", cell: (info) => <Amount value={info.getValue()} /> }),
    col.display({
      id: "available",
      header: "Free (held)",
      cell: ({ row }) => (
        <span className="whitespace-nowrap">
          <Amount value={row.original.available} />
          {row.original.held.base !== "0" && (
            <span className="text-xs text-ink-faint">
              {" "}
              (<Amount value={row.original.held} />)
            </span>
          )}
        </span>
      ),
    }),
    col.accessor("expiresOn", { id: "expiresOn", header: "Expiry", cell: (info) => <ExpiryDate date={info.getValue()} today={today} /> }),
    col.accessor("status", { header: "Status", cell: (info) => <StatusBadge status={info.getValue()} /> }),
    col.display({ id: "flags", header: "Hazards", cell: ({ row }) => <HazardFlags flags={row.original.flags} today={today} /> }),
  ]);

  return (
    <div className="flex flex-col gap-4">
      {canManage && (
        <details className="rounded-lg border border-ink-line bg-paper-card p-4">
          <summary className="cursor-pointer text-sm font-medium">Receive a container</summary>
          <div className="mt-3">
            <ReceiveContainerForm labSlug={labSlug} chemicals={chemicals} locations={locations} onCreated={() => void mutate()} />
            <div className="mt-4 border-t border-ink-line pt-3">
              <LocationForm labSlug={labSlug} onCreated={() => void refreshLocations()} />
            </div>
          </div>
        </details>
      )}
      <div className="grid gap-3 rounded-lg border border-ink-line bg-paper-card p-3 sm:grid-cols-2 lg:grid-cols-[2fr_1fr_1fr_1fr]">
        <label className="flex flex-col gap-1 text-sm">
          <span className="font-medium text-ink-soft">Search</span>
          <input type="search" className={inputClass} placeholder="Name, CAS, barcode, lot or location" value={search} onChange={(e) => setSearch(e.target.value)} data-testid="container-search" />
        </label>
        <label className="flex flex-col gap-1 text-sm">
          <span className="font-medium text-ink-soft">Chemical</span>
          <select className={inputClass} value={chemicalId} onChange={(e) => (setChemicalId(e.target.value), setPage(1))}>
            <option value="">All chemicals</option>
            {chemicals.map((c) => (
              <option key={c.id} value={c.id}>
                {c.name}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm">
          <span className="font-medium text-ink-soft">Location</span>
          <select className={inputClass} value={locationId} onChange={(e) => (setLocationId(e.target.value), setPage(1))}>
            <option value="">All locations</option>
            {locations.map((l) => (
              <option key={l.id} value={l.id}>
                {l.name}
              </option>
            ))}
          </select>
        </label>
        <label className="flex flex-col gap-1 text-sm">
          <span className="font-medium text-ink-soft">Status</span>
          <select className={inputClass} value={status} onChange={(e) => (setStatus(e.target.value as ContainerQuery["status"]), setPage(1))}>
            <option value="all">Any status</option>
            <option value="available">Available</option>
            <option value="quarantined">Quarantined</option>
            <option value="empty">Empty</option>
            <option value="disposed">Disposed</option>
          </select>
        </label>
      </div>
      {error && <Banner tone="blocks">{(error as Error).message}</Banner>}
      <DataTable
        columns={columns}
        data={rows}
        rowId={(r) => r.id}
        rowTestId={(r) => `container-${r.barcode}`}
        testId="containers"
        sorting={sort}
        sortableIds={SORTABLE}
        onSortingChange={(id) => {
          setSort((s) => ({ id: id as ContainerQuery["sort"], desc: s.id === id ? !s.desc : false }));
          setPage(1);
        }}
        empty={isLoading ? "Loading…" : q || status !== "all" || locationId || chemicalId ? "No container matches these filters." : canManage ? "No containers yet. Receive one above or import a CSV." : "The lab has no containers yet."}
      />
      <div className="flex items-center justify-between text-sm text-ink-soft">
        <span className="num" data-testid="containers-count">
          {total} container{total === 1 ? "" : "s"} · page {Math.min(page, pages)} of {pages}
        </span>
        <div className="flex gap-2">
          <Button variant="secondary" disabled={page <= 1} onClick={() => setPage((p) => Math.max(1, p - 1))}>
            Previous
          </Button>
          <Button variant="secondary" disabled={page >= pages} onClick={() => setPage((p) => p + 1)}>
            Next
          </Button>
        </div>
      </div>
    </div>
  );
}
