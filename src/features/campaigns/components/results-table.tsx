import { createColumnHelper, flexRender, getCoreRowModel, useReactTable, type SortingState } from '@tanstack/react-table';
import { useEffect, useMemo, useState } from 'react';
import type { CampaignResultSort } from '../../../../server/schemas/campaigns';
import { Notice } from '../../../components/ui/notice';
import { SortHeader } from '../../../components/ui/sort-header';
import { compactSelectClass, tableHeadRowClass } from '../../../components/ui/styles';
import { formatDateTime } from '../../../lib/format';
import { useCampaignResults, type ResultRow } from '../api/campaigns';
import { carrierScheduleText, familyText, formatDb, shiftsText, spreadText } from '../result-format';

const col = createColumnHelper<ResultRow>();
type Meta = { numeric?: boolean };

/** The columns the API sorts by, and the server's sort key for each (`-` descends). */
const SERVER_SORT: Record<string, string> = { file: 'file', strongest: 'peakDb', overall: 'overallDb', status: 'ok', received: 'createdAt' };

const toServerSort = (s: SortingState): CampaignResultSort => {
  const first = s[0];
  if (!first) return 'file';
  return `${first.desc ? '-' : ''}${SERVER_SORT[first.id] ?? 'file'}` as CampaignResultSort;
};

const PAGE_SIZES = [25, 50, 100, 250];
/** The filter waits until one stops typing before it asks the server again. */
const FILTER_DELAY_MS = 300;

const dash = <span className="text-mist-500">—</span>;

/**
 * A campaign's results, one row per file: sorted, filtered and paged by the API (limit/offset/sort/q),
 * so a campaign of thousands of files costs one page. Tag columns come from the campaign's tags and the
 * page's results.
 */
export function ResultsTable({ projectId, campaignId, tagNames }: { projectId: number; campaignId: number; tagNames: string[] }) {
  const [sorting, setSorting] = useState<SortingState>([{ id: 'file', desc: false }]);
  const [typed, setTyped] = useState('');
  const [q, setQ] = useState('');
  const [pageSize, setPageSize] = useState(50);
  const [pageIndex, setPageIndex] = useState(0);
  useEffect(() => {
    const t = setTimeout(() => {
      setQ(typed.trim());
      setPageIndex(0);
    }, FILTER_DELAY_MS);
    return () => clearTimeout(t);
  }, [typed]);

  const { data, error, isPending, isPlaceholderData } = useCampaignResults(projectId, campaignId, { limit: pageSize, offset: pageIndex * pageSize, sort: toServerSort(sorting), q });
  const rows = data?.results;
  const total = data?.total ?? 0;
  const pageTags = useMemo(() => [...new Set([...tagNames, ...(rows ?? []).flatMap((r) => Object.keys(r.tags))])].sort((a, b) => a.localeCompare(b)), [tagNames, rows]);

  const columns = useMemo(
    () => [
      col.accessor('file', { id: 'file', header: 'File', cell: ({ getValue }) => <span className="whitespace-nowrap font-mono text-xs text-mist-100">{getValue()}</span> }),
      ...pageTags.map((tag) =>
        col.display({ id: `tag:${tag}`, header: tag, enableSorting: false, cell: ({ row }) => <span className="text-xs">{row.original.tags[tag] ?? dash}</span> }),
      ),
      col.display({ id: 'carrier', header: 'Carrier schedule', enableSorting: false, cell: ({ row }) => (row.original.summary ? <span className="whitespace-nowrap font-mono text-xs">{carrierScheduleText(row.original.summary)}</span> : dash) }),
      col.display({ id: 'shifts', header: 'Shifts', enableSorting: false, cell: ({ row }) => (row.original.summary ? <span className="whitespace-nowrap font-mono text-xs">{shiftsText(row.original.summary)}</span> : dash) }),
      col.display({ id: 'spread', header: 'Spread', enableSorting: false, cell: ({ row }) => (row.original.summary ? <span className="font-mono text-xs">{spreadText(row.original.summary)}</span> : dash) }),
      col.display({
        id: 'polePairs',
        header: 'Pole pairs',
        enableSorting: false,
        meta: { numeric: true } satisfies Meta,
        cell: ({ row }) => <span className="font-mono text-xs">{row.original.summary?.polePairs ?? '—'}</span>,
      }),
      col.accessor((r) => r.summary?.strongestFamilies[0]?.peakDb ?? null, {
        id: 'strongest',
        header: 'Strongest families',
        sortDescFirst: true,
        cell: ({ row }) =>
          row.original.summary?.strongestFamilies.length ? (
            <ul className="font-mono text-xs">
              {row.original.summary.strongestFamilies.map((f) => (
                <li key={`${f.m}:${f.n}`} className="whitespace-nowrap">
                  {familyText(f)}
                </li>
              ))}
            </ul>
          ) : (
            dash
          ),
      }),
      col.accessor((r) => r.summary?.overallDb ?? null, {
        id: 'overall',
        header: 'Overall',
        sortDescFirst: true,
        meta: { numeric: true } satisfies Meta,
        cell: ({ row }) => (row.original.summary?.overallDb != null ? <span className="font-mono text-xs">{formatDb(row.original.summary.overallDb)}</span> : dash),
      }),
      col.accessor('ok', {
        id: 'status',
        // failed first: those are the rows one looks for
        sortDescFirst: false,
        header: 'Result',
        cell: ({ row }) =>
          row.original.ok ? (
            <span className="text-xs text-ok">ok</span>
          ) : (
            <span className="text-xs text-danger" title={row.original.error ?? undefined}>
              error{row.original.error ? `: ${row.original.error}` : ''}
            </span>
          ),
      }),
      col.accessor('createdAt', {
        id: 'received',
        header: 'Received',
        sortDescFirst: true,
        cell: ({ getValue }) => (
          <time dateTime={getValue()} className="whitespace-nowrap font-mono text-xs text-mist-500">
            {formatDateTime(getValue())}
          </time>
        ),
      }),
    ],
    [pageTags],
  );

  const table = useReactTable({
    data: rows ?? [],
    columns,
    state: { sorting },
    onSortingChange: (s) => {
      setSorting(s);
      setPageIndex(0);
    },
    getCoreRowModel: getCoreRowModel(),
    manualSorting: true,
    manualPagination: true,
    enableSortingRemoval: false,
    enableMultiSort: false,
  });

  const first = total === 0 ? 0 : pageIndex * pageSize + 1;
  const last = Math.min(total, (pageIndex + 1) * pageSize);
  const pages = Math.max(1, Math.ceil(total / pageSize));

  return (
    <div className="flex flex-col gap-3 text-sm">
      <div className="flex flex-wrap items-end gap-3">
        <label className="flex flex-col gap-1 text-xs text-mist-500">
          Filter
          <input
            type="search"
            value={typed}
            onChange={(e) => setTyped(e.target.value)}
            placeholder="Part of a file name, error or tag"
            aria-label="Filter the results by file name, error or tag"
            className="w-72 rounded-md border border-ink-700 bg-ink-900 px-2 py-1 text-sm text-mist-100 placeholder:text-mist-500 focus:border-accent"
          />
        </label>
        <span className="text-xs text-mist-500" data-testid="campaign-results-range" aria-live="polite">
          {isPending ? 'Loading…' : `${first}–${last} of ${total}${q ? ` matching “${q}”` : ''}`}
        </span>
      </div>
      {error && <Notice tone="error">{error.message}</Notice>}
      {rows && rows.length === 0 && <p className="text-mist-500">{q ? 'No result matches the filter.' : 'No results yet.'}</p>}
      {rows && rows.length > 0 && (
        <div className={`overflow-x-auto ${isPlaceholderData ? 'opacity-60' : ''}`}>
          <table className="w-full border-collapse text-sm" data-testid="campaign-results">
            <thead>
              {table.getHeaderGroups().map((hg) => (
                <tr key={hg.id} className={tableHeadRowClass}>
                  {hg.headers.map((h) => (
                    <SortHeader key={h.id} header={h} numeric={(h.column.columnDef.meta as Meta | undefined)?.numeric} />
                  ))}
                </tr>
              ))}
            </thead>
            <tbody>
              {table.getRowModel().rows.map((row) => (
                <tr key={row.original.id} className="border-b border-ink-800 align-top" data-testid="campaign-result">
                  {row.getVisibleCells().map((cell) => (
                    <td key={cell.id} className={`py-1.5 pr-3 ${(cell.column.columnDef.meta as Meta | undefined)?.numeric ? 'text-right' : ''}`}>
                      {flexRender(cell.column.columnDef.cell, cell.getContext())}
                    </td>
                  ))}
                </tr>
              ))}
            </tbody>
          </table>
        </div>
      )}
      {total > 0 && (
        <div className="flex flex-wrap items-center gap-2 text-xs text-mist-500">
          <button type="button" className="rounded px-2 py-1 ring-1 ring-ink-700 hover:text-mist-100 disabled:opacity-40" disabled={pageIndex === 0} onClick={() => setPageIndex(pageIndex - 1)}>
            Previous page
          </button>
          <span className="font-mono">
            page {pageIndex + 1} of {pages}
          </span>
          <button type="button" className="rounded px-2 py-1 ring-1 ring-ink-700 hover:text-mist-100 disabled:opacity-40" disabled={pageIndex + 1 >= pages} onClick={() => setPageIndex(pageIndex + 1)}>
            Next page
          </button>
          <select
            aria-label="Results per page"
            className={compactSelectClass}
            value={pageSize}
            onChange={(e) => {
              setPageSize(Number(e.target.value));
              setPageIndex(0);
            }}
          >
            {PAGE_SIZES.map((n) => (
              <option key={n} value={n}>
                {n} per page
              </option>
            ))}
          </select>
        </div>
      )}
    </div>
  );
}
