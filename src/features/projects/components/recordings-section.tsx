import {
  createColumnHelper,
  flexRender,
  getCoreRowModel,
  getSortedRowModel,
  useReactTable,
  type SortingState,
} from '@tanstack/react-table';
import { useMemo, useState } from 'react';
import { Link } from 'react-router-dom';
import type { RegisteredRecording } from '../../../../server/schemas/recordings';
import { Notice } from '../../../components/ui/notice';
import { Section } from '../../../components/ui/section';
import { SortHeader } from '../../../components/ui/sort-header';
import { linkClass, tableHeadRowClass } from '../../../components/ui/styles';
import { benchFor, paths } from '../../../config/paths';
import { formatDateTime, formatHz, formatSeconds } from '../../../lib/format';
import { useProjectRecordings } from '../api/recordings';

const col = createColumnHelper<RegisteredRecording>();
type Numeric = { numeric?: boolean };

/**
 * The recordings registered with the project, sorted in the browser (the list is short and whole).
 * `viewCounts`: saved views per recording id, archived ones included; the column waits until it is known.
 */
export function RecordingsSection({
  projectId,
  viewCounts,
  demoFiles,
}: {
  projectId: number;
  viewCounts?: Map<number, number>;
  /** The server's demo recordings by file name: those open on the Bench straight from the server. */
  demoFiles?: ReadonlySet<string>;
}) {
  const { data: recordings, isPending, error } = useProjectRecordings(projectId);
  const [sorting, setSorting] = useState<SortingState>([]);

  const columns = useMemo(
    () => [
      col.accessor('name', {
        id: 'name',
        header: 'Name',
        sortDescFirst: false,
        sortingFn: (a, b) => a.original.name.localeCompare(b.original.name, 'en', { sensitivity: 'base', numeric: true }),
        cell: (c) => <span className="break-all text-mist-100">{c.getValue()}</span>,
      }),
      col.accessor('format', {
        header: 'Format',
        enableSorting: false,
        cell: (c) => <span className="font-mono text-mist-300">{c.getValue().toUpperCase()}</span>,
      }),
      col.accessor('sampleRateHz', {
        header: 'Sample rate',
        enableSorting: false,
        meta: { numeric: true } satisfies Numeric,
        cell: (c) => <span className="whitespace-nowrap font-mono">{formatHz(c.getValue())}</span>,
      }),
      col.accessor('durationS', {
        header: 'Duration',
        enableSorting: false,
        meta: { numeric: true } satisfies Numeric,
        cell: (c) => <span className="whitespace-nowrap font-mono">{formatSeconds(c.getValue())}</span>,
      }),
      col.accessor((r) => r.channels.length, {
        id: 'channels',
        header: 'Channels',
        enableSorting: false,
        meta: { numeric: true } satisfies Numeric,
        cell: (c) => <span className="font-mono">{c.getValue()}</span>,
      }),
      col.accessor((r) => viewCounts?.get(r.id) ?? 0, {
        id: 'views',
        header: 'Views',
        enableSorting: false,
        meta: { numeric: true } satisfies Numeric,
        cell: (c) => <span className="font-mono">{viewCounts ? c.getValue() : '…'}</span>,
      }),
      col.display({
        id: 'open',
        header: () => <span className="sr-only">Open</span>,
        cell: ({ row }) => {
          const demoFile = demoFiles?.has(row.original.name) ? row.original.name : null;
          return (
            <Link
              to={benchFor({ fingerprint: row.original.fingerprint, demoFile, projectId })}
              className={`${linkClass} whitespace-nowrap`}
              aria-label={`Open ${row.original.name} on the Bench`}
              title={demoFile ? 'A demo recording: the Bench fetches it from the server' : 'Opens from this browser\'s library; if it is not there, drop the file on the Bench'}
            >
              Open on the Bench
            </Link>
          );
        },
      }),
      col.accessor('registeredAt', {
        id: 'registered',
        header: 'Registered',
        sortDescFirst: true,
        // ISO 8601 in UTC sorts as text
        sortingFn: (a, b) => a.original.registeredAt.localeCompare(b.original.registeredAt),
        cell: ({ row }) => (
          <span className="text-xs text-mist-300">
            {row.original.registeredBy ?? 'Someone'}
            <br />
            <time dateTime={row.original.registeredAt} className="font-mono text-mist-500">
              {formatDateTime(row.original.registeredAt)}
            </time>
          </span>
        ),
      }),
    ],
    [viewCounts, demoFiles, projectId],
  );

  const table = useReactTable({
    data: recordings ?? [],
    columns,
    state: { sorting },
    onSortingChange: setSorting,
    getCoreRowModel: getCoreRowModel(),
    getSortedRowModel: getSortedRowModel(),
    enableSortingRemoval: false,
    enableMultiSort: false,
  });

  return (
    <Section title="Recordings">
      <div className="flex flex-col gap-3">
        {isPending && <p className="text-sm text-mist-500">Loading recordings…</p>}
        {error && <Notice tone="error">{error.message}</Notice>}
        {recordings && recordings.length === 0 && (
          <p className="text-sm text-mist-500">No recordings are registered with this project yet.</p>
        )}
        {recordings && recordings.length > 0 && (
          <div className="overflow-x-auto">
            <table className="w-full border-collapse text-sm" data-testid="project-recordings">
              <thead>
                {table.getHeaderGroups().map((hg) => (
                  <tr key={hg.id} className={tableHeadRowClass}>
                    {hg.headers.map((h) => (
                      <SortHeader key={h.id} header={h} numeric={(h.column.columnDef.meta as Numeric | undefined)?.numeric} />
                    ))}
                  </tr>
                ))}
              </thead>
              <tbody>
                {table.getRowModel().rows.map((row) => (
                  <tr key={row.id} className="border-b border-ink-800 align-top">
                    {row.getVisibleCells().map((cell) => (
                      <td
                        key={cell.id}
                        className={`py-2 pr-3 ${(cell.column.columnDef.meta as Numeric | undefined)?.numeric ? 'text-right' : ''}`}
                      >
                        {flexRender(cell.column.columnDef.cell, cell.getContext())}
                      </td>
                    ))}
                  </tr>
                ))}
              </tbody>
            </table>
          </div>
        )}
        <p className="text-sm">
          <Link to={`${paths.bench}?project=${projectId}`} className={linkClass}>
            Open the Bench
          </Link>
        </p>
      </div>
    </Section>
  );
}
