import {
  createPaginatedRowModel,
  createSortedRowModel,
  functionalUpdate,
  rowPaginationFeature,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_basic,
  sortFn_text,
  tableFeatures,
  useTable,
  type ColumnDef,
  type Header,
  type PaginationState,
  type ReactTable,
  type RowData,
  type SortingState,
} from '@tanstack/react-table';
import { useMemo, useState, type ReactNode } from 'react';
import type { ListPage } from '@schema/list-query';
import { pageSizes, type ListParams } from '@frontend/lib/list-params';
import { Button } from './button';
import { EmptyState } from './states';

/*
 * Every list table of the app: TanStack Table 9 for sorting and paging, one look (table-dense),
 * sortable headers as buttons (Enter or Space sorts; aria-sort says how), a row count and a pager.
 *
 * Two ways to feed it:
 * - `useServerListTable`: the API sorts and pages (sites, agents, groups, workers, results); the
 *   sort and page live in the address through `useListParams`, and a column's id is the API's
 *   sort field.
 * - `useClientListTable`: short lists the API sends whole (a plan's picks, a group's members);
 *   sorted and paged in the browser.
 * Features and row models are built once at module scope (TanStack Table 9 guidance), so the
 * row models are not rebuilt on every render.
 */
export const listTableFeatures = tableFeatures({
  rowSortingFeature,
  rowPaginationFeature,
  sortedRowModel: createSortedRowModel(),
  paginatedRowModel: createPaginatedRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, basic: sortFn_basic, text: sortFn_text },
});
export type ListTableFeatures = typeof listTableFeatures;
export type ListColumns<TData extends RowData> = Array<ColumnDef<ListTableFeatures, TData, any>>;
export type ListTable<TData extends RowData> = ReactTable<ListTableFeatures, TData>;

const noRows: never[] = [];

/** `-name` → [{ id: 'name', desc: true }]. */
export function sortingOf(sort: string): SortingState {
  return [{ id: sort.replace(/^-/, ''), desc: sort.startsWith('-') }];
}

/** A table whose rows the API has already sorted and paged (one `ListPage`). */
export function useServerListTable<TData extends RowData>({
  columns,
  page,
  params,
  getRowId,
}: {
  columns: ListColumns<TData>;
  page: ListPage<TData> | undefined;
  params: ListParams;
  getRowId: (row: TData) => string;
}): ListTable<TData> {
  const sorting = useMemo(() => sortingOf(params.sort), [params.sort]);
  const pagination: PaginationState = { pageIndex: params.page - 1, pageSize: params.pageSize };
  return useTable({
    features: listTableFeatures,
    columns,
    data: page?.items ?? noRows,
    getRowId,
    manualSorting: true,
    manualPagination: true,
    rowCount: page?.total ?? 0,
    enableMultiSort: false,
    enableSortingRemoval: false,
    // The first press sorts ascending on every column (TanStack's default starts numbers descending).
    sortDescFirst: false,
    state: { sorting, pagination },
    onSortingChange: (updater) => {
      const next = functionalUpdate(updater, sorting)[0];
      params.update({ sort: next ? `${next.desc ? '-' : ''}${next.id}` : undefined });
    },
    onPaginationChange: (updater) => {
      const next = functionalUpdate(updater, pagination);
      if (next.pageSize !== pagination.pageSize) params.update({ pageSize: next.pageSize });
      else params.update({ page: next.pageIndex + 1 });
    },
  });
}

/** A table over rows held in the browser, sorted and paged there. */
export function useClientListTable<TData extends RowData>({
  columns,
  data,
  initialSorting,
  pageSize = 25,
  getRowId,
}: {
  columns: ListColumns<TData>;
  data: TData[];
  initialSorting: SortingState;
  pageSize?: number;
  getRowId: (row: TData) => string;
}): ListTable<TData> {
  const [sorting, setSorting] = useState(initialSorting);
  const [pagination, setPagination] = useState<PaginationState>({ pageIndex: 0, pageSize });
  return useTable({
    features: listTableFeatures,
    columns,
    data,
    getRowId,
    enableMultiSort: false,
    state: { sorting, pagination },
    onSortingChange: (updater) => setSorting((current) => functionalUpdate(updater, current)),
    onPaginationChange: (updater) => setPagination((current) => functionalUpdate(updater, current)),
  });
}

function ariaSort(header: Header<ListTableFeatures, any, unknown>): 'ascending' | 'descending' | 'none' | undefined {
  if (!header.column.getCanSort()) return undefined;
  const sorted = header.column.getIsSorted();
  return sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none';
}

function SortMark({ direction }: { direction: false | 'asc' | 'desc' }) {
  return (
    <span aria-hidden="true" className={`text-[10px] ${direction ? 'text-primary-700' : 'text-slate-300'}`}>
      {direction === 'desc' ? '▼' : direction === 'asc' ? '▲' : '↕'}
    </span>
  );
}

export interface DataTableProps<TData extends RowData> {
  table: ListTable<TData>;
  /** Read by screen readers before the table ("Sites"). */
  caption: string;
  /** A request for new rows is running (the old rows stay visible, dimmed). */
  busy?: boolean;
  /** Shown instead of the body when there are no rows. */
  empty?: ReactNode;
  rowClassName?: (row: TData) => string | undefined;
  /** Below the body, inside the card (e.g. a row's details). */
  className?: string;
}

/** The table itself: header with sort buttons, the current page of rows, or `empty`. */
export function DataTable<TData extends RowData>({ table, caption, busy = false, empty, rowClassName, className = '' }: DataTableProps<TData>) {
  const rows = table.getRowModel().rows;
  return (
    <div className={`card overflow-x-auto ${className}`}>
      <table className={`table-dense w-full transition-opacity ${busy ? 'opacity-60' : ''}`} aria-busy={busy || undefined}>
        <caption className="sr-only">
          {caption}
          {table.state.sorting[0] ? ', sorted by the column marked as sorted' : ''}
        </caption>
        <thead>
          {table.getHeaderGroups().map((group) => (
            <tr key={group.id}>
              {group.headers.map((header) => (
                <th key={header.id} scope="col" aria-sort={ariaSort(header)}>
                  {header.isPlaceholder ? null : header.column.getCanSort() ? (
                    <button
                      type="button"
                      onClick={header.column.getToggleSortingHandler()}
                      className="inline-flex items-center gap-1 uppercase hover:text-slate-900"
                    >
                      <table.FlexRender header={header} />
                      <SortMark direction={header.column.getIsSorted()} />
                    </button>
                  ) : (
                    <table.FlexRender header={header} />
                  )}
                </th>
              ))}
            </tr>
          ))}
        </thead>
        <tbody>
          {rows.map((row) => (
            <tr key={row.id} className={rowClassName?.(row.original)}>
              {row.getAllCells().map((cell) => (
                <td key={cell.id}>
                  <table.FlexRender cell={cell} />
                </td>
              ))}
            </tr>
          ))}
        </tbody>
      </table>
      {rows.length === 0 && <div className="m-3">{empty ?? <EmptyState title="Nothing to show" />}</div>}
    </div>
  );
}

/** "Rows 26–50 of 120", rows per page, previous and next. `noun` names the rows for the live region. */
export function TablePager<TData extends RowData>({ table, noun = 'rows' }: { table: ListTable<TData>; noun?: string }) {
  const { pageIndex, pageSize } = table.state.pagination;
  const total = table.getRowCount();
  const pageCount = Math.max(1, table.getPageCount());
  const first = total === 0 ? 0 : pageIndex * pageSize + 1;
  const last = Math.min(total, (pageIndex + 1) * pageSize);
  return (
    <div className="flex flex-wrap items-center justify-between gap-3 text-sm text-slate-600">
      <p aria-live="polite">{total === 0 ? `No ${noun}` : `${noun[0].toUpperCase()}${noun.slice(1)} ${first}–${last} of ${total}`}</p>
      <div className="flex items-center gap-2">
        <label className="flex items-center gap-1.5">
          Per page
          <select
            className="rounded border border-slate-300 bg-white px-1.5 py-0.5 text-sm"
            value={pageSize}
            onChange={(event) => table.setPagination({ pageIndex: 0, pageSize: Number(event.target.value) })}
          >
            {pageSizes.map((size) => (
              <option key={size} value={size}>
                {size}
              </option>
            ))}
          </select>
        </label>
        <Button size="sm" onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()}>
          Previous
        </Button>
        <span className="tabular-nums">
          Page {Math.min(pageIndex + 1, pageCount)} of {pageCount}
        </span>
        <Button size="sm" onClick={() => table.nextPage()} disabled={!table.getCanNextPage()}>
          Next
        </Button>
      </div>
    </div>
  );
}
