'use client';

import {
  flexRender,
  getCoreRowModel,
  getFilteredRowModel,
  getPaginationRowModel,
  getSortedRowModel,
  useReactTable,
  type ColumnDef,
  type Row,
  type SortingState,
} from '@tanstack/react-table';
import { useState, type ReactNode } from 'react';
import { inputClass } from '@/components/ui/field';

/**
 * The actions column (Add, Save, Delete) stays in view at the table's right edge when a wide table
 * scrolls sideways in its card.
 */
export const STICKY_END = 'sticky right-0 z-10 shadow-[-10px_0_8px_-8px_rgb(0_0_0/0.25)]';

/**
 * A table with sorting (click a heading), a filter over every column and paging. `renderRow` may
 * draw a row itself (an editable row) as its own `<tbody>`, so one entry may take two lines; the
 * columns still decide sorting and filtering. `hiddenColumns` sort and filter but get no heading
 * (their row draws them elsewhere), and `wrap` lets cells wrap to keep the table within its card.
 */
export function DataTable<T>({
  data,
  columns,
  label,
  renderRow,
  before,
  empty = 'Nothing here yet.',
  pageSize = 25,
  testId,
  hiddenColumns,
  wrap = false,
}: {
  data: T[];
  columns: ColumnDef<T, unknown>[];
  label: string;
  renderRow?: (row: Row<T>) => ReactNode;
  /** Rows drawn above the data, e.g. the row that adds a new entry (a `<tbody>` when rows are drawn by `renderRow`). */
  before?: ReactNode;
  empty?: string;
  pageSize?: number;
  testId?: string;
  hiddenColumns?: readonly string[];
  wrap?: boolean;
}) {
  const [sorting, setSorting] = useState<SortingState>([]);
  const [filter, setFilter] = useState('');
  const table = useReactTable({
    data,
    columns,
    state: { sorting, globalFilter: filter },
    onSortingChange: setSorting,
    onGlobalFilterChange: setFilter,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getPaginationRowModel: getPaginationRowModel(),
    initialState: { pagination: { pageSize }, columnVisibility: Object.fromEntries((hiddenColumns ?? []).map((id) => [id, false])) },
    autoResetPageIndex: false,
  });
  const rows = table.getRowModel().rows;
  const pages = table.getPageCount();
  const filtered = table.getFilteredRowModel().rows.length;
  const emptyRow =
    rows.length === 0 ? (
      <tr>
        <td colSpan={table.getVisibleLeafColumns().length} className="px-2 py-3 text-muted">
          {data.length === 0 ? empty : 'Nothing matches the filter.'}
        </td>
      </tr>
    ) : null;
  return (
    <div className="space-y-3">
      {data.length > 5 ? (
        <div className="flex flex-wrap items-center gap-3">
          <label className="sr-only" htmlFor={`${testId ?? label}-filter`}>
            Filter {label}
          </label>
          <input
            id={`${testId ?? label}-filter`}
            type="search"
            value={filter}
            onChange={(e) => {
              setFilter(e.target.value);
              table.setPageIndex(0);
            }}
            placeholder={`Filter ${label}…`}
            className={`${inputClass.replace('w-full ', '')} w-full max-w-xs`}
          />
          {filter ? (
            <span className="text-sm text-muted">
              {filtered} of {data.length}
            </span>
          ) : null}
        </div>
      ) : null}
      <div className="-mx-4 overflow-x-auto px-4 sm:mx-0 sm:px-0">
        <table className={`w-full text-left text-sm ${wrap ? '' : 'min-w-max'}`} data-testid={testId} aria-label={label}>
          <thead className="text-xs uppercase tracking-wide text-muted">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id} className="border-b border-line">
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  const canSort = header.column.getCanSort();
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      className={`px-2 py-2 font-semibold ${header.column.id === 'actions' ? `${STICKY_END} bg-surface` : ''}`}
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
                    >
                      {canSort ? (
                        <button type="button" onClick={header.column.getToggleSortingHandler()} className="inline-flex items-center gap-1 uppercase hover:text-ink">
                          {flexRender(header.column.columnDef.header, header.getContext())}
                          <span aria-hidden>{sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕'}</span>
                        </button>
                      ) : (
                        flexRender(header.column.columnDef.header, header.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          {renderRow ? (
            <>
              {before}
              {rows.map((row) => renderRow(row))}
              {emptyRow ? <tbody>{emptyRow}</tbody> : null}
            </>
          ) : (
            <tbody className="divide-y divide-line">
              {before}
              {rows.map((row) => (
                <tr key={row.id}>
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className="px-2 py-2 align-top">
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              ))}
              {emptyRow}
            </tbody>
          )}
        </table>
      </div>
      {pages > 1 ? (
        <div className="flex flex-wrap items-center gap-2 text-sm">
          <button type="button" className="rounded-plate border border-line px-2 py-1 disabled:opacity-50" onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()}>
            Previous
          </button>
          <span className="text-muted">
            Page {table.getState().pagination.pageIndex + 1} of {pages}
          </span>
          <button type="button" className="rounded-plate border border-line px-2 py-1 disabled:opacity-50" onClick={() => table.nextPage()} disabled={!table.getCanNextPage()}>
            Next
          </button>
          <label className="ml-2 flex items-center gap-1 text-muted">
            Rows per page
            <select className="rounded-plate border border-line bg-surface px-1 py-1" value={table.getState().pagination.pageSize} onChange={(e) => table.setPageSize(Number(e.target.value))}>
              {[10, 25, 50, 100].map((n) => (
                <option key={n} value={n}>
                  {n}
                </option>
              ))}
            </select>
          </label>
        </div>
      ) : null}
    </div>
  );
}
