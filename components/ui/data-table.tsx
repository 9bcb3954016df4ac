"use client";

/**
 * The one wrapper around TanStack Table (v9): feature tables build typed columns with
 * `tableColumns<Row>()` and pass them here with their rows. Server-side paging and
 * sorting stay with the caller (it owns the request); this renders the grid, and, when
 * the caller passes `sortableIds` and `onSortingChange`, sort buttons in those headers.
 */
import type { ReactNode } from "react";
import { createColumnHelper, tableFeatures, useTable, type ColumnHelper, type RowData } from "@tanstack/react-table";

export const dataTableFeatures = tableFeatures({});
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
}) {
  const table = useTable({ features: dataTableFeatures, columns, data, getRowId: rowId ? (row: Row) => rowId(row) : undefined });
  if (data.length === 0) {
    return (
      <div className="rounded-lg border border-dashed border-ink-line bg-paper-card px-4 py-8 text-center text-sm text-ink-soft" data-testid={testId ? `${testId}-empty` : undefined}>
        {empty}
      </div>
    );
  }
  return (
    <div className="overflow-x-auto rounded-lg border border-ink-line bg-paper-card">
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
                        <span aria-hidden className={active ? "text-copper" : "text-ink-faint"}>
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
  );
}
