/**
 * The office table: click a heading to sort, type to search every column, narrow single columns
 * with their own filters, export what the filters leave (all pages, in the shown order) as CSV.
 * Long tables show a page at a time (PAGE_SIZES; "All" shows every row).
 *
 * Columns are TanStack Table column definitions. Extra settings go in `meta`:
 *   label   — the column's name in CSV and filter labels (default: the header text or id)
 *   filter  — 'text' (contains) or 'select' (one of the column's values) to get a column filter
 *   csv     — the cell's CSV value (default: the column's value)
 *   align   — 'right' for numbers
 */
import {
  flexRender,
  getCoreRowModel,
  getFacetedRowModel,
  getFacetedUniqueValues,
  getFilteredRowModel,
  getPaginationRowModel,
  getSortedRowModel,
  useReactTable,
  type Column,
  type ColumnDef,
  type ColumnFiltersState,
  type FilterFn,
  type PaginationState,
  type RowData,
  type SortingState,
  type Table,
} from '@tanstack/react-table';
import { useId, useMemo, useState, type ReactNode } from 'react';
import { downloadCsv, toCsv, type CsvCell } from '../lib/csv';
import { Button } from './Button';

declare module '@tanstack/react-table' {
  // eslint-disable-next-line @typescript-eslint/no-unused-vars
  interface ColumnMeta<TData extends RowData, TValue> {
    label?: string;
    filter?: 'text' | 'select';
    csv?: (row: TData) => CsvCell;
    align?: 'right';
  }
}

const asText = (v: unknown): string => (v === null || v === undefined ? '' : v instanceof Date ? v.toISOString() : String(v));

/** Case-insensitive "contains" on the column's value as text. */
const containsText: FilterFn<unknown> = (row, columnId, filter) =>
  asText(row.getValue(columnId)).toLowerCase().includes(String(filter ?? '').trim().toLowerCase());

/** Exact match, for select filters. */
const sameText: FilterFn<unknown> = (row, columnId, filter) => filter === '' || filter === undefined || asText(row.getValue(columnId)) === filter;

function columnLabel<T>(column: Column<T, unknown>): string {
  const header = column.columnDef.header;
  return column.columnDef.meta?.label ?? (typeof header === 'string' ? header : column.id);
}

/** The CSV of the rows the filters leave, every page, in the table's order (filtered and sorted). */
export function tableToCsv<T>(table: Table<T>): string {
  const columns = table.getVisibleLeafColumns().filter((c) => c.accessorFn);
  const header = columns.map((c) => columnLabel(c));
  const rows = table.getPrePaginationRowModel().rows.map((row) =>
    columns.map((c) => {
      const custom = c.columnDef.meta?.csv;
      return custom ? custom(row.original) : (row.getValue(c.id) as CsvCell);
    }),
  );
  return toCsv(header, rows);
}

/** Rows per page on offer; 0 = all rows. */
export const PAGE_SIZES = [25, 50, 100, 0] as const;
const DEFAULT_PAGE_SIZE = 50;
/** "All" as a page size TanStack Table understands. */
const ALL_ROWS = 1_000_000_000;

export type DataTableProps<T> = {
  data: T[];
  columns: ColumnDef<T, any>[]; // eslint-disable-line @typescript-eslint/no-explicit-any
  /** What a row is, for the count and labels: "user" → "12 users". */
  noun: string;
  nounPlural?: string;
  /** File name of the CSV export (without .csv). */
  csvName: string;
  caption?: string;
  initialSorting?: SortingState;
  getRowId?: (row: T) => string;
  toolbar?: ReactNode;
  empty?: ReactNode;
  /** Extra classes for a row (for example a stripe on late orders — always with a word in a cell too). */
  rowClassName?: (row: T) => string;
};

export function DataTable<T>({ data, columns, noun, nounPlural = `${noun}s`, csvName, caption, initialSorting = [], getRowId, toolbar, empty, rowClassName }: DataTableProps<T>) {
  const [sorting, setSorting] = useState<SortingState>(initialSorting);
  const [globalFilter, setGlobalFilter] = useState('');
  const [columnFilters, setColumnFilters] = useState<ColumnFiltersState>([]);
  const [pagination, setPagination] = useState<PaginationState>({ pageIndex: 0, pageSize: DEFAULT_PAGE_SIZE });
  const searchId = useId();
  const pageSizeId = useId();

  const preparedColumns = useMemo(
    () =>
      columns.map((c) => {
        if (c.filterFn) return c;
        const kind = c.meta?.filter;
        return kind === 'select' ? { ...c, filterFn: sameText as FilterFn<T> } : { ...c, filterFn: containsText as FilterFn<T> };
      }),
    [columns],
  );

  const table = useReactTable<T>({
    data,
    columns: preparedColumns,
    state: { sorting, globalFilter, columnFilters, pagination },
    onSortingChange: setSorting,
    onPaginationChange: setPagination,
    // A new filter starts at the first page.
    autoResetPageIndex: true,
    onGlobalFilterChange: setGlobalFilter,
    onColumnFiltersChange: setColumnFilters,
    globalFilterFn: containsText as FilterFn<T>,
    getColumnCanGlobalFilter: (column) => Boolean(column.accessorFn),
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    getFilteredRowModel: getFilteredRowModel(),
    getPaginationRowModel: getPaginationRowModel(),
    getFacetedRowModel: getFacetedRowModel(),
    getFacetedUniqueValues: getFacetedUniqueValues(),
    getRowId,
  });

  const rows = table.getRowModel().rows;
  const matching = table.getPrePaginationRowModel().rows.length;
  const total = data.length;
  const paged = matching > pagination.pageSize;
  const first = pagination.pageIndex * pagination.pageSize + 1;
  const last = Math.min(matching, first + rows.length - 1);
  const filtered = globalFilter !== '' || columnFilters.length > 0;
  const filterColumns = table.getAllLeafColumns().filter((c) => c.columnDef.meta?.filter);

  return (
    <div className="flex flex-col gap-2">
      <div className="flex flex-wrap items-end gap-2">
        <div className="flex min-w-56 flex-1 flex-col gap-1">
          <label htmlFor={searchId} className="text-sm font-semibold text-graphite-800">
            Search {nounPlural}
          </label>
          <input
            id={searchId}
            type="search"
            value={globalFilter}
            onChange={(e) => setGlobalFilter(e.target.value)}
            placeholder="Any column contains…"
            className="h-9 rounded-md border border-graphite-300 bg-white px-2.5 text-sm focus:border-copper-500 focus:outline-none focus:ring-2 focus:ring-copper-200"
          />
        </div>
        {filterColumns.map((c) => (
          <ColumnFilter key={c.id} column={c} />
        ))}
        {filtered && (
          <Button
            size="sm"
            variant="quiet"
            className="h-9"
            onClick={() => {
              setGlobalFilter('');
              setColumnFilters([]);
            }}
          >
            Clear filters
          </Button>
        )}
        <div className="ml-auto flex items-end gap-2">
          {toolbar}
          <Button size="sm" className="h-9" onClick={() => downloadCsv(csvName, tableToCsv(table))} disabled={matching === 0}>
            <svg viewBox="0 0 16 16" className="size-4" aria-hidden>
              <path d="M8 2v8m0 0L5 7m3 3 3-3M3 12.5h10" fill="none" stroke="currentColor" strokeWidth="1.6" strokeLinecap="round" strokeLinejoin="round" />
            </svg>
            Export CSV
          </Button>
        </div>
      </div>

      <div className="overflow-x-auto rounded-md border border-graphite-200 bg-white">
        <table className="w-full border-collapse text-sm">
          {caption && <caption className="sr-only">{caption}</caption>}
          <thead className="sticky top-0 bg-graphite-100 text-left text-graphite-700">
            {table.getHeaderGroups().map((hg) => (
              <tr key={hg.id}>
                {hg.headers.map((h) => {
                  const sorted = h.column.getIsSorted();
                  const align = h.column.columnDef.meta?.align === 'right' ? 'text-right' : '';
                  return (
                    <th
                      key={h.id}
                      scope="col"
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
                      className={`border-b border-graphite-200 px-2.5 py-1.5 font-semibold whitespace-nowrap ${align}`}
                    >
                      {h.isPlaceholder ? null : h.column.getCanSort() ? (
                        <button
                          type="button"
                          onClick={h.column.getToggleSortingHandler()}
                          className="inline-flex items-center gap-1 rounded px-0.5 hover:text-graphite-950"
                          title="Sort"
                        >
                          {flexRender(h.column.columnDef.header, h.getContext())}
                          <SortMark dir={sorted} />
                        </button>
                      ) : (
                        flexRender(h.column.columnDef.header, h.getContext())
                      )}
                    </th>
                  );
                })}
              </tr>
            ))}
          </thead>
          <tbody>
            {rows.map((row) => (
              <tr key={row.id} className={`border-b border-graphite-100 last:border-b-0 even:bg-graphite-50/60 hover:bg-copper-50 ${rowClassName?.(row.original) ?? ''}`}>
                {row.getVisibleCells().map((cell) => (
                  <td key={cell.id} className={`px-2.5 py-1.5 align-middle ${cell.column.columnDef.meta?.align === 'right' ? 'text-right' : ''}`}>
                    {flexRender(cell.column.columnDef.cell, cell.getContext())}
                  </td>
                ))}
              </tr>
            ))}
            {rows.length === 0 && (
              <tr>
                <td colSpan={table.getVisibleLeafColumns().length} className="px-3 py-6 text-center text-graphite-500">
                  {total === 0 ? (empty ?? `No ${nounPlural} yet.`) : `No ${nounPlural} match these filters.`}
                </td>
              </tr>
            )}
          </tbody>
        </table>
      </div>
      <div className="flex flex-wrap items-center gap-x-4 gap-y-2">
        <p className="text-sm text-graphite-600" aria-live="polite" data-testid="row-count">
          {filtered ? `${matching} of ${total} ${total === 1 ? noun : nounPlural} shown` : `${total} ${total === 1 ? noun : nounPlural}`}
          {paged && ` · rows ${first}–${last}`}
        </p>
        {total > PAGE_SIZES[0] && (
          <div className="ml-auto flex items-center gap-2 text-sm" data-testid="pager">
            <label htmlFor={pageSizeId} className="text-graphite-700">
              Rows per page
            </label>
            <select
              id={pageSizeId}
              value={pagination.pageSize === ALL_ROWS ? 0 : pagination.pageSize}
              onChange={(e) => setPagination({ pageIndex: 0, pageSize: Number(e.target.value) || ALL_ROWS })}
              className="h-8 rounded-md border border-graphite-300 bg-white px-1.5"
            >
              {PAGE_SIZES.map((n) => (
                <option key={n} value={n}>
                  {n === 0 ? 'All' : n}
                </option>
              ))}
            </select>
            {paged && (
              <>
                <Button size="sm" variant="quiet" className="h-8" onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()}>
                  ← Previous
                </Button>
                <span className="text-graphite-700 tabular-nums">
                  Page {pagination.pageIndex + 1} of {table.getPageCount()}
                </span>
                <Button size="sm" variant="quiet" className="h-8" onClick={() => table.nextPage()} disabled={!table.getCanNextPage()}>
                  Next →
                </Button>
              </>
            )}
          </div>
        )}
      </div>
    </div>
  );
}

function SortMark({ dir }: { dir: false | 'asc' | 'desc' }) {
  return (
    <svg viewBox="0 0 10 14" className={`h-3 w-2.5 ${dir ? 'text-copper-600' : 'text-graphite-400'}`} aria-hidden>
      <path d="M5 1 9 5.5H1z" fill={dir === 'asc' ? 'currentColor' : dir ? 'none' : 'currentColor'} opacity={dir === 'desc' ? 0.25 : 1} />
      <path d="M5 13 1 8.5h8z" fill={dir === 'desc' ? 'currentColor' : dir ? 'none' : 'currentColor'} opacity={dir === 'asc' ? 0.25 : 1} />
    </svg>
  );
}

function ColumnFilter<T>({ column }: { column: Column<T, unknown> }) {
  const id = useId();
  const label = columnLabel(column);
  const kind = column.columnDef.meta?.filter;
  const value = (column.getFilterValue() as string | undefined) ?? '';
  const uniques = column.getFacetedUniqueValues();
  const options = useMemo(() => [...uniques.keys()].map(asText).filter((v) => v !== '').sort((a, b) => a.localeCompare(b)), [uniques]);
  const cls =
    'h-9 rounded-md border border-graphite-300 bg-white px-2 text-sm focus:border-copper-500 focus:outline-none focus:ring-2 focus:ring-copper-200';
  return (
    <div className="flex flex-col gap-1">
      <label htmlFor={id} className="text-sm font-semibold text-graphite-800">
        {label}
      </label>
      {kind === 'select' ? (
        <select id={id} value={value} onChange={(e) => column.setFilterValue(e.target.value || undefined)} className={`${cls} min-w-32`}>
          <option value="">All</option>
          {options.map((o) => (
            <option key={o} value={o}>
              {o}
            </option>
          ))}
        </select>
      ) : (
        <input id={id} type="search" value={value} onChange={(e) => column.setFilterValue(e.target.value || undefined)} className={`${cls} w-40`} />
      )}
    </div>
  );
}
