"use client";

import { useMemo, useState } from "react";
import { AUDIT_PAGE_SIZES, actionLabel, entityLabel, type AuditFilterOptions, type AuditPage, type AuditRow } from "@/lib/audit/schemas";
import { useAuditLog } from "@/lib/hooks/use-audit";
import { DataTable, tableColumns } from "@/components/ui/data-table";
import { Banner } from "@/components/ui/banner";
import { inputClass } from "@/components/ui/field";
import { FieldChanges } from "./field-changes";

const col = tableColumns<AuditRow>();

export interface AuditFilters {
  entity: string;
  actor: string;
  page: number;
  pageSize: number;
}

/** The query string of a set of filters (defaults left out, so the first page's URL stays short). */
export function auditQueryString(f: AuditFilters): string {
  const p = new URLSearchParams();
  if (f.entity) p.set("entity", f.entity);
  if (f.actor) p.set("actor", f.actor);
  if (f.page > 1) p.set("page", String(f.page));
  if (f.pageSize !== AUDIT_PAGE_SIZES[0]) p.set("pageSize", String(f.pageSize));
  return p.toString();
}

const columns = col.columns([
  col.accessor("at", {
    header: "When (UTC)",
    cell: (i) => (
      <span className="num whitespace-nowrap">
        {i.getValue().slice(0, 10)} <span className="text-ink-faint">{i.getValue().slice(11, 16)}</span>
      </span>
    ),
  }),
  col.accessor("actor", {
    header: "Who",
    cell: (i) => {
      const a = i.getValue();
      if (a.kind === "system") return <span className="text-ink-faint">system</span>;
      if (a.kind === "user") return <span className="whitespace-nowrap">{a.name}</span>;
      return (
        <div data-testid="audit-token-actor">
          <span className="whitespace-nowrap font-medium">{a.name}</span>
          <div className="text-xs text-ink-faint">API token{a.onBehalfOf ? ` · for ${a.onBehalfOf}` : ""}</div>
        </div>
      );
    },
  }),
  col.display({
    id: "what",
    header: "What",
    cell: ({ row }) => (
      <div className="min-w-36">
        <span className="font-medium">{entityLabel(row.original.entityType)}</span> <span>{actionLabel(row.original.action)}</span>
        {row.original.entityName && <div className="text-xs text-ink-faint">{row.original.entityName}</div>}
      </div>
    ),
  }),
  col.accessor("changes", { header: "Changes", cell: (i) => <FieldChanges changes={i.getValue()} /> }),
]);

/**
 * The audit log: filters by record type and by person (or API token), paged on the
 * server; the filters live in the address so a filtered view can be shared or reloaded.
 */
export function AuditLogClient({ labSlug, initial, initialFilters, options }: { labSlug: string; initial: AuditPage; initialFilters: AuditFilters; options: AuditFilterOptions }) {
  const [filters, setFilters] = useState<AuditFilters>(initialFilters);
  const query = useMemo(() => auditQueryString(filters), [filters]);
  const initialQuery = useMemo(() => auditQueryString(initialFilters), [initialFilters]);
  const { data, error, isLoading, isValidating } = useAuditLog(labSlug, query, query === initialQuery ? initial : undefined);
  const page = data ?? { entries: [], total: 0, page: filters.page, pageSize: filters.pageSize };

  function update(next: Partial<AuditFilters>) {
    const merged = { ...filters, ...next };
    setFilters(merged);
    const qs = auditQueryString(merged);
    window.history.replaceState(null, "", qs ? `?${qs}` : window.location.pathname);
  }

  return (
    <div className="flex flex-col gap-4">
      <div className="flex flex-wrap items-end gap-3 rounded-lg border border-ink-line bg-paper-card p-3">
        <label className="flex min-w-48 flex-col gap-1 text-sm">
          <span className="font-medium text-ink-soft">Record</span>
          <select className={inputClass} value={filters.entity} onChange={(e) => update({ entity: e.target.value, page: 1 })} data-testid="audit-filter-entity">
            <option value="">All records</option>
            {options.entityTypes.map((t) => (
              <option key={t.value} value={t.value}>
                {t.label}
              </option>
            ))}
          </select>
        </label>
        <label className="flex min-w-56 flex-col gap-1 text-sm">
          <span className="font-medium text-ink-soft">Who</span>
          <select className={inputClass} value={filters.actor} onChange={(e) => update({ actor: e.target.value, page: 1 })} data-testid="audit-filter-actor">
            <option value="">Everyone</option>
            {options.actors.map((a) => (
              <option key={a.value} value={a.value}>
                {a.label}
              </option>
            ))}
          </select>
        </label>
        {(filters.entity || filters.actor) && (
          <button type="button" className="pb-1.5 text-sm text-accent underline-offset-2 hover:underline" onClick={() => update({ entity: "", actor: "", page: 1 })}>
            Clear filters
          </button>
        )}
      </div>
      {error && <Banner tone="blocks">{(error as Error).message}</Banner>}
      <div aria-busy={isValidating} data-testid="audit-results" className={isValidating ? "opacity-60 transition-opacity" : undefined}>
      <DataTable
        columns={columns}
        data={page.entries}
        rowId={(r) => r.id}
        testId="audit"
        rowTestId={(r) => `audit-${r.id}`}
        empty={isLoading ? "Loading…" : filters.entity || filters.actor ? "No entry matches these filters." : "Nothing has changed in this lab yet."}
        paging={{ page: filters.page, pageSize: filters.pageSize, total: page.total, pageSizes: AUDIT_PAGE_SIZES, noun: ["entry", "entries"], onChange: (p, size) => update({ page: p, pageSize: size }) }}
      />
      </div>
    </div>
  );
}
