import { useState } from 'react';
import { Button } from '../../../components/ui/button';
import { Notice } from '../../../components/ui/notice';
import { formatDateTime, formatMegabytes, formatSeconds } from '../../../lib/format';
import { useCopyProgress, useLibrary, useRemoveFromLibrary, useStorageEstimate } from '../../library/api/library';
import type { ChannelSetup } from '../../../../workers/io/channel-setup';
import { demoSetup, fetchDemoRecording, useDemoRecordings } from '../api/demo-recordings';
import { BenchPanel } from './bench-panel';
import { errorMessage } from '../../../lib/error-message';

interface LibraryPanelProps {
  openFingerprint: string | null;
  busy: boolean;
  onOpen: (fingerprint: string) => void;
  /** A file fetched from elsewhere (a demo recording), read like a drop */
  onOpenFile: (file: Blob, name: string, setup?: ChannelSetup[]) => void;
  onRemoved: (fingerprint: string) => void;
  /** With a recording open: put another next to it for comparison (a library entry, or a demo file) */
  onCompare?: (fingerprint: string) => void;
  onCompareDemo?: (file: string, setup: ChannelSetup[] | undefined) => void;
  /** The runs compared with the open one */
  compared?: string[];
  /** Open a demo recording with the one it is compared with (its baseline) next to it */
  onComparePair?: (baselineFile: string, changedFile: string) => void;
}

function DemoRecordings({
  busy,
  onOpenFile,
  onCompareDemo,
  onComparePair,
}: {
  busy: boolean;
  onOpenFile: LibraryPanelProps['onOpenFile'];
  onCompareDemo?: LibraryPanelProps['onCompareDemo'];
  onComparePair?: LibraryPanelProps['onComparePair'];
}) {
  const { data } = useDemoRecordings();
  const [fetching, setFetching] = useState<string | null>(null);
  const [problem, setProblem] = useState<string | null>(null);
  if (!data || data.length === 0) return null;
  const open = async (file: string) => {
    setProblem(null);
    setFetching(file);
    try {
      const recording = data.find((r) => r.file === file);
      onOpenFile(await fetchDemoRecording(file), file, recording ? demoSetup(recording) : undefined);
    } catch (e) {
      setProblem(errorMessage(e));
    } finally {
      setFetching(null);
    }
  };
  return (
    <div className="flex flex-col gap-2 border-t border-ink-800 pt-3" data-testid="demo-recordings">
      <h3 className="text-[11px] font-medium uppercase tracking-wider text-mist-500">Demo recordings</h3>
      {problem && <Notice tone="error">{problem}</Notice>}
      <ul className="flex flex-col divide-y divide-ink-800 text-sm">
        {data.map((d) => (
          <li key={d.file} className="flex items-start gap-2 py-2" data-testid="demo-recording">
            <div className="min-w-0 flex-1">
              <p className="font-medium text-mist-100">{d.title}</p>
              <p className="text-xs text-mist-500">{d.description}</p>
              <p className="font-mono text-[11px] text-mist-500">{formatMegabytes(d.sizeBytes)}</p>
              {d.comparesWith && onComparePair && data.some((b) => b.file === d.comparesWith) && (
                <button
                  type="button"
                  className="mt-1 text-left text-xs text-accent hover:text-accent-strong disabled:opacity-50"
                  disabled={busy || fetching !== null}
                  onClick={() => onComparePair(d.comparesWith!, d.file)}
                >
                  Compare with {data.find((b) => b.file === d.comparesWith)!.title}
                </button>
              )}
            </div>
            <Button
              type="button"
              variant="quiet"
              className="px-2.5 py-1"
              aria-label={`Open the demo recording ${d.title}`}
              disabled={busy || fetching !== null}
              onClick={() => void open(d.file)}
            >
              {fetching === d.file ? 'Fetching…' : 'Open'}
            </Button>
            {onCompareDemo && (
              <Button
                type="button"
                variant="quiet"
                className="px-2.5 py-1"
                aria-label={`Compare the demo recording ${d.title}`}
                title="Put it next to the open recording, on the same guides"
                disabled={busy || fetching !== null}
                onClick={() => onCompareDemo(d.file, demoSetup(d))}
              >
                Compare
              </Button>
            )}
          </li>
        ))}
      </ul>
    </div>
  );
}

/** The copy of a dropped file into the library, while it runs (it goes on in the background). */
function CopyState({ fingerprint }: { fingerprint: string }) {
  const p = useCopyProgress(fingerprint);
  if (!p) return null;
  const percent = p.total > 0 ? Math.floor((100 * p.done) / p.total) : 100;
  return (
    <p className="text-xs text-mist-300" role="status" data-testid="library-copying">
      keeping a copy in this browser… <span className="font-mono">{percent} %</span> ({formatMegabytes(p.done)} of {formatMegabytes(p.total)})
    </p>
  );
}

export function LibraryPanel({ openFingerprint, busy, onOpen, onOpenFile, onRemoved, onCompare, onCompareDemo, onComparePair, compared = [] }: LibraryPanelProps) {
  const { data: entries, isPending, error } = useLibrary();
  const { data: storage } = useStorageEstimate();
  const remove = useRemoveFromLibrary();
  const [problem, setProblem] = useState<string | null>(null);

  const onDelete = (fingerprint: string) => {
    setProblem(null);
    remove.mutate(fingerprint, {
      onSuccess: () => onRemoved(fingerprint),
      onError: (e) => setProblem(e.message),
    });
  };

  return (
    <BenchPanel title="Library">
      <div className="flex flex-col gap-3">
        {isPending && <p className="text-sm text-mist-500">Loading the library…</p>}
        {error && <Notice tone="error">The library in this browser cannot be read: {error.message}</Notice>}
        {problem && <Notice tone="error">{problem}</Notice>}
        {entries && entries.length === 0 && (
          <p className="text-sm text-mist-500">Nothing here yet. The recordings you drop are kept in this browser.</p>
        )}
        {entries && entries.length > 0 && (
          <ul className="flex flex-col divide-y divide-ink-800 text-sm" data-testid="library">
            {entries.map((e) => {
              const isOpen = e.fingerprint === openFingerprint;
              return (
                <li
                  key={e.fingerprint}
                  data-testid="library-entry"
                  data-fingerprint={e.fingerprint}
                  aria-current={isOpen ? 'true' : undefined}
                  className="flex items-start gap-2 py-2"
                >
                  <div className="min-w-0 flex-1">
                    <button
                      type="button"
                      title={`Open ${e.name}`}
                      disabled={busy}
                      onClick={() => onOpen(e.fingerprint)}
                      className={`break-all text-left font-medium hover:text-accent disabled:cursor-wait ${
                        isOpen ? 'text-accent' : 'text-mist-100'
                      }`}
                    >
                      {e.name}
                    </button>
                    <p className="mt-0.5 text-xs text-mist-500">
                      <span className="font-mono">{formatSeconds(e.durationS)}</span> ·{' '}
                      <span className="font-mono">{e.channels.length}</span> {e.channels.length === 1 ? 'channel' : 'channels'} ·{' '}
                      <span className="font-mono">{formatMegabytes(e.sizeBytes)}</span>
                    </p>
                    <p className="text-xs text-mist-500">
                      added <time dateTime={e.addedAt} className="font-mono">{formatDateTime(e.addedAt)}</time>
                    </p>
                    {e.copying && <CopyState fingerprint={e.fingerprint} />}
                  </div>
                  {onCompare && !isOpen && (
                    <Button
                      type="button"
                      variant="quiet"
                      className="px-2.5 py-1"
                      aria-label={`Compare ${e.name} with the open recording`}
                      aria-pressed={compared.includes(e.fingerprint)}
                      disabled={busy || compared.includes(e.fingerprint)}
                      onClick={() => onCompare(e.fingerprint)}
                    >
                      {compared.includes(e.fingerprint) ? 'Compared' : 'Compare'}
                    </Button>
                  )}
                  <Button
                    type="button"
                    variant="danger"
                    className="px-2.5 py-1"
                    aria-label={`Delete ${e.name} from the library`}
                    disabled={remove.isPending && remove.variables === e.fingerprint}
                    onClick={() => onDelete(e.fingerprint)}
                  >
                    Delete
                  </Button>
                </li>
              );
            })}
          </ul>
        )}
        <p className="border-t border-ink-800 pt-3 text-xs text-mist-500" data-testid="storage-used">
          {storage ? (
            <>
              Storage used: <span className="font-mono">{formatMegabytes(storage.usageBytes)}</span> of{' '}
              <span className="font-mono">{formatMegabytes(storage.quotaBytes)}</span>
            </>
          ) : (
            'This browser does not say how much storage it allows.'
          )}
        </p>
        <DemoRecordings busy={busy} onOpenFile={onOpenFile} onCompareDemo={onCompareDemo} onComparePair={onComparePair} />
      </div>
    </BenchPanel>
  );
}
