/**
 * The room's snapshots as a table (TanStack Table v9): label, who, when, bandwidth, worst in-band
 * VSWR, part count and the "for review" flag; sortable by any column, filtered by text and by the
 * flag, a page at a time. What each row offers is the caller's (`renderActions`), so the same table
 * serves the read-only view of an observer.
 */
import {
  columnFilteringFeature,
  createColumnHelper,
  createFilteredRowModel,
  createPaginatedRowModel,
  createSortedRowModel,
  filterFn_equals,
  filterFn_includesString,
  globalFilteringFeature,
  rowPaginationFeature,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_basic,
  sortFn_text,
  tableFeatures,
  useTable,
} from '@tanstack/react-table';
import { useId, useMemo, type ReactNode } from 'react';
import { Button } from '../../../components/button';
import { controlClass } from '../../../components/form-field';
import { cx } from '../../../lib/cx';
import { dateFrom, dateTimeLabel, timeAgo } from '../../../lib/format-time';
import type { Snapshot } from '../api/get-snapshots';
import { snapshotRow, type SnapshotRow } from './snapshot-rows';

const features = tableFeatures({
  rowSortingFeature,
  columnFilteringFeature,
  globalFilteringFeature,
  rowPaginationFeature,
  sortedRowModel: createSortedRowModel(),
  filteredRowModel: createFilteredRowModel(),
  paginatedRowModel: createPaginatedRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, text: sortFn_text, basic: sortFn_basic },
  filterFns: { includesString: filterFn_includesString, equals: filterFn_equals },
});

const column = createColumnHelper<typeof features, SnapshotRow>();

export const SNAPSHOT_PAGE_SIZE = 8;

export interface SnapshotTableProps {
  snapshots: readonly Snapshot[];
  /** The cell of the last column ("Actions"); without it the table has no such column. */
  renderActions?: (row: SnapshotRow) => ReactNode;
  /** Rows per page. */
  pageSize?: number;
  /** A caption for assistive tech (the table's name). */
  caption?: string;
}

function When({ time }: { time: number }) {
  const date = dateFrom(time);
  if (!date) return <span>—</span>;
  return (
    <time dateTime={date.toISOString()} title={dateTimeLabel(date)} className="whitespace-nowrap">
      {timeAgo(date)}
    </time>
  );
}

function ReviewFlag({ on }: { on: boolean }) {
  return on ? (
    <span className="inline-flex items-center rounded-full border border-amber/60 bg-amber-soft px-2 py-0.5 text-xs font-bold text-amber-deep">
      for review
    </span>
  ) : (
    <span className="text-ink-faint" aria-label="not for review">
      —
    </span>
  );
}

/** Null numbers sort after every number, whichever the direction (`sortUndefined: 'last'`). */
const orUndefined = (value: number | null) => (value === null ? undefined : value);

function buildColumns(renderActions?: (row: SnapshotRow) => ReactNode) {
  const base = column.columns([
    column.accessor('label', {
      header: 'Label',
      sortFn: 'text',
      cell: (info) => <span className="font-bold text-ink">{info.getValue()}</span>,
    }),
    column.accessor('who', { header: 'Who', sortFn: 'text', cell: (info) => <span className="whitespace-nowrap">{info.getValue()}</span> }),
    column.accessor('createdAt', {
      header: 'When',
      sortFn: 'basic',
      sortDescFirst: true,
      enableGlobalFilter: false,
      cell: (info) => <When time={info.getValue()} />,
    }),
    column.accessor((row) => orUndefined(row.bandwidth), {
      id: 'bandwidth',
      header: 'Bandwidth',
      sortFn: 'basic',
      sortUndefined: 'last',
      sortDescFirst: true,
      enableGlobalFilter: false,
      cell: (info) => <span className="numeric whitespace-nowrap">{info.row.original.bandwidthText}</span>,
    }),
    column.accessor((row) => orUndefined(row.worstVswr), {
      id: 'worstVswr',
      header: 'Worst VSWR in band',
      sortFn: 'basic',
      sortUndefined: 'last',
      // Best (lowest) first.
      sortDescFirst: false,
      enableGlobalFilter: false,
      cell: (info) => (
        <span className={cx('numeric', info.row.original.goalMet === false && 'font-bold text-coral-deep')}>
          {info.row.original.worstVswrText}
          {info.row.original.goalMet === false && <span className="sr-only"> (misses the goal)</span>}
        </span>
      ),
    }),
    column.accessor((row) => orUndefined(row.partCount), {
      id: 'partCount',
      header: 'Parts',
      sortFn: 'basic',
      sortUndefined: 'last',
      sortDescFirst: false,
      enableGlobalFilter: false,
      cell: (info) => <span className="numeric">{info.row.original.partCount ?? '—'}</span>,
    }),
    column.accessor('forReview', {
      header: 'For review',
      sortFn: 'basic',
      filterFn: 'equals',
      enableGlobalFilter: false,
      cell: (info) => <ReviewFlag on={info.getValue()} />,
    }),
  ]);
  if (!renderActions) return base;
  return [
    ...base,
    column.display({
      id: 'actions',
      header: 'Actions',
      cell: (info) => renderActions(info.row.original),
    }),
  ];
}

const sortMark = (sorted: false | 'asc' | 'desc') => (sorted === 'asc' ? '▲' : sorted === 'desc' ? '▼' : '↕');
const ariaSort = (sorted: false | 'asc' | 'desc') => (sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none');

export function SnapshotTable({ snapshots, renderActions, pageSize = SNAPSHOT_PAGE_SIZE, caption = 'Snapshots' }: SnapshotTableProps) {
  const ids = useId();
  const data = useMemo(() => snapshots.map(snapshotRow), [snapshots]);
  const columns = useMemo(() => buildColumns(renderActions), [renderActions]);
  const table = useTable({
    features,
    columns,
    data,
    getRowId: (row) => row.id,
    globalFilterFn: 'includesString',
    initialState: {
      sorting: [{ id: 'createdAt', desc: true }],
      pagination: { pageIndex: 0, pageSize },
      globalFilter: '',
      columnFilters: [],
    },
  });

  const reviewColumn = table.getColumn('forReview');
  const reviewOnly = reviewColumn?.getFilterValue() === true;
  const rows = table.getRowModel().rows;
  const shown = table.getPrePaginatedRowModel().rows.length;
  const pageCount = Math.max(1, table.getPageCount());

  return (
    <div className="flex flex-col gap-3">
      <div className="flex flex-wrap items-end gap-3" role="search" aria-label="Filter the snapshots">
        <div className="flex min-w-56 flex-1 flex-col gap-1">
          <label htmlFor={`${ids}-filter`} className="text-sm font-semibold">
            Filter by label or person
          </label>
          <input
            id={`${ids}-filter`}
            type="search"
            className={controlClass(false)}
            value={String(table.state.globalFilter ?? '')}
            placeholder="e.g. E12, Demo Tuner"
            onChange={(event) => {
              table.setGlobalFilter(event.target.value);
              table.setPageIndex(0);
            }}
          />
        </div>
        <label className="flex items-center gap-2 pb-2 text-sm font-semibold">
          <input
            type="checkbox"
            className="size-4 accent-amber-deep"
            checked={reviewOnly}
            onChange={(event) => {
              reviewColumn?.setFilterValue(event.target.checked ? true : undefined);
              table.setPageIndex(0);
            }}
          />
          For review only
        </label>
        <p className="pb-2 text-sm text-ink-soft" aria-live="polite">
          {shown === data.length ? `${data.length} snapshot${data.length === 1 ? '' : 's'}` : `${shown} of ${data.length} shown`}
        </p>
      </div>

      <div className="overflow-x-auto rounded-xl border border-rule bg-card">
        <table className="w-full border-collapse text-left text-sm">
          <caption className="sr-only">{caption}</caption>
          <thead className="border-b border-rule bg-paper-deep/50">
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id}>
                {group.headers.map((header) => {
                  const sortable = header.column.getCanSort();
                  const sorted = header.column.getIsSorted();
                  return (
                    <th key={header.id} scope="col" aria-sort={sortable ? ariaSort(sorted) : undefined} className="px-3 py-2 font-bold whitespace-nowrap text-ink-soft">
                      {sortable ? (
                        <button
                          type="button"
                          onClick={header.column.getToggleSortingHandler()}
                          className="inline-flex items-center gap-1 rounded-sm hover:text-ink"
                        >
                          <table.FlexRender header={header} />
                          <span aria-hidden="true" className={cx('text-xs', sorted ? 'text-ink' : 'text-ink-faint')}>
                            {sortMark(sorted)}
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
          <tbody className="divide-y divide-rule">
            {rows.length === 0 ? (
              <tr>
                <td colSpan={columns.length} className="px-3 py-6 text-center text-ink-soft">
                  {data.length === 0 ? 'No snapshots yet.' : 'No snapshot matches the filter.'}
                </td>
              </tr>
            ) : (
              rows.map((row) => (
                <tr key={row.id} data-snapshot-id={row.id} className="align-top hover:bg-paper/60">
                  {row.getAllCells().map((cell) => (
                    <td key={cell.id} className="px-3 py-2">
                      <table.FlexRender cell={cell} />
                    </td>
                  ))}
                </tr>
              ))
            )}
          </tbody>
        </table>
      </div>

      {pageCount > 1 && (
        <nav aria-label="Snapshot pages" className="flex items-center justify-end gap-2 text-sm">
          <Button variant="secondary" size="sm" onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()}>
            Previous
          </Button>
          <span className="text-ink-soft">
            Page {table.state.pagination.pageIndex + 1} of {pageCount}
          </span>
          <Button variant="secondary" size="sm" onClick={() => table.nextPage()} disabled={!table.getCanNextPage()}>
            Next
          </Button>
        </nav>
      )}
    </div>
  );
}
