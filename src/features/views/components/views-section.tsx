import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  useReactTable,
  type PaginationState,
  type SortingState,
} from '@tanstack/react-table';
import { useEffect, useId, useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import type { ListViewsQuery, ViewSummary } from '../../../../server/schemas/views';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { Section } from '../../../components/ui/section';
import { compactSelectClass, tableHeadRowClass } from '../../../components/ui/styles';
import { paths } from '../../../config/paths';
import { formatDateTime } from '../../../lib/format';
import { useArchiveView, useProjectViews } from '../api/views';
import { SortHeader } from '../../../components/ui/sort-header';

type Archived = ListViewsQuery['archived'];
type SortKey = ListViewsQuery['sort'];

const PAGE_SIZE = 10;
const col = createColumnHelper<ViewSummary>();

/** The words typed settle before they become a request. */
function useSettled<T>(value: T, ms: number): T {
  const [settled, setSettled] = useState(value);
  useEffect(() => {
    const t = setTimeout(() => setSettled(value), ms);
    return () => clearTimeout(t);
  }, [value, ms]);
  return settled;
}

/**
 * The project's saved and shared views: sorted, filtered and paged by the server (the table only draws
 * the page it is given). Leads archive and restore from here.
 */
export function ViewsSection({ projectId, isLead }: { projectId: number; isLead: boolean }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: 'updated', desc: true }]);
  const [pagination, setPagination] = useState<PaginationState>({ pageIndex: 0, pageSize: PAGE_SIZE });
  const [filter, setFilter] = useState('');
  const [archived, setArchived] = useState<Archived>('exclude');
  const q = useSettled(filter.trim(), 250);
  const filterId = useId();
  const archivedId = useId();

  // a new filter starts again at page 1
  useEffect(() => setPagination((p) => ({ ...p, pageIndex: 0 })), [q, archived]);

  const query: ListViewsQuery = {
    sort: (sorting[0]?.id ?? 'updated') as SortKey,
    order: sorting[0] ? (sorting[0].desc ? 'desc' : 'asc') : undefined,
    q,
    archived,
    page: pagination.pageIndex + 1,
    pageSize: pagination.pageSize,
  };
  const { data, isPending, error, isPlaceholderData } = useProjectViews(projectId, query);
  const archive = useArchiveView();

  const columns = useMemo(
    () => [
      col.accessor('title', {
        id: 'title',
        header: 'Title',
        sortDescFirst: false,
        cell: ({ row }) => (
          <span className="flex flex-wrap items-center gap-2">
            <Link to={paths.view(row.original.id)} className="font-medium text-mist-100 hover:text-accent">
              {row.original.title}
            </Link>
            {row.original.archived && <span className="text-xs text-mist-500">archived</span>}
            {!row.original.hasSnapshot && <span className="text-xs text-mist-500">no snapshot</span>}
          </span>
        ),
      }),
      col.accessor('authorName', { id: 'author', header: 'Author', sortDescFirst: false, cell: (c) => c.getValue() ?? '—' }),
      col.accessor('recordingName', {
        id: 'recording',
        header: 'Recording',
        sortDescFirst: false,
        cell: (c) => <span className="break-all">{c.getValue() ?? '—'}</span>,
      }),
      col.accessor('createdAt', {
        id: 'created',
        header: 'Created',
        sortDescFirst: true,
        cell: (c) => <time className="font-mono text-xs" dateTime={c.getValue()}>{formatDateTime(c.getValue())}</time>,
      }),
      col.accessor('updatedAt', {
        id: 'updated',
        header: 'Updated',
        sortDescFirst: true,
        cell: (c) => <time className="font-mono text-xs" dateTime={c.getValue()}>{formatDateTime(c.getValue())}</time>,
      }),
      col.accessor('openThreads', {
        id: 'threads',
        header: 'Open threads',
        sortDescFirst: true,
        meta: { numeric: true },
        cell: (c) => <span className="font-mono">{c.getValue()}</span>,
      }),
      // the server does not sort by marks
      col.accessor('markCount', {
        id: 'marks',
        header: 'Marks',
        enableSorting: false,
        meta: { numeric: true },
        cell: (c) => <span className="font-mono">{c.getValue()}</span>,
      }),
      ...(isLead
        ? [
            col.display({
              id: 'actions',
              header: () => <span className="sr-only">Actions</span>,
              cell: ({ row }) => {
                const v = row.original;
                const busy = archive.isPending && archive.variables?.id === v.id;
                return (
                  <Button
                    type="button"
                    variant="quiet"
                    className="px-2.5 py-1 text-xs"
                    disabled={busy}
                    aria-label={`${v.archived ? 'Restore' : 'Archive'} ${v.title}`}
                    onClick={() => archive.mutate({ id: v.id, archived: !v.archived })}
                  >
                    {v.archived ? 'Restore' : 'Archive'}
                  </Button>
                );
              },
            }),
          ]
        : []),
    ],
    [isLead, archive],
  );

  const pageCount = data ? Math.max(1, Math.ceil(data.total / data.pageSize)) : 1;
  const table = useReactTable({
    data: data?.views ?? [],
    columns,
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    manualFiltering: true,
    enableSortingRemoval: false,
    enableMultiSort: false,
    pageCount,
    state: { sorting, pagination },
    onSortingChange: (u) => {
      setSorting(u);
      setPagination((p) => ({ ...p, pageIndex: 0 }));
    },
    onPaginationChange: setPagination,
  });

  return (
    <Section title="Views">
      <div className="flex flex-col gap-3">
        <div className="flex flex-wrap items-end gap-3">
          <div className="flex min-w-56 flex-1 flex-col gap-1.5">
            <label htmlFor={filterId} className="text-sm font-medium text-mist-300">
              Filter views
            </label>
            <input
              id={filterId}
              type="search"
              value={filter}
              onChange={(e) => setFilter(e.target.value)}
              placeholder="Title, author or recording"
              className="rounded-md border border-ink-700 bg-ink-900 px-3 py-2 text-sm text-mist-100 placeholder:text-mist-500 focus:border-accent"
            />
          </div>
          <div className="flex flex-col gap-1.5">
            <label htmlFor={archivedId} className="text-sm font-medium text-mist-300">
              Archived
            </label>
            <select
              id={archivedId}
              value={archived}
              onChange={(e) => setArchived(e.target.value as Archived)}
              className={`${compactSelectClass} py-2`}
            >
              <option value="exclude">Leave out</option>
              <option value="include">Include</option>
              <option value="only">Only archived</option>
            </select>
          </div>
        </div>
        {error && <Notice tone="error">{error.message}</Notice>}
        {archive.error && <Notice tone="error">{archive.error.message}</Notice>}
        {isPending && <p className="text-sm text-mist-500">Loading views…</p>}
        {data && (
          <div className={`overflow-x-auto transition-opacity ${isPlaceholderData ? 'opacity-60' : ''}`}>
            <table className="w-full border-collapse text-sm" data-testid="project-views">
              <thead>
                {table.getHeaderGroups().map((hg) => (
                  <tr key={hg.id} className={tableHeadRowClass}>
                    {hg.headers.map((h) => (
                      <SortHeader key={h.id} header={h} numeric={(h.column.columnDef.meta as { numeric?: boolean } | undefined)?.numeric} />
                    ))}
                  </tr>
                ))}
              </thead>
              <tbody>
                {table.getRowModel().rows.map((row) => (
                  <tr key={row.id} className="border-b border-ink-800 align-top hover:bg-ink-850">
                    {row.getVisibleCells().map((cell) => (
                      <td
                        key={cell.id}
                        className={`py-2 pr-3 text-mist-300 ${(cell.column.columnDef.meta as { numeric?: boolean } | undefined)?.numeric ? 'text-right' : ''}`}
                      >
                        {flexRender(cell.column.columnDef.cell, cell.getContext())}
                      </td>
                    ))}
                  </tr>
                ))}
              </tbody>
            </table>
            {data.views.length === 0 && (
              <p className="py-6 text-center text-sm text-mist-500">
                {q || archived !== 'exclude'
                  ? 'No views match.'
                  : 'No views yet. An engineer saves one from the Bench, with its snapshot and marks.'}
              </p>
            )}
          </div>
        )}
        {data && (
          <div className="flex flex-wrap items-center gap-3 text-sm">
            <span className="text-mist-500">
              {data.total} {data.total === 1 ? 'view' : 'views'}
            </span>
            <span className="ml-auto text-mist-300" data-testid="views-page">
              Page {table.getState().pagination.pageIndex + 1} of {pageCount}
            </span>
            <Button type="button" variant="quiet" className="px-3 py-1" disabled={!table.getCanPreviousPage()} onClick={() => table.previousPage()}>
              Previous
            </Button>
            <Button type="button" variant="quiet" className="px-3 py-1" disabled={!table.getCanNextPage()} onClick={() => table.nextPage()}>
              Next
            </Button>
          </div>
        )}
      </div>
    </Section>
  );
}
