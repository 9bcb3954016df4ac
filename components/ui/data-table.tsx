"use client";

/**
 * The one wrapper around TanStack Table (v9): feature tables build typed columns with
 * `tableColumns<Row>()` and pass them here with their rows. Server-side paging and
 * sorting stay with the caller (it owns the request); this renders the grid, and, when
 * the caller passes `sortableIds` and `onSortingChange`, sort buttons in those headers,
 * and, when it passes `paging`, the pager (TanStack's pagination in manual mode: the rows
 * given are one page of `paging.total`).
 */
import type { ReactNode } from "react";
import { createColumnHelper, functionalUpdate, rowPaginationFeature, tableFeatures, useTable, type ColumnHelper, type PaginationState, type RowData } from "@tanstack/react-table";

export const dataTableFeatures = tableFeatures({ rowPaginationFeature });
export type DataTableFeatures = typeof dataTableFeatures;
export type DataTableColumns<Row extends RowData> = ReturnType<ColumnHelper<DataTableFeatures, Row>["columns"]>;

/** A column helper for rows of type Row. */
export function tableColumns<Row extends RowData>() {
  return createColumnHelper<DataTableFeatures, Row>();
}

export function DataTable<Row extends RowData>({
  columns,
  data,
  empty,
  rowId,
  testId,
  sorting,
  sortableIds,
  onSortingChange,
  rowTestId,
  paging,
}: {
  columns: DataTableColumns<Row>;
  data: Row[];
  empty: ReactNode;
  rowId?: (row: Row) => string;
  testId?: string;
  /** The column the caller sorted by (server-side), shown in its header. */
  sorting?: { id: string; desc: boolean } | null;
  /** Columns whose headers sort; clicking one calls onSortingChange with its id. */
  sortableIds?: readonly string[];
  onSortingChange?: (id: string) => void;
  /** A data-testid for each body row. */
  rowTestId?: (row: Row) => string;
  /** Server-side paging: the page shown (1-based), its size, the total row count and what to do on a change. */
  paging?: DataTablePaging;
}) {
  const pagination: PaginationState = { pageIndex: (paging?.page ?? 1) - 1, pageSize: paging?.pageSize ?? Math.max(1, data.length) };
  const table = useTable({
    features: dataTableFeatures,
    columns,
    data,
    getRowId: rowId ? (row: Row) => rowId(row) : undefined,
    manualPagination: true,
    rowCount: paging?.total ?? data.length,
    state: { pagination },
    onPaginationChange: (updater) => {
      const next = functionalUpdate(updater, pagination);
      paging?.onChange(next.pageSize === pagination.pageSize ? next.pageIndex + 1 : 1, next.pageSize);
    },
  });
  const pager = paging ? <Pager table={table} paging={paging} testId={testId} /> : null;
  if (data.length === 0) {
    return (
      <div className="flex flex-col gap-2">
        <div className="rounded-lg border border-dashed border-ink-line bg-paper-card px-4 py-8 text-center text-sm text-ink-soft" data-testid={testId ? `${testId}-empty` : undefined}>
          {empty}
        </div>
        {pager}
      </div>
    );
  }
  return (
    <div className="flex flex-col gap-2">
    {/* relative: absolutely placed bits inside cells (screen-reader text) stay inside the scroller instead of widening the page */}
    <div className="relative overflow-x-auto rounded-lg border border-ink-line bg-paper-card">
      <table className="w-full border-collapse text-sm" data-testid={testId}>
        <thead>
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id} className="border-b border-ink-line bg-paper-deep/60 text-left">
              {group.headers.map((header) => {
                const sortable = !header.isPlaceholder && !!onSortingChange && !!sortableIds?.includes(header.column.id);
                const active = sorting?.id === header.column.id;
                return (
                  <th
                    key={header.id}
                    scope="col"
                    aria-sort={sortable ? (active ? (sorting?.desc ? "descending" : "ascending") : "none") : undefined}
                    className="px-3 py-2 font-medium text-ink-soft"
                  >
                    {header.isPlaceholder ? null : sortable ? (
                      <button type="button" className="inline-flex items-center gap-1 hover:text-ink" onClick={() => onSortingChange?.(header.column.id)}>
                        <table.FlexRender header={header} />
                        <span aria-hidden className={active ? "text-accent" : "text-ink-faint"}>
                          {active ? (sorting?.desc ? "▼" : "▲") : "↕"}
                        </span>
                      </button>
                    ) : (
                      <table.FlexRender header={header} />
                    )}
                  </th>
                );
              })}
            </tr>
          ))}
        </thead>
        <tbody>
          {table.getRowModel().rows.map((row) => (
            <tr key={row.id} className="border-b border-ink-line/60 last:border-0" data-testid={rowTestId ? rowTestId(row.original) : undefined}>
              {row.getAllCells().map((cell) => (
                <td key={cell.id} className="px-3 py-2 align-middle">
                  <table.FlexRender cell={cell} />
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
    </div>
    {pager}
    </div>
  );
}

export interface DataTablePaging {
  page: number;
  pageSize: number;
  total: number;
  onChange: (page: number, pageSize: number) => void;
  /** Page sizes to offer; none: no size choice. */
  pageSizes?: readonly number[];
  /** What the rows are, singular and plural: ["entry", "entries"]. */
  noun?: readonly [string, string];
}

function Pager<Row extends RowData>({ table, paging, testId }: { table: ReturnType<typeof useTable<DataTableFeatures, Row>>; paging: DataTablePaging; testId?: string }) {
  const pages = Math.max(1, table.getPageCount());
  const [one, many] = paging.noun ?? ["row", "rows"];
  const first = paging.total === 0 ? 0 : (paging.page - 1) * paging.pageSize + 1;
  const last = Math.min(paging.total, paging.page * paging.pageSize);
  const button = "rounded-md border border-ink-edge bg-paper-card px-3 py-1.5 text-sm font-medium text-ink hover:bg-paper-deep disabled:cursor-not-allowed disabled:opacity-50";
  return (
    <div className="flex flex-wrap items-center justify-between gap-2 text-sm text-ink-soft">
      <span className="num" data-testid={testId ? `${testId}-count` : undefined}>
        {paging.total === 0 ? `No ${many}` : `${first}–${last} of ${paging.total} ${paging.total === 1 ? one : many}`} · page {Math.min(paging.page, pages)} of {pages}
      </span>
      <div className="flex flex-wrap items-center gap-2">
        {paging.pageSizes && (
          <label className="flex items-center gap-1.5">
            <span>Per page</span>
            <select className="rounded-md border border-ink-edge bg-paper-card px-2 py-1 text-sm text-ink" value={paging.pageSize} onChange={(e) => table.setPageSize(Number(e.target.value))}>
              {paging.pageSizes.map((n) => (
                <option key={n} value={n}>
                  {n}
                </option>
              ))}
            </select>
          </label>
        )}
        <button type="button" className={button} disabled={!table.getCanPreviousPage()} onClick={() => table.previousPage()}>
          Previous
        </button>
        <button type="button" className={button} disabled={!table.getCanNextPage()} onClick={() => table.nextPage()}>
          Next
        </button>
      </div>
    </div>
  );
}
