import { Fragment, useState } from 'react';
import {
  columnFilteringFeature,
  createColumnHelper,
  createFilteredRowModel,
  createPaginatedRowModel,
  createSortedRowModel,
  globalFilteringFeature,
  rowPaginationFeature,
  rowSortingFeature,
  sortFn_alphanumeric,
  sortFn_basic,
  tableFeatures,
  useTable,
  type Row,
} from '@tanstack/react-table';
import type { RosterRowDto, SwapDto } from '@shared/swap-types';
import { Button } from '@/components/ui/button';
import { RosterRowDetail } from './roster-row-detail';
import { VERDICTS } from '@shared/vocabulary';
import { VerdictBadge } from '@/entities/block/components/verdict-badge';

const features = tableFeatures({
  rowSortingFeature,
  columnFilteringFeature,
  globalFilteringFeature,
  rowPaginationFeature,
  sortedRowModel: createSortedRowModel(),
  filteredRowModel: createFilteredRowModel(),
  paginatedRowModel: createPaginatedRowModel(),
  sortFns: { alphanumeric: sortFn_alphanumeric, basic: sortFn_basic },
});

type Features = typeof features;
type RosterRow = Row<Features, RosterRowDto>;

export type ProgressFilter = 'all' | 'owes' | 'waiting' | 'problems' | 'accepted';
export const progressFilters: { value: ProgressFilter; label: string }[] = [
  { value: 'all', label: 'Everyone' },
  { value: 'owes', label: 'Still owes blocks' },
  { value: 'waiting', label: 'Blocks waiting to be measured' },
  { value: 'problems', label: 'Blocks out of tolerance' },
  { value: 'accepted', label: 'All blocks accepted' },
];

function matchesProgress(r: RosterRowDto, f: ProgressFilter): boolean {
  switch (f) {
    case 'all':
      return true;
    case 'owes':
      return r.owed > 0;
    case 'waiting':
      return r.received > r.measured;
    case 'problems':
      return (
        !!r.verdicts &&
        r.verdicts.short +
          r.verdicts.skewed +
          (r.verdicts.trim - r.blocks.filter((b) => b.verdict === 'trim' && b.trimmed).length) >
          0
      );
    case 'accepted':
      return r.pledged > 0 && r.accepted === r.pledged;
  }
}

const helper = createColumnHelper<Features, RosterRowDto>();
const num = (header: string) => ({
  header,
  sortFn: 'basic' as const,
  cell: (info: { getValue: () => unknown }) => <span className="tabular-nums">{String(info.getValue())}</span>,
});

const columns = helper.columns([
  helper.accessor('displayName', {
    header: 'Member',
    sortFn: 'alphanumeric',
    cell: (info) => <span className="font-semibold">{info.getValue()}</span>,
  }),
  helper.accessor('pledged', num('Pledged')),
  helper.accessor('sewn', num('Sewn')),
  helper.accessor('handedIn', num('Handed in')),
  helper.accessor('received', num('Received')),
  helper.accessor('measured', num('Measured')),
  helper.accessor('owed', num('Still owed')),
  helper.accessor('accepted', {
    header: 'Verdicts',
    sortFn: 'basic',
    enableGlobalFilter: false,
    filterFn: (row, _id, value: ProgressFilter) => matchesProgress(row.original, value),
    cell: (info) => {
      const v = info.row.original.verdicts;
      const shown = v ? VERDICTS.filter((k) => v[k] > 0) : [];
      return v && shown.length ? (
        <span className="flex flex-wrap gap-1">
          {shown.map((k) => (
            <span key={k} className="inline-flex items-center gap-1">
              <VerdictBadge verdict={k} /> <span className="tabular-nums">× {v[k]}</span>
            </span>
          ))}
        </span>
      ) : (
        <span className="text-walnut-soft">none yet</span>
      );
    },
  }),
]);

const sortMark = { asc: ' ▲', desc: ' ▼' } as const;
// The member's name stays in view while the numbers scroll sideways on a phone.
const STICKY = 'sticky left-0 z-[1] bg-card';

/** The roster: sortable by every column, searchable by name, filtered by progress, in pages; each row opens its blocks. */
export function RosterTable({ swap, rows }: { swap: SwapDto; rows: RosterRowDto[] }) {
  const [open, setOpen] = useState<Set<number>>(new Set());
  const table = useTable({
    features,
    columns,
    data: rows,
    getRowId: (r) => String(r.userId),
    globalFilterFn: (row: RosterRow, _id: string, value: string) =>
      row.original.displayName.toLowerCase().includes(String(value).trim().toLowerCase()),
    initialState: { sorting: [{ id: 'displayName', desc: false }], pagination: { pageIndex: 0, pageSize: 10 } },
  });
  const toggle = (id: number) => setOpen((s) => (s.has(id) ? new Set([...s].filter((x) => x !== id)) : new Set([...s, id])));
  const progress = (table.getColumn('accepted')?.getFilterValue() as ProgressFilter | undefined) ?? 'all';
  const shown = table.getFilteredRowModel().rows.length;
  const { pageIndex, pageSize } = table.state.pagination;

  return (
    <div className="space-y-4">
      <div className="flex flex-wrap items-end gap-4">
        <label className="block">
          <span className="block font-semibold">Search by name</span>
          <input
            type="search"
            className="mt-1 min-h-11 w-64 rounded-lg border-2 border-walnut/30 bg-white px-3"
            value={String(table.state.globalFilter ?? '')}
            onChange={(e) => table.setGlobalFilter(e.target.value)}
          />
        </label>
        <label className="block">
          <span className="block font-semibold">Show</span>
          <select
            className="mt-1 min-h-11 rounded-lg border-2 border-walnut/30 bg-white px-3"
            value={progress}
            onChange={(e) => table.getColumn('accepted')?.setFilterValue(e.target.value === 'all' ? undefined : e.target.value)}
          >
            {progressFilters.map((f) => (
              <option key={f.value} value={f.value}>
                {f.label}
              </option>
            ))}
          </select>
        </label>
        <p role="status" className="text-walnut-soft">
          {shown} of {rows.length} members
        </p>
      </div>

      {/* On a phone the header row is hidden (the rows become cards), so sorting has its own control. */}
      <div className="flex flex-wrap items-end gap-3 sm:hidden">
        <label className="block">
          <span className="block font-semibold">Sort by</span>
          <select
            className="mt-1 min-h-11 rounded-lg border-2 border-walnut/30 bg-white px-3"
            value={table.state.sorting[0]?.id ?? 'displayName'}
            onChange={(e) => table.setSorting([{ id: e.target.value, desc: table.state.sorting[0]?.desc ?? false }])}
          >
            {table.getAllLeafColumns().map((c) => (
              <option key={c.id} value={c.id}>
                {typeof c.columnDef.header === 'string' ? c.columnDef.header : c.id}
              </option>
            ))}
          </select>
        </label>
        <Button
          variant="secondary"
          onClick={() =>
            table.setSorting([
              { id: table.state.sorting[0]?.id ?? 'displayName', desc: !(table.state.sorting[0]?.desc ?? false) },
            ])
          }
        >
          {(table.state.sorting[0]?.id ?? 'displayName') === 'displayName'
            ? table.state.sorting[0]?.desc
              ? 'Z to A'
              : 'A to Z'
            : table.state.sorting[0]?.desc
              ? 'Most first'
              : 'Fewest first'}
          <span className="sr-only">, tap to reverse</span>
        </Button>
      </div>

      <div className="relative sm:overflow-x-auto" tabIndex={0} role="region" aria-label="Roster table">
        <table className="stack-table w-full border-collapse text-left sm:min-w-[48rem]">
          <caption className="sr-only">Roster of members, their block counts and verdicts. Column headers sort.</caption>
          <thead>
            {table.getHeaderGroups().map((group) => (
              <tr key={group.id} className="border-b-2 border-walnut/20">
                {group.headers.map((header) => {
                  const sorted = header.column.getIsSorted();
                  return (
                    <th
                      key={header.id}
                      scope="col"
                      className={`py-2 pr-3 ${header.column.id === 'displayName' ? STICKY : ''}`}
                      aria-sort={sorted === 'asc' ? 'ascending' : sorted === 'desc' ? 'descending' : 'none'}
                    >
                      <button
                        type="button"
                        className="min-h-11 text-left font-semibold text-indigo-deep"
                        onClick={header.column.getToggleSortingHandler()}
                      >
                        <table.FlexRender header={header} />
                        {sorted && <span aria-hidden="true">{sortMark[sorted]}</span>}
                      </button>
                    </th>
                  );
                })}
                <th scope="col" className="py-2">
                  <span className="sr-only">Details</span>
                </th>
              </tr>
            ))}
          </thead>
          <tbody>
            {table.getRowModel().rows.map((row) => {
              const expanded = open.has(row.original.userId);
              return (
                <Fragment key={row.id}>
                  <tr className="border-b border-walnut/10 align-top">
                    {row.getAllCells().map((cell) => (
                      <td
                        key={cell.id}
                        data-label={
                          cell.column.id === 'displayName' || typeof cell.column.columnDef.header !== 'string'
                            ? undefined
                            : cell.column.columnDef.header
                        }
                        className={`py-3 pr-3 ${cell.column.id === 'displayName' ? `${STICKY} text-lg` : ''}`}
                      >
                        <table.FlexRender cell={cell} />
                      </td>
                    ))}
                    <td className="py-1 sm:text-right">
                      <Button variant="quiet" aria-expanded={expanded} onClick={() => toggle(row.original.userId)}>
                        {expanded ? 'Hide' : 'Blocks'}
                        <span className="sr-only"> of {row.original.displayName}</span>
                      </Button>
                    </td>
                  </tr>
                  {expanded && (
                    <tr className="border-b border-walnut/10 bg-linen/60">
                      <td colSpan={columns.length + 1} className="p-3">
                        {/* Kept in view on narrow screens, where the table itself scrolls sideways. */}
                        <div className="sticky left-0 max-w-[calc(100vw-5.5rem)] sm:max-w-none">
                          <RosterRowDetail swap={swap} row={row.original} />
                        </div>
                      </td>
                    </tr>
                  )}
                </Fragment>
              );
            })}
          </tbody>
        </table>
      </div>

      <nav aria-label="Roster pages" className="flex flex-wrap items-center gap-3">
        <Button variant="secondary" onClick={() => table.previousPage()} disabled={!table.getCanPreviousPage()}>
          Previous
        </Button>
        <span>
          Page {pageIndex + 1} of {Math.max(1, table.getPageCount())}
        </span>
        <Button variant="secondary" onClick={() => table.nextPage()} disabled={!table.getCanNextPage()}>
          Next
        </Button>
        <label className="flex items-center gap-2">
          <span>Rows per page</span>
          <select
            className="min-h-11 rounded-lg border-2 border-walnut/30 bg-white px-2"
            value={pageSize}
            onChange={(e) => table.setPageSize(Number(e.target.value))}
          >
            {[10, 25, 50, 100].map((n) => (
              <option key={n} value={n}>
                {n}
              </option>
            ))}
          </select>
        </label>
      </nav>
    </div>
  );
}
