import {
  flexRender,
  getCoreRowModel,
  useReactTable,
  type ColumnDef,
  type SortingState,
} from '@tanstack/react-table';
import type { ReactNode } from 'react';
import { Link } from 'react-router';
import { Spinner } from './spinner';

/**
 * A column of a server-sorted table; its `id` is the API's sort field when sortable. Cells
 * keep to one line (tags and badges must not break) unless `meta.wrap` lets long text wrap.
 */
// eslint-disable-next-line @typescript-eslint/no-explicit-any
export type DataColumn<T> = ColumnDef<T, any> & { meta?: { wrap?: boolean } };

export interface DataTableProps<T> {
  /** What the table lists, for screen readers, e.g. "Cabinets". */
  caption: string;
  columns: DataColumn<T>[];
  rows: T[];
  total: number;
  page: number;
  pageSize: number;
  /** The API's sort: "tag" or "-tag". */
  sort: string;
  onSortChange: (sort: string) => void;
  onPageChange: (page: number) => void;
  onPageSizeChange?: (pageSize: number) => void;
  /** Where a row leads; the whole row (or card) becomes a link. */
  rowHref?: (row: T) => string;
  rowKey: (row: T) => string;
  /** How a row reads on a phone (a card instead of a table row). */
  card: (row: T) => ReactNode;
  /** True while a new page loads; the old page stays visible meanwhile. */
  loading?: boolean;
  empty: ReactNode;
}

function sortingOf(sort: string): SortingState {
  return sort ? [{ id: sort.replace(/^-/, ''), desc: sort.startsWith('-') }] : [];
}

/**
 * A list with server-side pagination and sorting (TanStack Table in manual mode): a table
 * from `md` up, cards on phones, the same data and links in both.
 */
export function DataTable<T>(props: DataTableProps<T>) {
  const { columns, rows, total, page, pageSize, sort, rowHref, rowKey } = props;
  const pageCount = Math.max(1, Math.ceil(total / pageSize));
  const table = useReactTable({
    data: rows,
    columns,
    getCoreRowModel: getCoreRowModel(),
    manualPagination: true,
    manualSorting: true,
    enableSortingRemoval: false,
    pageCount,
    state: { sorting: sortingOf(sort), pagination: { pageIndex: page - 1, pageSize } },
    onSortingChange: (updater) => {
      const next = typeof updater === 'function' ? updater(sortingOf(sort)) : updater;
      const first = next[0];
      if (first) props.onSortChange(`${first.desc ? '-' : ''}${first.id}`);
    },
  });

  return (
    <div className="relative">
      {props.loading ? (
        <div className="absolute right-3 top-3 z-10">
          <Spinner label="Loading…" />
        </div>
      ) : null}
      {rows.length === 0 ? (
        <div className="rounded-xl border border-dashed border-tide-200 bg-white/70 p-6 text-tide-800">{props.empty}</div>
      ) : (
        <>
          <div className="hidden overflow-x-auto rounded-xl border border-tide-100 bg-white shadow-sm md:block">
            <table className="w-full text-left text-sm">
              <caption className="sr-only">{props.caption}</caption>
              <thead className="bg-tide-50 text-xs uppercase tracking-wide text-tide-600">
                {table.getHeaderGroups().map((group) => (
                  <tr key={group.id}>
                    {group.headers.map((header) => {
                      const sorted = header.column.getIsSorted();
                      const canSort = header.column.getCanSort();
                      return (
                        <th
                          key={header.id}
                          scope="col"
                          aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : undefined}
                          className="whitespace-nowrap px-3 py-2.5 font-bold"
                        >
                          {canSort ? (
                            <button
                              type="button"
                              onClick={header.column.getToggleSortingHandler()}
                              className="inline-flex items-center gap-1 uppercase hover:text-tide-900"
                            >
                              {flexRender(header.column.columnDef.header, header.getContext())}
                              <span aria-hidden="true" className={sorted ? 'text-tide-900' : 'text-tide-200'}>
                                {sorted === 'desc' ? '▼' : '▲'}
                              </span>
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
              <tbody className="divide-y divide-tide-100">
                {table.getRowModel().rows.map((row) => (
                  <tr key={rowKey(row.original)} className="group hover:bg-tide-50/70" data-testid="table-row">
                    {row.getVisibleCells().map((cell, index) => (
                      <td
                        key={cell.id}
                        className={`px-3 py-2.5 align-top text-tide-900 ${
                          (cell.column.columnDef.meta as { wrap?: boolean } | undefined)?.wrap ? 'min-w-48' : 'whitespace-nowrap'
                        }`}
                      >
                        {index === 0 && rowHref ? (
                          <Link to={rowHref(row.original)} className="font-medium text-tide-800 underline-offset-2 group-hover:underline">
                            {flexRender(cell.column.columnDef.cell, cell.getContext())}
                          </Link>
                        ) : (
                          flexRender(cell.column.columnDef.cell, cell.getContext())
                        )}
                      </td>
                    ))}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
          <ul className="space-y-2 md:hidden" aria-label={props.caption}>
            {rows.map((row) => (
              <li key={rowKey(row)}>
                {rowHref ? (
                  <Link to={rowHref(row)} className="block rounded-xl border border-tide-100 bg-white p-4 shadow-sm active:bg-tide-50">
                    {props.card(row)}
                  </Link>
                ) : (
                  <div className="rounded-xl border border-tide-100 bg-white p-4 shadow-sm">{props.card(row)}</div>
                )}
              </li>
            ))}
          </ul>
        </>
      )}
      <Pagination {...props} pageCount={pageCount} />
    </div>
  );
}

function Pagination({
  page,
  pageSize,
  total,
  pageCount,
  onPageChange,
  onPageSizeChange,
}: Pick<DataTableProps<unknown>, 'page' | 'pageSize' | 'total' | 'onPageChange' | 'onPageSizeChange'> & { pageCount: number }) {
  const first = total === 0 ? 0 : (page - 1) * pageSize + 1;
  const onePage = pageCount <= 1;
  const last = Math.min(total, page * pageSize);
  return (
    <nav aria-label="Pages" className="mt-3 flex flex-wrap items-center justify-between gap-3 text-sm text-tide-800">
      <p data-testid="list-total">
        {total === 0 ? 'None' : `${first.toLocaleString('en-GB')}–${last.toLocaleString('en-GB')} of ${total.toLocaleString('en-GB')}`}
      </p>
      <div className="flex items-center gap-2">
        {onPageSizeChange ? (
          <label className="hidden items-center gap-2 sm:flex">
            <span>Per page</span>
            <select
              value={pageSize}
              onChange={(e) => onPageSizeChange(Number(e.target.value))}
              className="rounded-lg border border-tide-200 bg-white px-2 py-1.5"
            >
              {[10, 25, 50, 100].map((n) => (
                <option key={n} value={n}>
                  {n}
                </option>
              ))}
            </select>
          </label>
        ) : null}
        {onePage ? null : (
          <>
            <button
              type="button"
              className="min-h-10 rounded-lg border border-tide-200 bg-white px-3 font-medium disabled:opacity-50"
              disabled={page <= 1}
              onClick={() => onPageChange(page - 1)}
            >
              Previous
            </button>
            <span className="px-1 tabular-nums">
              Page {page} of {pageCount.toLocaleString('en-GB')}
            </span>
            <button
              type="button"
              className="min-h-10 rounded-lg border border-tide-200 bg-white px-3 font-medium disabled:opacity-50"
              disabled={page >= pageCount}
              onClick={() => onPageChange(page + 1)}
            >
              Next
            </button>
          </>
        )}
      </div>
    </nav>
  );
}
